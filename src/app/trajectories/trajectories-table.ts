import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, effect, input, output, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { StatusChip } from './status-chip';
import { filterText, formatText, speciesText } from './trajectory-format';

export type TrajectoryAction = 'analyse' | 'edit' | 'model' | 'cut' | 'delete';

/** The project's trajectories: sortable, filterable, paged, with per-row actions. */
@Component({
  selector: 'erg-trajectories-table',
  imports: [
    DatePipe, DecimalPipe, RouterLink, MatTableModule, MatSortModule, MatPaginatorModule, MatFormFieldModule, MatInputModule,
    MatButtonModule, MatIconModule, MatMenuModule, MatTooltipModule, StatusChip,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-form-field appearance="outline" class="filter" subscriptSizing="dynamic">
      <mat-label>Filter trajectories</mat-label>
      <mat-icon matPrefix aria-hidden="true">search</mat-icon>
      <input matInput (input)="applyFilter($any($event.target).value)" placeholder="name, species, ensemble, status…">
    </mat-form-field>
    <div class="table-wrap">
      <table mat-table [dataSource]="dataSource" matSort aria-label="Trajectories">
        <ng-container matColumnDef="name">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Name</th>
          <td mat-cell *matCellDef="let t"><span class="name">{{ t.name }}</span></td>
        </ng-container>
        <ng-container matColumnDef="format">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Format</th>
          <td mat-cell *matCellDef="let t">{{ formatOf(t) }}</td>
        </ng-container>
        <ng-container matColumnDef="atoms">
          <th mat-header-cell *matHeaderCellDef mat-sort-header class="num">Atoms</th>
          <td mat-cell *matCellDef="let t" class="num">{{ t.atoms | number }}</td>
        </ng-container>
        <ng-container matColumnDef="frames">
          <th mat-header-cell *matHeaderCellDef mat-sort-header class="num">Frames</th>
          <td mat-cell *matCellDef="let t" class="num">{{ t.frames | number }}</td>
        </ng-container>
        <ng-container matColumnDef="species">
          <th mat-header-cell *matHeaderCellDef>Species</th>
          <td mat-cell *matCellDef="let t">{{ speciesOf(t) }}</td>
        </ng-container>
        <ng-container matColumnDef="temperatureK">
          <th mat-header-cell *matHeaderCellDef mat-sort-header class="num">T (K)</th>
          <td mat-cell *matCellDef="let t" class="num">{{ t.temperatureK ?? '–' }}</td>
        </ng-container>
        <ng-container matColumnDef="ensemble">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Ensemble</th>
          <td mat-cell *matCellDef="let t">{{ t.ensemble ?? '–' }}</td>
        </ng-container>
        <ng-container matColumnDef="status">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Status</th>
          <td mat-cell *matCellDef="let t">
            <erg-status-chip [status]="t.status" [detail]="t.error" />
            @if (t.status === 'failed') { <div class="error" role="alert">{{ t.error }}</div> }
          </td>
        </ng-container>
        <ng-container matColumnDef="uploaded">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Uploaded</th>
          <td mat-cell *matCellDef="let t">{{ t.uploadedBy.displayName }}<br><span class="muted">{{ t.createdAt | date: 'medium' }}</span></td>
        </ng-container>
        <ng-container matColumnDef="actions">
          <th mat-header-cell *matHeaderCellDef><span class="visually-hidden">Actions</span></th>
          <td mat-cell *matCellDef="let t" class="actions">
            <a mat-icon-button [routerLink]="['/trajectories', t.id, 'view']" [disabled]="t.status !== 'ready'"
               matTooltip="Open in the frame viewer" [attr.aria-label]="'Open ' + t.name + ' in the frame viewer'"><mat-icon>view_in_ar</mat-icon></a>
            @if (canEdit()) {
              <button mat-icon-button type="button" (click)="action.emit({ kind: 'analyse', trajectory: t })" [disabled]="t.status !== 'ready'"
                      matTooltip="Analyse" [attr.aria-label]="'Analyse ' + t.name"><mat-icon>query_stats</mat-icon></button>
            }
            <button mat-icon-button type="button" [matMenuTriggerFor]="more" [attr.aria-label]="'More actions for ' + t.name"><mat-icon>more_vert</mat-icon></button>
            <mat-menu #more="matMenu">
              @if (canEdit()) {
                <button mat-menu-item type="button" (click)="action.emit({ kind: 'edit', trajectory: t })"><mat-icon>edit_note</mat-icon>Edit metadata</button>
              }
              <button mat-menu-item type="button" (click)="action.emit({ kind: 'model', trajectory: t })"><mat-icon>function</mat-icon>Interaction model</button>
              <button mat-menu-item type="button" [disabled]="t.status !== 'ready'" (click)="action.emit({ kind: 'cut', trajectory: t })"><mat-icon>content_cut</mat-icon>Download a cut</button>
              @if (canEdit()) {
                <button mat-menu-item type="button" (click)="action.emit({ kind: 'delete', trajectory: t })"><mat-icon>delete</mat-icon>Delete</button>
              }
            </mat-menu>
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
        <tr class="mat-row" *matNoDataRow>
          <td class="mat-cell empty" [attr.colspan]="columns.length">
            {{ trajectories().length ? 'No trajectory matches the filter.' : 'No trajectories yet. Drop files above to upload the first.' }}
          </td>
        </tr>
      </table>
    </div>
    <mat-paginator [pageSizeOptions]="[10, 25, 100]" [pageSize]="10" aria-label="Trajectory pages" />
  `,
  styles: `
    .filter { width: min(420px, 100%); margin: 8px 0; }
    .table-wrap { overflow-x: auto; }
    .num { text-align: right; }
    .name { font-weight: 500; word-break: break-all; }
    .muted { color: var(--mat-sys-on-surface-variant); font-size: 12px; }
    .error { color: var(--mat-sys-error); font-size: 12px; max-width: 36ch; margin-top: 4px; }
    .actions { white-space: nowrap; }
    .empty { padding: 24px; color: var(--mat-sys-on-surface-variant); }
  `,
})
export class TrajectoriesTable {
  readonly trajectories = input.required<TrajectoryDto[]>();
  readonly canEdit = input(false);
  readonly action = output<{ kind: TrajectoryAction; trajectory: TrajectoryDto }>();

  protected readonly columns = ['name', 'format', 'atoms', 'frames', 'species', 'temperatureK', 'ensemble', 'status', 'uploaded', 'actions'];
  protected readonly dataSource = new MatTableDataSource<TrajectoryDto>([]);
  protected readonly formatOf = formatText;
  protected readonly speciesOf = speciesText;
  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.dataSource.filterPredicate = (t, f) => filterText(t).includes(f);
    this.dataSource.sortingDataAccessor = (t, column) =>
      column === 'uploaded' ? t.createdAt : ((t as unknown as Record<string, string | number | null>)[column] ?? '');
    effect(() => {
      this.dataSource.data = this.trajectories();
    });
    effect(() => {
      const sort = this.sort();
      const paginator = this.paginator();
      if (sort) this.dataSource.sort = sort;
      if (paginator) this.dataSource.paginator = paginator;
    });
  }

  protected applyFilter(value: string): void {
    this.dataSource.filter = value.trim().toLowerCase();
  }
}
