import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { Subscription, catchError, of, switchMap, timer } from 'rxjs';
import type { SeriesDto } from '../../../shared/series-api';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { apiErrorMessage } from '../core/api-error';
import { AnalysisDialog, type AnalysisDialogData, type AnalysisDialogResult } from './analysis-dialog';
import { ConfirmDialog, type ConfirmData } from '../shell/confirm-dialog';
import { CutDialog } from './cut-dialog';
import { DropZone } from './drop-zone';
import { ProjectRuns } from './project-runs';
import { JobTracker } from './job-tracker';
import { MetadataDialog, type MetadataDialogData, type MetadataDialogResult } from './metadata-dialog';
import { CompareDialog, type CompareDialogData } from '../series/compare-dialog';
import { InteractionModelDialog, type InteractionModelDialogData } from '../interaction-model/interaction-model-dialog';
import { TrajectoriesApi } from './trajectories-api';
import { TrajectoriesTable, type TrajectoryAction } from './trajectories-table';
import { UploadList } from './upload-list';
import { UploadQueue } from './upload-queue';

const SETTLED = new Set(['ready', 'failed']);

/** The project page's trajectories: upload, inspect, describe, analyse. */
@Component({
  selector: 'erg-project-trajectories',
  imports: [DropZone, UploadList, ProjectRuns, TrajectoriesTable, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (canEdit()) {
      <erg-drop-zone (files)="upload($event)" />
      <erg-upload-list [projectId]="projectId()" [trajectories]="trajectories()" />
    }
    <erg-project-runs [projectId]="projectId()" [trajectories]="trajectories()" [canEdit]="canEdit()" />
    @if (loading()) {
      <div class="state"><mat-spinner diameter="28" aria-label="Loading trajectories" /></div>
    } @else if (loadError()) {
      <p class="state error" role="alert"><mat-icon aria-hidden="true">error</mat-icon> {{ loadError() }}</p>
    } @else {
      <erg-trajectories-table [trajectories]="trajectories()" [canEdit]="canEdit()" (action)="act($event.kind, $event.trajectory)" (editSelected)="editSelected($event)" (compareSelected)="compare($event)" />
    }
  `,
  styles: `.state { display: flex; gap: 8px; align-items: center; padding: 24px 0; } .error { color: var(--mat-sys-error); }`,
})
export class ProjectTrajectories {
  readonly projectId = input.required<number>();
  readonly canEdit = input(false);

  private readonly api = inject(TrajectoriesApi);
  private readonly uploads = inject(UploadQueue);
  private readonly jobs = inject(JobTracker);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);
  private readonly router = inject(Router);
  protected readonly trajectories = signal<TrajectoryDto[]>([]);
  protected readonly loading = signal(true);
  protected readonly loadError = signal('');
  private readonly unsettled = computed(() => this.trajectories().some((t) => !SETTLED.has(t.status)));
  private polling: Subscription | null = null;
  /** Trajectories whose analysis dialog is being opened, so a double click opens one. */
  private readonly opening = new Set<number>();

  constructor() {
    effect(() => this.load(this.projectId()));
    // While any upload is still being inspected, refresh the list every couple of seconds.
    effect(() => {
      const waiting = this.unsettled();
      this.polling?.unsubscribe();
      this.polling = waiting
        ? timer(1500, 1500).pipe(switchMap(() => this.api.list(this.projectId())), takeUntilDestroyed(this.destroyRef))
          .subscribe((list) => this.trajectories.set(list))
        : null;
    });
  }

  private load(projectId: number): void {
    this.loading.set(true);
    this.api.list(projectId).pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (list) => {
        this.trajectories.set(list);
        this.loading.set(false);
      },
      error: (err: unknown) => {
        this.loadError.set(apiErrorMessage(err, 'The trajectories could not be loaded.'));
        this.loading.set(false);
      },
    });
  }

  /** Asks what the files do not say (all optional), then uploads them with it. */
  protected upload(files: File[]): void {
    const data: MetadataDialogData = { kind: 'upload', files };
    this.dialog.open<MetadataDialog, MetadataDialogData, MetadataDialogResult>(MetadataDialog, { data, width: '640px' }).afterClosed().subscribe((result) => {
      if (result?.kind !== 'upload') return;
      this.uploads.add(this.projectId(), files, (t) => this.trajectories.update((list) => [t, ...list.filter((x) => x.id !== t.id)]), result.metadata);
    });
  }

  /** One metadata change for the trajectories ticked in the table. */
  protected editSelected(selected: TrajectoryDto[]): void {
    const data: MetadataDialogData = { kind: 'many', trajectories: selected };
    this.dialog.open<MetadataDialog, MetadataDialogData, MetadataDialogResult>(MetadataDialog, { data, width: '640px' }).afterClosed().subscribe((result) => {
      if (result?.kind === 'saved') result.trajectories.forEach((t) => this.replace(t));
    });
  }

  /** Names a series of the ticked trajectories, creates it, and opens it. */
  protected compare(selected: TrajectoryDto[]): void {
    const data: CompareDialogData = { projectId: this.projectId(), trajectories: selected };
    this.dialog.open<CompareDialog, CompareDialogData, SeriesDto>(CompareDialog, { data, width: '600px' }).afterClosed().subscribe((series) => {
      if (series) void this.router.navigate(['/series', series.id]);
    });
  }

  protected act(kind: TrajectoryAction, t: TrajectoryDto): void {
    switch (kind) {
      case 'edit':
        this.dialog.open<MetadataDialog, MetadataDialogData, MetadataDialogResult>(MetadataDialog, { data: { kind: 'one', trajectory: t }, width: '640px' })
          .afterClosed().subscribe((result) => {
            if (result?.kind === 'saved') result.trajectories.forEach((updated) => this.replace(updated));
          });
        break;
      case 'model': {
        const data: InteractionModelDialogData = { target: { kind: 'trajectory', id: t.id }, name: t.name, species: Object.keys(t.speciesCounts ?? {}), canEdit: this.canEdit() };
        this.dialog.open(InteractionModelDialog, { data, width: '880px', maxWidth: '96vw' }).afterClosed().subscribe((saved?: boolean) => {
          if (saved) this.api.get(t.id).subscribe((updated) => this.replace(updated));
        });
        break;
      }
      case 'analyse':
        // The row may be older than the server's copy (a time step saved a moment ago, or by another member):
        // the dialog starts from the server's, and from the row only when the server cannot be reached.
        if (this.opening.has(t.id)) break;
        this.opening.add(t.id);
        this.api.get(t.id).pipe(catchError(() => of(t))).subscribe((fresh) => {
          this.opening.delete(t.id);
          if (fresh !== t) this.replace(fresh);
          this.dialog.open<AnalysisDialog, AnalysisDialogData, AnalysisDialogResult>(AnalysisDialog, { data: fresh, width: '720px' }).afterClosed()
            .subscribe((result) => {
              if (result === 'edit-metadata') this.act('edit', fresh);
              else if (result) this.jobs.track(result, fresh.name);
            });
        });
        break;
      case 'cut':
        this.dialog.open(CutDialog, { data: t, width: '560px' });
        break;
      case 'delete': {
        const data: ConfirmData = {
          title: `Delete ${t.name}?`,
          message: 'The file, its frames and its reports are removed for every member of the project. This cannot be undone.',
          confirm: 'Delete trajectory',
        };
        this.dialog.open(ConfirmDialog, { data }).afterClosed().subscribe((yes?: boolean) => {
          if (!yes) return;
          this.api.delete(t.id).subscribe({
            next: () => this.trajectories.update((list) => list.filter((x) => x.id !== t.id)),
            error: (err: unknown) => this.snack.open(apiErrorMessage(err, 'The trajectory could not be deleted.'), 'Close'),
          });
        });
        break;
      }
    }
  }

  private replace(updated: TrajectoryDto): void {
    this.trajectories.update((list) => list.map((x) => (x.id === updated.id ? updated : x)));
  }
}
