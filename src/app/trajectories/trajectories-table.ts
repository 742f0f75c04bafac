import { BreakpointObserver } from '@angular/cdk/layout';
import { DatePipe, DecimalPipe, NgTemplateOutlet } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, output, signal, viewChild } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { map } from 'rxjs';
import { formatBytes } from '../../../shared/byte-size';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { StatusChip } from './status-chip';
import { assumedElementsText, filterText, formatText, nameParts, speciesText } from './trajectory-format';

export type TrajectoryAction = 'analyse' | 'edit' | 'model' | 'cut' | 'delete';

/** Below this width the table becomes a list of cards, one per trajectory. */
const NARROW = '(max-width: 719.98px)';

/**
 * The project's trajectories: sortable, filterable, paged, with per-row
 * actions; editors can tick several to change their metadata at once or to
 * compare them as a series.
 */
@Component({
  selector: 'erg-trajectories-table',
  imports: [
    DatePipe, DecimalPipe, NgTemplateOutlet, RouterLink, MatTableModule, MatSortModule, MatPaginatorModule, MatFormFieldModule, MatInputModule,
    MatButtonModule, MatCheckboxModule, MatIconModule, MatMenuModule, MatTooltipModule, StatusChip,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './trajectories-table.html',
  styleUrl: './trajectories-table.scss',
})
export class TrajectoriesTable {
  readonly trajectories = input.required<TrajectoryDto[]>();
  readonly canEdit = input(false);
  readonly action = output<{ kind: TrajectoryAction; trajectory: TrajectoryDto }>();
  readonly editSelected = output<TrajectoryDto[]>();
  /** The ticked trajectories, to be compared across their state points. */
  readonly compareSelected = output<TrajectoryDto[]>();

  protected readonly narrow = toSignal(inject(BreakpointObserver).observe(NARROW).pipe(map((s) => s.matches)), { initialValue: false });
  protected readonly columns = computed(() => [
    ...(this.canEdit() ? ['select'] : []), 'name', 'atoms', 'frames', 'species', 'temperatureK', 'ensemble', 'status', 'uploaded', 'actions',
  ]);
  protected readonly dataSource = new MatTableDataSource<TrajectoryDto>([]);
  /** The rows of the current page after filter and sort, for the card list on narrow screens. */
  protected readonly pageRows = toSignal(this.dataSource.connect(), { initialValue: [] });
  protected readonly formatOf = formatText;
  protected readonly speciesOf = speciesText;
  protected readonly assumedOf = assumedElementsText;
  protected readonly partsOf = nameParts;
  protected readonly size = formatBytes;
  protected readonly selectedIds = signal<ReadonlySet<number>>(new Set());
  protected readonly selected = computed(() => this.trajectories().filter((t) => this.selectedIds().has(t.id)));
  protected readonly allOnPageSelected = computed(() => this.pageRows().length > 0 && this.pageRows().every((t) => this.selectedIds().has(t.id)));
  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.dataSource.filterPredicate = (t, f) => filterText(t).includes(f);
    this.dataSource.sortingDataAccessor = (t, column) =>
      column === 'uploaded' ? t.createdAt : ((t as unknown as Record<string, string | number | null>)[column] ?? '');
    effect(() => {
      const list = this.trajectories();
      this.dataSource.data = list;
      // A trajectory that is gone cannot stay selected.
      const ids = new Set(list.map((t) => t.id));
      if ([...this.selectedIds()].some((id) => !ids.has(id))) this.selectedIds.update((s) => new Set([...s].filter((id) => ids.has(id))));
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

  protected toggle(t: TrajectoryDto, on: boolean): void {
    this.selectedIds.update((s) => {
      const next = new Set(s);
      if (on) next.add(t.id);
      else next.delete(t.id);
      return next;
    });
  }

  protected toggleAllOnPage(on: boolean): void {
    const page = this.pageRows().map((t) => t.id);
    this.selectedIds.update((s) => new Set(on ? [...s, ...page] : [...s].filter((id) => !page.includes(id))));
  }

  protected isSelected(t: TrajectoryDto): boolean {
    return this.selectedIds().has(t.id);
  }

  protected editTheSelected(): void {
    this.editSelected.emit(this.selected());
  }

  protected compareTheSelected(): void {
    this.compareSelected.emit(this.selected());
  }

  protected clearSelection(): void {
    this.selectedIds.set(new Set());
  }
}
