import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { formatBytes } from '../../../shared/byte-size';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { UploadQueue, type UploadItem } from './upload-queue';

/** What one upload has come to: sending, then the stored trajectory's own status. */
type UploadStage = 'sending' | 'inspecting' | 'ready' | 'failed' | 'cancelled' | 'refused';

/** Per-file upload progress, with cancel for each, then how the server's inspection of it went. */
@Component({
  selector: 'erg-upload-list',
  imports: [MatButtonModule, MatIconModule, MatProgressBarModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (rows().length) {
      <ul class="uploads" aria-label="Uploads">
        @for (row of rows(); track row.item.key) {
          <li [attr.aria-label]="row.item.name + ': ' + stageWords[row.stage]">
            <span class="name" [attr.title]="row.item.name">{{ row.item.name }}</span>
            <span class="size">{{ size(row.item.size) }}</span>
            <span class="state">
              @switch (row.stage) {
                @case ('sending') {
                  <mat-progress-bar mode="determinate" [value]="row.item.percent" [attr.aria-label]="'Uploading ' + row.item.name" />
                  <span class="muted">{{ row.item.percent }} %</span>
                }
                @case ('inspecting') { <mat-spinner diameter="14" strokeWidth="2" aria-hidden="true" /> <span>Uploaded — inspecting</span> }
                @case ('ready') { <mat-icon class="ok" aria-hidden="true">check_circle</mat-icon> <span class="ok">Ready</span> }
                @case ('failed') { <mat-icon class="bad" aria-hidden="true">error</mat-icon> <span class="bad" role="alert">Inspection failed: {{ row.error }}</span> }
                @case ('refused') { <mat-icon class="bad" aria-hidden="true">error</mat-icon> <span class="bad" role="alert">{{ row.error }}</span> }
                @case ('cancelled') { <span class="muted">Cancelled</span> }
              }
            </span>
            @if (row.stage === 'sending') {
              <button mat-icon-button type="button" (click)="queue.cancel(row.item.key)" [attr.aria-label]="'Cancel upload of ' + row.item.name"><mat-icon>close</mat-icon></button>
            } @else {
              <button mat-icon-button type="button" (click)="queue.dismiss(row.item.key)" [attr.aria-label]="'Dismiss ' + row.item.name"><mat-icon>close</mat-icon></button>
            }
          </li>
        }
      </ul>
    }
  `,
  styles: `
    .uploads { list-style: none; padding: 0; margin: 12px 0 0; display: grid; gap: 6px; }
    li { display: grid; grid-template-columns: minmax(0, 1fr) 80px minmax(0, 2fr) auto; align-items: center; gap: 12px; }
    .name { overflow: hidden; text-overflow: ellipsis; white-space: nowrap; font-weight: 500; }
    .size, .muted { color: var(--mat-sys-on-surface-variant); }
    .state { display: flex; align-items: center; gap: 8px; min-width: 0; }
    .state mat-progress-bar { flex: 1; }
    .ok { color: var(--mat-sys-primary); }
    .bad { color: var(--mat-sys-error); overflow-wrap: anywhere; }
    mat-icon { flex: none; }
    @media (max-width: 600px) {
      li { grid-template-columns: minmax(0, 1fr) auto auto; }
      .state { grid-column: 1 / -1; grid-row: 2; }
    }
  `,
})
export class UploadList {
  readonly projectId = input.required<number>();
  /** The project's trajectories as last read, so a stored upload shows how its inspection went. */
  readonly trajectories = input<TrajectoryDto[]>([]);
  protected readonly queue = inject(UploadQueue);
  protected readonly size = formatBytes;
  protected readonly stageWords: Record<UploadStage, string> = {
    sending: 'uploading', inspecting: 'uploaded, inspecting', ready: 'ready', failed: 'inspection failed', cancelled: 'cancelled', refused: 'upload refused',
  };
  protected readonly rows = computed(() => {
    const byId = new Map(this.trajectories().map((t) => [t.id, t]));
    return this.queue.items().filter((i) => i.projectId === this.projectId()).map((item) => this.rowOf(item, byId.get(item.trajectoryId ?? -1)));
  });

  private rowOf(item: UploadItem, trajectory: TrajectoryDto | undefined): { item: UploadItem; stage: UploadStage; error: string } {
    switch (item.state) {
      case 'sending': return { item, stage: 'sending', error: '' };
      case 'cancelled': return { item, stage: 'cancelled', error: '' };
      case 'failed': return { item, stage: 'refused', error: item.error ?? 'The upload failed.' };
      case 'stored':
        if (trajectory?.status === 'ready') return { item, stage: 'ready', error: '' };
        if (trajectory?.status === 'failed') return { item, stage: 'failed', error: trajectory.error ?? 'the file could not be read' };
        return { item, stage: 'inspecting', error: '' };
    }
  }
}
