import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { Observable } from 'rxjs';
import { projectSchema } from '../../../shared/projects';
import { seriesSchema, type SeriesDto, type SeriesMemberDto } from '../../../shared/series-api';
import { unwrap } from '../core/api-envelope';
import { apiErrorMessage } from '../core/api-error';
import { CommentsPanel } from '../reports/comments-panel';
import { ShareDialog, type ShareDialogData } from '../reports/share-dialog';
import type { ShareTarget } from '../reports/share-target';
import { ConfirmDialog, type ConfirmData } from '../shell/confirm-dialog';
import { AddMembersDialog, type AddMembersDialogData } from './add-members-dialog';
import type { MemberChange } from './members-table';
import { SeriesApi } from './series-api';
import type { SeriesSource } from './series-source';
import { SeriesView } from './series-view';

/** While members are analysed the series is read again this often, so progress and results appear by themselves. */
const REFRESH_MS = 2000;

/** A series as a project member reads it: editors change members, share and delete; everyone comments. */
@Component({
  selector: 'erg-series-page',
  imports: [RouterLink, CommentsPanel, SeriesView, MatButtonModule, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="page">
      @if (series.isLoading() && !series.hasValue()) {
        <div class="state"><mat-spinner diameter="32" aria-label="Loading the series" /></div>
      } @else if (series.error()) {
        <div class="state" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon>
          <span>{{ loadError() }}</span>
          <button mat-button type="button" (click)="series.reload()">Try again</button>
        </div>
      } @else if (series.value(); as s) {
        <nav class="crumbs" aria-label="Breadcrumb"><a [routerLink]="['/projects', s.projectId]">← Back to the project</a></nav>
        <erg-series-view [series]="s" [source]="source()" [canEdit]="canEdit()" [busyMemberId]="busyMemberId()"
                         (memberChange)="changeMember(s, $event)" (removeMember)="removeMember(s, $event)" (addMembers)="addMembers(s)" (retryFailed)="retryFailed(s)">
          @if (canEdit()) {
            <span seriesActions class="edit-actions">
              <button mat-flat-button type="button" (click)="share(s)"><mat-icon aria-hidden="true">share</mat-icon> Share</button>
              <button mat-stroked-button type="button" (click)="remove(s)"><mat-icon aria-hidden="true">delete</mat-icon> Delete series</button>
            </span>
          }
          <erg-comments-panel [target]="target()" />
        </erg-series-view>
      }
    </div>
  `,
  styles: `
    .crumbs { margin-bottom: 12px; }
    .crumbs a { color: var(--mat-sys-primary); }
    .edit-actions { display: contents; }
  `,
})
export default class SeriesPage {
  private readonly api = inject(SeriesApi);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  /** From the route, `series/:id`. */
  readonly id = input.required<string>();

  private readonly seriesId = computed(() => Number(this.id()));
  protected readonly source = computed((): SeriesSource => ({ kind: 'member', seriesId: this.seriesId() }));
  protected readonly target = computed((): ShareTarget => ({ kind: 'series', id: this.seriesId() }));
  protected readonly series = httpResource(() => (Number.isInteger(this.seriesId()) ? `/api/series/${this.seriesId()}` : undefined), { parse: unwrap('series', seriesSchema) });
  private readonly project = httpResource(() => {
    const s = this.series.value();
    return s ? `/api/projects/${s.projectId}` : undefined;
  }, { parse: unwrap('project', projectSchema) });
  /** The server refuses viewers anyway; the controls are hidden so they are not offered what they cannot do. */
  protected readonly canEdit = computed(() => ['owner', 'editor'].includes(this.project.value()?.role ?? 'viewer'));
  protected readonly busyMemberId = signal<number | null>(null);

  constructor() {
    effect((onCleanup) => {
      if (this.series.value()?.status !== 'running' || this.series.isLoading()) return;
      const timer = setTimeout(() => this.series.reload(), REFRESH_MS);
      onCleanup(() => clearTimeout(timer));
    });
  }

  protected loadError(): string {
    return apiErrorMessage(this.series.error(), 'The series could not be loaded.');
  }

  protected changeMember(s: SeriesDto, change: MemberChange): void {
    this.busyMemberId.set(change.trajectoryId);
    this.save(this.api.update(s.id, { members: [change] }), 'The member could not be changed.');
  }

  protected removeMember(s: SeriesDto, member: SeriesMemberDto): void {
    this.busyMemberId.set(member.trajectoryId);
    this.save(this.api.update(s.id, { removeTrajectoryIds: [member.trajectoryId] }), 'The member could not be removed.');
  }

  protected retryFailed(s: SeriesDto): void {
    this.save(this.api.update(s.id, { retryFailed: true }), 'The analyses could not be started again.');
  }

  protected addMembers(s: SeriesDto): void {
    this.dialog.open<AddMembersDialog, AddMembersDialogData, SeriesDto>(AddMembersDialog, { data: { series: s }, width: '600px' }).afterClosed().subscribe((updated) => {
      if (updated) this.series.set(updated);
    });
  }

  protected share(s: SeriesDto): void {
    this.dialog.open<ShareDialog, ShareDialogData>(ShareDialog, { data: { target: { kind: 'series', id: s.id }, projectId: s.projectId, title: s.name }, width: '640px', autoFocus: 'first-tabbable' });
  }

  protected remove(s: SeriesDto): void {
    const data: ConfirmData = {
      title: `Delete the series “${s.name}”?`,
      message: 'The series, its comments and its access links go for every member of the project. The trajectories and their reports stay.',
      confirm: 'Delete series',
    };
    this.dialog.open(ConfirmDialog, { data }).afterClosed().subscribe((yes?: boolean) => {
      if (!yes) return;
      this.api.delete(s.id).subscribe({
        next: () => void this.router.navigate(['/projects', s.projectId]),
        error: (err: unknown) => this.snack.open(apiErrorMessage(err, 'The series could not be deleted.'), 'Close'),
      });
    });
  }

  /** One change at a time; the answer is the series as it now is, results recomputed. */
  private save(request: Observable<SeriesDto>, fallback: string): void {
    request.subscribe({
      next: (updated) => {
        this.busyMemberId.set(null);
        this.series.set(updated);
      },
      error: (err: unknown) => {
        this.busyMemberId.set(null);
        this.snack.open(apiErrorMessage(err, fallback), 'Close');
        this.series.reload();
      },
    });
  }
}
