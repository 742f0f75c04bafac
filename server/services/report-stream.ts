import { PassThrough, Readable, Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { createGunzip, createGzip } from 'node:zlib';
import type { Request, Response } from 'express';
import type { AppContext } from '../context.ts';

/** Stands where the curves go while the rest of the answer is written as JSON. */
const CURVES_PLACEHOLDER = '\u0000ergodic-curves\u0000';
export const curvesPlaceholder = CURVES_PLACEHOLDER as unknown as never;

function splitAtCurves(envelope: unknown): [string, string] {
  const text = JSON.stringify(envelope);
  const marker = JSON.stringify(CURVES_PLACEHOLDER);
  const at = text.indexOf(marker);
  if (at < 0) throw new Error('the answer has no place for the curves');
  return [text.slice(0, at), text.slice(at + marker.length)];
}

/**
 * Sends a JSON answer whose `curves` are the report's stored curves
 * document, streamed from the object store: the curves are never parsed or
 * built as objects, and (un)zipping runs in zlib's thread pool, chunk by
 * chunk, so a large report neither blocks the event loop nor sits whole in
 * memory. Clients that accept gzip (browsers, curl --compressed) get gzip.
 */
export async function sendWithStoredCurves(ctx: AppContext, req: Request, res: Response, envelope: unknown, curvesKey: string): Promise<void> {
  const [before, after] = splitAtCurves(envelope);
  const stored = await ctx.store.getStream(curvesKey);
  const zipped = req.acceptsEncodings('gzip', 'identity') === 'gzip';
  res.type('application/json');
  res.vary('Accept-Encoding');
  if (zipped) res.setHeader('Content-Encoding', 'gzip');
  let opened = false;
  const framed = new Transform({
    transform(chunk: Buffer, _enc, done) {
      if (!opened) this.push(before);
      opened = true;
      done(null, chunk);
    },
    flush(done) {
      if (!opened) this.push(before);
      done(null, after);
    },
  });
  await pipeline(stored as Readable, createGunzip(), framed, zipped ? createGzip({ level: 6 }) : new PassThrough(), res);
}
