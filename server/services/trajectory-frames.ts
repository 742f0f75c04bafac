import { createHash } from 'node:crypto';
import type { AppContext } from '../context.ts';
import type { TrajectoryRow } from '../db/schema/index.ts';
import type { Frame } from '../formats/frame.ts';
import type { FrameRange } from '../formats/read-frames.ts';
import { LENGTH_TO_ANGSTROM, type LengthUnit } from '../formats/units.ts';
import { writeExtxyz } from '../formats/write-extxyz.ts';
import { badRequest, conflict } from '../errors.ts';
import { encodeFrames, encodeFramesPayload } from './frames-payload.ts';
import { storedFrames, viewerCacheOf, viewerFrameStoreOf } from './stored-trajectory.ts';

/** Most coordinates one frames request returns (16 MB of Float32). */
const MAX_VALUES_PER_REQUEST = 4_000_000;

function assertReady(row: TrajectoryRow): void {
  if (row.status !== 'ready') throw conflict(`The trajectory is ${row.status}; frames are available once it is ready.`);
}

function clampRange(row: TrajectoryRow, range: Required<FrameRange>): Required<FrameRange> {
  const frames = row.frames ?? 0;
  if (range.from >= frames) throw badRequest(`from=${range.from} is past the last frame (the trajectory has ${frames} frames, numbered from 0).`);
  return { from: range.from, to: Math.min(range.to, frames), stride: range.stride };
}

/** Trajectories whose store this process has asked for: one queue request each, not one per chunk. */
const storesAskedFor = new Set<number>();

/**
 * Queues the store of a trajectory inspected before the store existed
 * (a job id already queued or kept is not added again); never fails the
 * request that asked.
 */
export function queueFrameStore(ctx: AppContext, trajectoryId: number): void {
  if (storesAskedFor.has(trajectoryId)) return;
  storesAskedFor.add(trajectoryId);
  ctx.queue.add('store-frames', { trajectoryId }, `store-frames-${trajectoryId}`).catch((err: Error) => {
    storesAskedFor.delete(trajectoryId);
    ctx.log.warn({ trajectoryId, err: err.message }, 'could not queue the frame store of an older trajectory');
  });
}

/** What the frames API answers: a validator known before any frame is read, and the payload. */
export interface FramesAnswer {
  /** A strong ETag, the same for good for the same stored frames, range and unit. */
  etag: string;
  payload(): Promise<Buffer>;
}

/** The payload layout (frames-payload.ts) is part of every ETag, so a browser never reuses an answer of another layout. */
const PAYLOAD_LAYOUT = 1;

/**
 * A chunk of frames for the viewer, positions in Å; long requests are cut
 * to a size the browser can take. Stored frames never change (a frame
 * store or upload key names one trajectory's objects for good), so the
 * encoded payload is made once per trajectory, range and unit and kept in
 * the viewer's cache: many people watching one trajectory share it.
 */
export function framesAnswer(ctx: AppContext, row: TrajectoryRow, requested: Required<FrameRange>): FramesAnswer {
  assertReady(row);
  const range = clampRange(row, requested);
  const perFrame = Math.max(1, (row.atoms ?? 1) * 3);
  const maxFrames = Math.max(1, Math.floor(MAX_VALUES_PER_REQUEST / perFrame));
  const cut = { ...range, to: Math.min(range.to, range.from + maxFrames * range.stride) };
  const toAngstrom = LENGTH_TO_ANGSTROM[row.lengthUnit as LengthUnit] ?? 1;
  const key = [row.frameStoreKey ?? `text:${row.objectKey}`, cut.from, cut.to, cut.stride, toAngstrom].join('|');
  const etag = `"${createHash('sha256').update(`${PAYLOAD_LAYOUT}|${key}`).digest('base64url')}"`;
  // Inspected before the store existed: the store is written once in the background, and until then
  // the file is read (a compressed one from its first byte for every chunk).
  if (!row.frameStoreKey) queueFrameStore(ctx, row.id);
  return { etag, payload: () => viewerCacheOf(ctx).made(key, () => encodeChunk(ctx, row, cut, toAngstrom)) };
}

async function encodeChunk(ctx: AppContext, row: TrajectoryRow, range: Required<FrameRange>, toAngstrom: number): Promise<Buffer> {
  const store = viewerFrameStoreOf(ctx, row);
  if (store) {
    const opened = await store;
    const { frames, positions } = await opened.readPositions(range);
    const { atoms, speciesNames, speciesIndex } = opened.index;
    return encodeFramesPayload({ atoms, speciesNames, speciesIndex, frames, positions }, toAngstrom);
  }
  const frames: Frame[] = [];
  for await (const frame of storedFrames(ctx, row, range)) frames.push(frame);
  return encodeFrames(frames, toAngstrom);
}

/**
 * The download name of a cut, with frames numbered from 1 as the interface
 * shows them: "run-frames-4-6.extxyz", "run-frame-1.extxyz",
 * "run-frames-1-91-every-10.extxyz" (the last frame is the last one taken).
 */
export function cutFileName(uploadName: string, frames: number, requested: Required<FrameRange>): string {
  const base = uploadName.replace(/\.(gz|zip)$/i, '').replace(/\.[^.]*$/, '') || 'trajectory';
  const { from, stride } = requested;
  const to = Math.max(from + 1, Math.min(requested.to, frames));
  const first = from + 1;
  const last = from + Math.floor((to - 1 - from) / stride) * stride + 1;
  if (first === last) return `${base}-frame-${first}.extxyz`;
  return `${base}-frames-${first}-${last}${stride > 1 ? `-every-${stride}` : ''}.extxyz`;
}

/** A frame range written as extended XYZ, streamed. */
export async function* extxyzCut(ctx: AppContext, row: TrajectoryRow, requested: Required<FrameRange>): AsyncGenerator<Uint8Array> {
  assertReady(row);
  yield* writeExtxyz(storedFrames(ctx, row, clampRange(row, requested)));
}
