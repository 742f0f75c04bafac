import { Subject, Subscription, type Observable } from 'rxjs';
import { ByteBoundedLru } from './byte-bounded-lru';
import { clipRange, framesPerRequest, planRequests, type FrameRange } from './chunk-plan';
import type { FramesPayload, ViewerFrame } from './frames-payload-decoder';

/** Fetches [from, to); the server may answer with fewer frames than asked. */
export type FetchFrames = (range: FrameRange) => Observable<FramesPayload>;

export interface FrameSourceOptions {
  /** Frames in the trajectory. */
  total: number;
  atoms: number;
  /** Memory the cached positions may use. */
  cacheBytes: number;
  /** Requests allowed on the wire at once. */
  maxConcurrent?: number;
}

/** A response that arrived, with the range it answered. */
export interface FramesArrival {
  requested: FrameRange;
  payload: FramesPayload;
}

interface PendingRequest {
  range: FrameRange;
  subscription: Subscription;
}

/**
 * The viewer's frames: a memory-bounded cache in front of the frames API.
 * Callers say which frames they care about now; the source asks for the
 * missing ones, drops requests nobody cares about any more, and stops asking
 * after a failure until told to retry, so a broken server is not hammered.
 */
export class FrameSource {
  private readonly cache: ByteBoundedLru<number, ViewerFrame>;
  private readonly pending = new Set<PendingRequest>();
  private readonly arrivals = new Subject<FramesArrival>();
  private readonly failures = new Subject<unknown>();
  private readonly perRequest: number;
  private readonly maxConcurrent: number;
  private interest: FrameRange[] = [];
  private halted = false;

  readonly arrived$: Observable<FramesArrival> = this.arrivals.asObservable();
  readonly failed$: Observable<unknown> = this.failures.asObservable();

  constructor(private readonly fetch: FetchFrames, private readonly options: FrameSourceOptions) {
    this.cache = new ByteBoundedLru(options.cacheBytes, (f) => f.positions.byteLength);
    this.perRequest = framesPerRequest(options.atoms);
    this.maxConcurrent = options.maxConcurrent ?? 2;
  }

  /** The frame if cached, marked as recently used. */
  frame(index: number): ViewerFrame | undefined {
    return this.cache.get(index);
  }

  has(index: number): boolean {
    return this.cache.has(index);
  }

  get cachedBytes(): number {
    return this.cache.bytes;
  }

  /**
   * Declares the frames wanted now, most urgent range first. Requests for
   * frames outside all of them are cancelled; missing ones are requested.
   */
  want(...ranges: FrameRange[]): void {
    this.interest = ranges.map((r) => clipRange(r.from, r.to, this.options.total)).filter((r) => r.to > r.from);
    const overlaps = (a: FrameRange, b: FrameRange) => a.from < b.to && b.from < a.to;
    for (const request of [...this.pending]) {
      if (!this.interest.some((r) => overlaps(r, request.range))) this.cancel(request);
    }
    this.requestMissing();
  }

  /** Clears a failure and asks again for what is wanted. */
  retry(): void {
    this.halted = false;
    this.requestMissing();
  }

  dispose(): void {
    for (const request of [...this.pending]) this.cancel(request);
    this.arrivals.complete();
    this.failures.complete();
  }

  private requestMissing(): void {
    if (this.halted) return;
    const isWanted = (f: number) => !this.cache.has(f) && ![...this.pending].some((p) => f >= p.range.from && f < p.range.to);
    const plan = this.interest.flatMap((range) => planRequests(range, isWanted, this.perRequest));
    // Nothing on screen yet: one frame alone arrives soonest, the rest of its chunk follows beside it.
    const first = plan[0];
    if (first && this.cache.size === 0 && this.pending.size === 0 && first.to - first.from > 1) {
      plan.splice(0, 1, { from: first.from, to: first.from + 1 }, { from: first.from + 1, to: first.to });
    }
    for (const range of plan.slice(0, Math.max(0, this.maxConcurrent - this.pending.size))) {
      // A request can fail as soon as it starts; the rest of the plan then waits for a retry too.
      if (this.halted) break;
      this.start(range);
    }
  }

  private start(range: FrameRange): void {
    const request: PendingRequest = { range, subscription: new Subscription() };
    this.pending.add(request);
    request.subscription.add(this.fetch(range).subscribe({
      next: (payload) => {
        this.pending.delete(request);
        if (!payload.frames.some((f) => f.index === range.from)) {
          this.fail(new Error(`The server sent no data for frame ${range.from + 1}.`));
          return;
        }
        for (const frame of payload.frames) this.cache.set(frame.index, frame);
        this.arrivals.next({ requested: range, payload });
        // A short answer leaves the rest of the range missing; the next plan asks for it.
        this.requestMissing();
      },
      error: (err: unknown) => {
        this.pending.delete(request);
        this.fail(err);
      },
    }));
  }

  private fail(err: unknown): void {
    this.halted = true;
    this.failures.next(err);
  }

  private cancel(request: PendingRequest): void {
    request.subscription.unsubscribe();
    this.pending.delete(request);
  }
}
