import { ChangeDetectionStrategy, Component, computed, DestroyRef, effect, ElementRef, inject, input, signal, untracked, viewChild } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RouterLink } from '@angular/router';
import { catchError, EMPTY, switchMap, tap } from 'rxjs';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { atomPath } from './atom-path';
import { cellLengths } from './cell-geometry';
import { DisplayPanel, type SpeciesEntry } from './display-panel';
import { FrameInfoPanel } from './frame-info-panel';
import { FramePlayer } from './frame-player';
import { frameTimePs } from './frame-time';
import { PlaybackBar } from './playback-bar';
import { requestErrorMessage } from './request-error-message';
import { FrameScene, type SystemSpecies } from './scene/frame-scene';
import { SelectedAtomPanel, type SelectedAtom } from './selected-atom-panel';
import { speciesEntries } from './species-entries';
import { watchTrajectory } from './trajectory-watch';
import { ViewerApi } from './viewer-api';
import { viewerCommand } from './viewer-keys';

type PageState = 'loading' | 'error' | 'pending' | 'failed' | 'empty' | 'ready';

/** Marked once per page, when the first frame is on screen; `npm run bench` reads it. */
export const FIRST_FRAME_MARK = 'ergodic:viewer-first-frame';

/** The frame viewer: one trajectory in 3D with playback, species display and atom picking. */
@Component({
  selector: 'erg-viewer-page',
  imports: [
    RouterLink, MatButtonModule, MatIconModule, MatProgressBarModule, MatProgressSpinnerModule,
    PlaybackBar, DisplayPanel, FrameInfoPanel, SelectedAtomPanel,
  ],
  providers: [FramePlayer],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './viewer-page.html',
  styleUrl: './viewer-page.scss',
  host: { '(document:keydown)': 'runShortcut($event)' },
})
export default class ViewerPage {
  /** The :id route parameter. */
  readonly id = input.required<string>();

  private readonly api = inject(ViewerApi);
  protected readonly player = inject(FramePlayer);
  private readonly canvas = viewChild<ElementRef<HTMLCanvasElement>>('canvas');
  private readonly scene = signal<FrameScene | null>(null);

  protected readonly trajectory = signal<TrajectoryDto | null>(null);
  protected readonly loadError = signal<string | null>(null);
  protected readonly selectedIndex = signal<number | null>(null);
  protected readonly hiddenSpecies = signal<ReadonlySet<number>>(new Set());
  protected readonly showCell = signal(true);
  protected readonly showPath = signal(false);
  protected readonly pathLength = signal(25);

  protected readonly state = computed<PageState>(() => {
    const t = this.trajectory();
    if (this.loadError()) return 'error';
    if (!t) return 'loading';
    if (t.status === 'failed') return 'failed';
    if (t.status !== 'ready') return 'pending';
    return t.frames ? 'ready' : 'empty';
  });
  protected readonly shownIndex = computed(() => this.player.current()?.index ?? this.player.playhead());
  protected readonly timePs = computed(() => {
    const frame = this.player.current();
    const t = this.trajectory();
    return frame && t ? frameTimePs(frame, t.timeStep, t.timeUnit) : null;
  });
  protected readonly cellLengths = computed(() => {
    const cell = this.player.current()?.cell;
    return cell ? cellLengths(cell) : null;
  });
  protected readonly species = computed<SpeciesEntry[]>(() => speciesEntries(this.player.system(), this.hiddenSpecies()));
  protected readonly selectedAtom = computed<SelectedAtom | null>(() => {
    const atom = this.selectedIndex();
    const frame = this.player.current();
    const system = this.player.system();
    if (atom === null || !frame || !system) return null;
    const p = frame.positions;
    return { index: atom, species: system.speciesNames[system.speciesIndex[atom]!] ?? '?', position: [p[atom * 3]!, p[atom * 3 + 1]!, p[atom * 3 + 2]!], frame: frame.index };
  });
  protected readonly canvasLabel = computed(() => {
    const t = this.trajectory();
    return `3D view of frame ${this.shownIndex() + 1} of ${this.player.total()}, ${t?.atoms ?? 0} atoms. `
      + 'Drag to turn, scroll to zoom, right-drag to pan, click an atom to select it.';
  });

  constructor() {
    toObservable(this.id).pipe(
      // The router reuses this page when only the id changes, so the previous trajectory is cleared first.
      tap(() => this.clear()),
      switchMap((id) => watchTrajectory(() => this.api.trajectory(id)).pipe(catchError((err: unknown) => {
        this.loadError.set(requestErrorMessage(err, 'This trajectory could not be loaded'));
        return EMPTY;
      }))),
      takeUntilDestroyed(),
    ).subscribe((t) => this.receive(t));
    inject(DestroyRef).onDestroy(() => this.scene()?.dispose());
    effect(() => {
      const canvas = this.canvas()?.nativeElement;
      const system = this.player.system();
      if (canvas && system && !untracked(this.scene)) untracked(() => this.createScene(canvas, system));
    });
    effect(() => {
      const frame = this.player.current();
      const scene = this.scene();
      if (frame && scene) scene.show(frame);
    });
    effect(() => this.scene()?.setCellVisible(this.showCell()));
    effect(() => this.scene()?.select(this.selectedIndex()));
    effect(() => {
      const scene = this.scene();
      const hidden = this.hiddenSpecies();
      this.player.system()?.speciesNames.forEach((_, s) => scene?.setSpeciesVisible(s, !hidden.has(s)));
    });
    effect(() => this.player.keepBehind(this.showPath() && this.selectedIndex() !== null ? this.pathLength() - 1 : 0));
    effect(() => this.drawPath());
  }

  protected runShortcut(event: KeyboardEvent): void {
    if (this.state() !== 'ready') return;
    const command = viewerCommand(event, event.target instanceof Element ? event.target : null);
    if (!command) return;
    event.preventDefault();
    const p = this.player;
    if (command === 'toggle-play') p.togglePlay();
    else if (command === 'previous') p.step(-1);
    else if (command === 'next') p.step(1);
    else if (command === 'first') p.step(-p.total());
    else p.step(p.total());
  }

  protected setVisibleSpecies(visible: ReadonlySet<number>): void {
    const all = this.player.system()?.speciesNames.map((_, s) => s) ?? [];
    this.hiddenSpecies.set(new Set(all.filter((s) => !visible.has(s))));
  }

  private clear(): void {
    this.scene()?.dispose();
    this.scene.set(null);
    this.trajectory.set(null);
    this.loadError.set(null);
    this.selectedIndex.set(null);
    this.hiddenSpecies.set(new Set());
  }

  private receive(t: TrajectoryDto): void {
    const opening = t.status === 'ready' && this.trajectory()?.status !== 'ready';
    this.trajectory.set(t);
    if (opening && t.frames) this.player.open(String(t.id), t.frames, t.atoms ?? 0);
  }

  private createScene(canvas: HTMLCanvasElement, system: SystemSpecies): void {
    const scene = new FrameScene(canvas, system);
    scene.onPick = (atom) => this.selectedIndex.set(atom);
    let marked = false;
    scene.onDraw = () => {
      if (marked || !this.player.current()) return;
      marked = true;
      performance.mark(FIRST_FRAME_MARK);
    };
    this.scene.set(scene);
  }

  private drawPath(): void {
    const scene = this.scene();
    const frame = this.player.current();
    const atom = this.selectedIndex();
    const length = this.pathLength();
    // Frames behind the playhead may arrive after it moved; the path is redrawn when they do.
    this.player.arrivals();
    if (!scene) return;
    if (!frame || atom === null || !this.showPath()) {
      scene.setPath(new Float32Array(0));
      return;
    }
    const back = untracked(() => Array.from({ length }, (_, k) => (k === 0 ? frame : this.player.cached(frame.index - k))?.positions));
    scene.setPath(atomPath(back, atom, frame.cell));
  }
}
