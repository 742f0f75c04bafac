/**
 * Which frames an analysis uses: a range [fromFrame, toFrame), every
 * frameStride-th frame, after leaving out discardPs of equilibration at the
 * start of the range. One rule for the API, the dialog and the command line.
 * Frames here are 0-based with `to` exclusive, as in the API and the command
 * line; the browser shows them counted from 1 and converts at its form.
 */

/** Runs longer than this are analysed every few frames unless a stride is given, so the default cost stays bounded. */
export const AUTO_STRIDE_MAX_FRAMES = 100_000;

export interface FrameSelectionInput {
  fromFrame?: number;
  toFrame?: number;
  frameStride?: number;
  discardPs?: number;
}

export interface FrameSelection {
  /** First frame used, after the discard. */
  from: number;
  /** One past the last frame that may be used. */
  to: number;
  stride: number;
  /** Frames left out at the start of the range for equilibration. */
  discardFrames: number;
  /** How many frames the analyses see. */
  frames: number;
  /** True when the stride was chosen here because the run is long. */
  autoStride: boolean;
}

/** The stride used when none is given: 1, or enough to keep a long run at most AUTO_STRIDE_MAX_FRAMES frames. */
export function autoStride(frames: number): number {
  return Math.max(1, Math.ceil(frames / AUTO_STRIDE_MAX_FRAMES));
}

/**
 * Resolves a selection against a trajectory of `totalFrames` frames
 * `framePs` apart, or says in plain words why it cannot be used.
 */
export function selectFrames(totalFrames: number, framePs: number, input: FrameSelectionInput): FrameSelection | { problem: string } {
  const fromFrame = input.fromFrame ?? 0;
  const toFrame = input.toFrame ?? totalFrames;
  if (fromFrame >= totalFrames) return { problem: `fromFrame ${fromFrame} is past the last frame (the trajectory has ${totalFrames} frames, numbered from 0).` };
  if (toFrame > totalFrames) return { problem: `toFrame ${toFrame} is past the end (the trajectory has ${totalFrames} frames; toFrame is one past the last frame used).` };
  if (toFrame <= fromFrame) return { problem: `toFrame (${toFrame}) must be greater than fromFrame (${fromFrame}).` };
  const discardPs = input.discardPs ?? 0;
  const discardFrames = discardPs > 0 ? Math.ceil(discardPs / framePs - 1e-9) : 0;
  const from = fromFrame + discardFrames;
  if (from >= toFrame) {
    // No frame numbers here: the browser counts from 1 and the API from 0, and this message reaches both.
    return { problem: `Discarding ${discardPs} ps (${discardFrames} frames) leaves none of the ${toFrame - fromFrame} frames chosen.` };
  }
  const stride = input.frameStride ?? autoStride(toFrame - from);
  const frames = Math.ceil((toFrame - from) / stride);
  if (frames < 2) return { problem: `The selection leaves ${frames} frame; analyses need at least 2 (use a smaller stride or a longer range).` };
  return { from, to: toFrame, stride, discardFrames, frames, autoStride: input.frameStride === undefined && stride > 1 };
}
