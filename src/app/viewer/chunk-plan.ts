/**
 * How the viewer asks for frames: contiguous runs of missing frames, each cut
 * to what one request may carry, ahead of the playhead.
 */

/** Coordinates per request; the server caps a response at the same 16 MB of Float32. */
export const VALUES_PER_REQUEST = 4_000_000;
export const MAX_FRAMES_PER_REQUEST = 256;

export interface FrameRange {
  /** First frame, 0-based, inclusive. */
  from: number;
  /** One past the last frame. */
  to: number;
}

/** Frames per request for a system of `atoms`: 256 for small systems, down to one frame for huge ones. */
export function framesPerRequest(atoms: number): number {
  const perFrame = Math.max(1, atoms * 3);
  return Math.max(1, Math.min(MAX_FRAMES_PER_REQUEST, Math.floor(VALUES_PER_REQUEST / perFrame)));
}

/**
 * Frames worth keeping ready around the playhead: two requests ahead, but
 * never more than a quarter of the cache, so prefetching cannot evict the
 * frames being looked at.
 */
export function prefetchAhead(atoms: number, cacheBytes: number): number {
  const frameBytes = Math.max(1, atoms * 12);
  return Math.max(1, Math.min(2 * framesPerRequest(atoms), Math.floor(cacheBytes / 4 / frameBytes)));
}

/**
 * Requests covering every frame in [from, to) that `isWanted` accepts (not
 * cached, not already on its way), in order, each at most `perRequest` long.
 */
export function planRequests(window: FrameRange, isWanted: (frame: number) => boolean, perRequest: number): FrameRange[] {
  const plan: FrameRange[] = [];
  let start = -1;
  const close = (end: number) => {
    if (start >= 0) plan.push({ from: start, to: end });
    start = -1;
  };
  for (let frame = window.from; frame < window.to; frame++) {
    if (!isWanted(frame)) close(frame);
    else if (start < 0) start = frame;
    else if (frame - start >= perRequest) {
      close(frame);
      start = frame;
    }
  }
  close(window.to);
  return plan;
}

/** [from, to) clipped to the trajectory's frames. */
export function clipRange(from: number, to: number, total: number): FrameRange {
  return { from: Math.max(0, Math.min(from, total)), to: Math.max(0, Math.min(to, total)) };
}
