import { createHash } from 'node:crypto';
import { PassThrough, Transform } from 'node:stream';
import type { Request } from 'express';
import type { StorageEngine } from 'multer';
import type { ObjectStore } from '../storage/object-store.ts';

/** What the storage engine hands the route for the uploaded part. */
export interface StoredUpload {
  /** The row recorded as `uploading` when the file part began. */
  trajectoryId: number;
  objectKey: string;
  sizeBytes: number;
  sha256: string;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    namespace Multer {
      interface File extends Partial<StoredUpload> {}
    }
  }
}

export { objectKeyFor } from '../storage/object-keys.ts';

/** How the storage engine tells the database about an upload it is streaming. */
export interface UploadRecord {
  /** Records the upload as begun (status `uploading`) and returns its id. */
  begin(req: Request, file: Express.Multer.File, objectKey: string): Promise<number>;
  /** Still receiving bytes: keeps the row from being swept as abandoned. */
  heartbeat(id: number): Promise<void>;
  /** Forgets an upload that never completed (row and stored object). */
  abandon(id: number, objectKey: string): Promise<void>;
}

/** The file part stopped before its end: the client went away or the body was cut short. */
export class UploadInterrupted extends Error {
  constructor(reason: string) {
    super(`the upload was interrupted before the file was complete (${reason})`);
    this.name = 'UploadInterrupted';
  }
}

const HEARTBEAT_MS = 15_000;

/**
 * Multer storage that streams the file part straight into the object store
 * as a multipart upload while hashing it: nothing is buffered whole in
 * memory or written to local disk.
 *
 * The part is complete only when its own stream has ended *and* the store
 * has confirmed the object. The request's `close` event says nothing about
 * that: Node emits it as soon as the body has been read, which for a file
 * still queued behind the store's back-pressure comes before the part ends.
 * Whatever stops the part early (size limit, cut-off body, dropped
 * connection, store error, a response sent for any other reason) aborts the
 * store upload and forgets the row *before* multer hears of the failure, so
 * when the client gets its error nothing is left `uploading`.
 */
export function objectStoreStorage(
  store: ObjectStore, keyFor: (req: Request, file: Express.Multer.File) => string, record: UploadRecord, largestBytes = 0,
): StorageEngine & { settled(req: Request): Promise<void> } {
  // Multer may report a failed part before this engine has cleaned up after it; callers wait on this.
  const pending = new WeakMap<Request, Promise<void>>();
  return {
    settled: (req) => pending.get(req) ?? Promise.resolve(),
    _handleFile(req, file, done) {
      let markSettled = () => {};
      pending.set(req, new Promise<void>((resolve) => { markSettled = resolve; }));
      const callback = (error?: Error | null, info?: Partial<Express.Multer.File>) => {
        markSettled();
        done(error, info);
      };
      const objectKey = keyFor(req, file);
      const stream = file.stream;
      // Listen before the row exists: the part may already fail while the insert runs.
      let early: Error | null = null;
      const noteEarly = (err: Error) => { early ??= err; };
      const onEarlyClose = () => { if (!stream.readableEnded) noteEarly(new UploadInterrupted('the file part was cut off')); };
      stream.on('error', noteEarly);
      stream.on('close', onEarlyClose);
      record.begin(req, file, objectKey).then(
        (trajectoryId) => {
          stream.off('error', noteEarly);
          stream.off('close', onEarlyClose);
          streamToStore(store, record, req, file, { objectKey, trajectoryId, early, largestBytes }, callback);
        },
        (err: Error) => {
          stream.resume();
          callback(err);
        },
      );
    },
    _removeFile(_req, file, callback) {
      if (!file.trajectoryId || !file.objectKey) return callback(null);
      record.abandon(file.trajectoryId, file.objectKey).then(() => callback(null), (err: Error) => callback(err));
    },
  };
}

interface Begun {
  objectKey: string;
  trajectoryId: number;
  /** A failure seen while the row was being recorded. */
  early: Error | null;
  /** The largest file the upload may carry, which sizes its parts. */
  largestBytes: number;
}

function streamToStore(
  store: ObjectStore, record: UploadRecord, req: Request, file: Express.Multer.File, begun: Begun,
  callback: (error?: Error | null, info?: Partial<Express.Multer.File>) => void,
): void {
  const { objectKey, trajectoryId } = begun;
  const stream = file.stream;
  const hash = createHash('sha256');
  let sizeBytes = 0;
  const counter = new Transform({
    transform(chunk: Buffer, _enc, done) {
      hash.update(chunk);
      sizeBytes += chunk.length;
      done(null, chunk);
    },
  });
  const body = new PassThrough();
  const upload = store.streamUpload(objectKey, body, undefined, begun.largestBytes);
  const heartbeat = setInterval(() => void record.heartbeat(trajectoryId).catch(() => {}), HEARTBEAT_MS);
  heartbeat.unref();
  let settled = false;

  const fail = (err: Error) => {
    if (settled) return;
    settled = true;
    clearInterval(heartbeat);
    stream.unpipe(counter);
    stream.resume();
    body.destroy();
    // The row goes first and alone decides the answer; the store abort may fail while the store is down.
    void upload.abort().catch(() => {});
    record.abandon(trajectoryId, objectKey).catch(() => {}).finally(() => callback(err));
  };

  if (begun.early || (stream.destroyed && !stream.readableEnded)) {
    fail(begun.early ?? new UploadInterrupted('the file part was cut off'));
    return;
  }
  stream.on('limit', () => fail(new Error('file too large')));
  stream.on('error', fail);
  stream.on('close', () => {
    if (!stream.readableEnded) fail(new UploadInterrupted('the file part was cut off'));
  });
  // Only a body that never arrived in full is an interruption, not one already read and queued.
  req.on('close', () => {
    if (!req.complete) fail(new UploadInterrupted('the connection closed'));
  });
  // A response sent for any other reason (busboy's "Unexpected end of form", a route error) ends the upload too.
  req.res?.on('close', () => fail(new UploadInterrupted('the request ended')));
  stream.pipe(counter).pipe(body);
  upload.done().then(
    () => {
      if (settled) {
        void store.delete(objectKey).catch(() => {});
        return;
      }
      settled = true;
      clearInterval(heartbeat);
      callback(null, { trajectoryId, objectKey, sizeBytes, sha256: hash.digest('hex') });
    },
    (err: Error) => fail(err),
  );
}
