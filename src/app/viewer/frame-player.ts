import { computed, DestroyRef, inject, Injectable, signal } from '@angular/core';
import { takeUntilDestroyed, toObservable } from '@angular/core/rxjs-interop';
import { animationFrameScheduler, combineLatest, EMPTY, interval, switchMap } from 'rxjs';
import { prefetchAhead } from './chunk-plan';
import { FrameSource } from './frame-source';
import type { ViewerFrame } from './frames-payload-decoder';
import type { SystemSpecies } from './scene/frame-scene';
import { requestErrorMessage } from './request-error-message';
import { ViewerApi } from './viewer-api';

/** Memory the cached frame positions may take in the browser. */
export const FRAME_CACHE_BYTES = 256 * 2 ** 20;

/**
 * Playback state of one trajectory: where the playhead is, which frame is on
 * screen, and the frames kept around both. Provided per viewer page.
 */
@Injectable()
export class FramePlayer {
  private readonly api = inject(ViewerApi);
  private readonly destroyRef = inject(DestroyRef);
  private source: FrameSource | null = null;
  private ahead = 1;
  private behind = 0;

  readonly total = signal(0);
  /** Species of the system, known once the first frames arrive. */
  readonly system = signal<SystemSpecies | null>(null);
  /** The frame asked for, 0-based. */
  readonly playhead = signal(0);
  /** The frame on screen; it lags the playhead while frames are loading. */
  readonly current = signal<ViewerFrame | null>(null);
  readonly playing = signal(false);
  /** Playback speed, frames per second. */
  readonly fps = signal(10);
  readonly error = signal<string | null>(null);
  /** Bumped whenever frames arrive, so views built from cached frames can refresh. */
  readonly arrivals = signal(0);
  readonly waiting = computed(() => this.error() === null && this.current()?.index !== this.playhead());

  constructor() {
    combineLatest([toObservable(this.playing), toObservable(this.fps)]).pipe(
      switchMap(([playing, fps]) => (playing ? interval(1000 / fps, animationFrameScheduler) : EMPTY)),
      takeUntilDestroyed(),
    ).subscribe(() => this.advance());
    this.destroyRef.onDestroy(() => this.source?.dispose());
  }

  open(trajectoryId: string, frames: number, atoms: number): void {
    this.source?.dispose();
    this.system.set(null);
    this.current.set(null);
    this.playhead.set(0);
    this.playing.set(false);
    this.error.set(null);
    this.total.set(frames);
    this.ahead = prefetchAhead(atoms, FRAME_CACHE_BYTES);
    const source = new FrameSource((range) => this.api.frames(trajectoryId, range), { total: frames, atoms, cacheBytes: FRAME_CACHE_BYTES });
    this.source = source;
    source.arrived$.pipe(takeUntilDestroyed(this.destroyRef)).subscribe(({ payload }) => {
      if (!this.system()) this.system.set({ speciesNames: payload.speciesNames, speciesIndex: payload.speciesIndex });
      this.arrivals.update((n) => n + 1);
      this.present();
    });
    source.failed$.pipe(takeUntilDestroyed(this.destroyRef)).subscribe((err) => {
      this.playing.set(false);
      this.error.set(requestErrorMessage(err, 'Frames could not be loaded'));
    });
    this.present();
  }

  /** A cached frame, for views that look back in time (the atom path). */
  cached(index: number): ViewerFrame | undefined {
    return index >= 0 ? this.source?.frame(index) : undefined;
  }

  /** Frames before the playhead to keep at hand as well. */
  keepBehind(frames: number): void {
    this.behind = Math.max(0, frames);
    this.present();
  }

  seek(frame: number): void {
    const total = this.total();
    if (total === 0) return;
    this.playhead.set(Math.min(total - 1, Math.max(0, Math.round(frame))));
    this.present();
  }

  step(delta: number): void {
    this.playing.set(false);
    this.seek(this.playhead() + delta);
  }

  togglePlay(): void {
    if (this.playing()) {
      this.playing.set(false);
      return;
    }
    if (this.total() < 2) return;
    if (this.playhead() >= this.total() - 1) this.seek(0);
    this.playing.set(true);
  }

  retry(): void {
    this.error.set(null);
    this.source?.retry();
  }

  private advance(): void {
    // Playback holds still while the next frame is loading rather than skipping it.
    if (this.waiting()) return;
    const next = this.playhead() + 1;
    if (next >= this.total()) {
      this.playing.set(false);
      return;
    }
    this.seek(next);
  }

  private present(): void {
    const source = this.source;
    if (!source) return;
    const at = this.playhead();
    source.want({ from: at, to: at + this.ahead }, { from: at - this.behind, to: at });
    const frame = source.frame(at);
    if (frame && frame !== this.current()) this.current.set(frame);
  }
}
