import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { UploadQueue } from './upload-queue';

/** Per-file upload progress, with cancel for each. */
@Component({
  selector: 'erg-upload-list',
  imports: [DecimalPipe, MatButtonModule, MatIconModule, MatProgressBarModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (items().length) {
      <ul class="uploads" aria-label="Uploads">
        @for (item of items(); track item.key) {
          <li>
            <span class="name">{{ item.name }}</span>
            <span class="size">{{ item.size / 1048576 | number: '1.0-1' }} MiB</span>
            @switch (item.state) {
              @case ('sending') {
                <mat-progress-bar mode="determinate" [value]="item.percent" [attr.aria-label]="'Uploading ' + item.name" />
                <span class="pct">{{ item.percent }} %</span>
                <button mat-icon-button type="button" (click)="queue.cancel(item.key)" [attr.aria-label]="'Cancel upload of ' + item.name"><mat-icon>close</mat-icon></button>
              }
              @case ('stored') { <span class="ok">Uploaded — inspecting</span> }
              @case ('cancelled') { <span class="muted">Cancelled</span> }
              @case ('failed') { <span class="bad" role="alert">{{ item.error }}</span> }
            }
            @if (item.state !== 'sending') {
              <button mat-icon-button type="button" (click)="queue.dismiss(item.key)" [attr.aria-label]="'Dismiss ' + item.name"><mat-icon>done</mat-icon></button>
            }
          </li>
        }
      </ul>
    }
  `,
  styles: `
    .uploads { list-style: none; padding: 0; margin: 12px 0 0; display: grid; gap: 6px; }
    li { display: grid; grid-template-columns: minmax(120px, 1fr) 80px minmax(120px, 2fr) auto auto; align-items: center; gap: 12px; }
    .name { overflow: hidden; text-overflow: ellipsis; white-space: nowrap; font-weight: 500; }
    .size, .pct, .muted { color: var(--mat-sys-on-surface-variant); }
    .ok { color: var(--mat-sys-primary); }
    .bad { color: var(--mat-sys-error); grid-column: span 2; }
  `,
})
export class UploadList {
  readonly projectId = input.required<number>();
  protected readonly queue = inject(UploadQueue);
  protected readonly items = computed(() => this.queue.items().filter((i) => i.projectId === this.projectId()));
}
