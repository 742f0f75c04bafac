import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { catchError, firstValueFrom, of } from 'rxjs';
import type { SeriesDto } from '../../../shared/series-api';
import { apiErrorMessage } from '../core/api-error';
import { TrajectoriesApi } from '../trajectories/trajectories-api';
import { SeriesApi } from './series-api';
import { temperatureOrder } from './series-naming';

export interface AddMembersDialogData {
  series: SeriesDto;
}

/** The project's other trajectories, to add to the series; closes with the series as it now is. */
@Component({
  selector: 'erg-add-members-dialog',
  imports: [MatButtonModule, MatCheckboxModule, MatDialogModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Add members to “{{ data.series.name }}”</h2>
    <mat-dialog-content>
      @if (candidates() === null) {
        <mat-spinner diameter="24" aria-label="Loading trajectories" />
      } @else if (loadError()) {
        <p class="form-error" role="alert">{{ loadError() }}</p>
      } @else if (candidates()!.length === 0) {
        <p role="status">Every trajectory of the project is already in this series.</p>
      } @else {
        <p class="muted">Added runs go to the end of the series; their missing analyses start at once and the results are computed again.</p>
        <ul class="choices" aria-label="Trajectories not in the series">
          @for (t of candidates(); track t.id) {
            <li>
              <mat-checkbox [checked]="chosen().has(t.id)" (change)="toggle(t.id, $event.checked)">
                {{ t.name }} <span class="muted">{{ t.temperatureK !== null ? t.temperatureK + ' K stated' : 'no stated temperature' }}{{ t.status !== 'ready' ? ' · ' + t.status : '' }}</span>
              </mat-checkbox>
            </li>
          }
        </ul>
      }
      @if (error()) { <p class="form-error" role="alert">{{ error() }}</p> }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" mat-dialog-close>Cancel</button>
      <button mat-flat-button type="button" [disabled]="busy() || chosen().size === 0" (click)="add()">Add {{ chosen().size || '' }}</button>
    </mat-dialog-actions>
  `,
  styles: `
    .choices { list-style: none; margin: 0; padding: 0; max-height: 50vh; overflow: auto; }
    .muted { color: var(--mat-sys-on-surface-variant); font: var(--mat-sys-body-small); }
    p.muted { margin: 0 0 8px; font: var(--mat-sys-body-medium); }
  `,
})
export class AddMembersDialog {
  protected readonly data = inject<AddMembersDialogData>(MAT_DIALOG_DATA);
  private readonly api = inject(SeriesApi);
  private readonly dialogRef = inject<MatDialogRef<AddMembersDialog, SeriesDto>>(MatDialogRef);

  protected readonly loadError = signal('');
  private readonly all = toSignal(inject(TrajectoriesApi).list(this.data.series.projectId).pipe(
    catchError((err: unknown) => {
      this.loadError.set(apiErrorMessage(err, 'The trajectories could not be loaded.'));
      return of([]);
    }),
  ), { initialValue: null });
  protected readonly candidates = computed(() => {
    const all = this.all();
    if (!all) return null;
    const inSeries = new Set(this.data.series.members.map((m) => m.trajectoryId));
    return temperatureOrder(all.filter((t) => !inSeries.has(t.id) && t.status !== 'failed'));
  });
  protected readonly chosen = signal<ReadonlySet<number>>(new Set());
  protected readonly busy = signal(false);
  protected readonly error = signal('');

  protected toggle(id: number, on: boolean): void {
    this.chosen.update((s) => {
      const next = new Set(s);
      if (on) next.add(id);
      else next.delete(id);
      return next;
    });
  }

  protected async add(): Promise<void> {
    const ids = (this.candidates() ?? []).map((t) => t.id).filter((id) => this.chosen().has(id));
    if (!ids.length) return;
    this.busy.set(true);
    this.error.set('');
    try {
      this.dialogRef.close(await firstValueFrom(this.api.update(this.data.series.id, { addTrajectoryIds: ids })));
    } catch (err) {
      this.error.set(apiErrorMessage(err, 'The members could not be added.'));
    } finally {
      this.busy.set(false);
    }
  }
}
