import { createHash, randomUUID } from 'node:crypto';
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

/** Object keys never contain user text beyond a sanitised name. */
export function objectKeyFor(projectId: number, fileName: string): string {
  const base = fileName.split(/[\\/]/).pop() ?? '';
  const safe = base.normalize('NFKC').replace(/[^\w.+-]+/g, '_').replace(/^\.+/, '').slice(-120) || 'trajectory';
  return `projects/${projectId}/trajectories/${randomUUID()}/${safe}`;
}

/** How the storage engine tells the database about an upload it is streaming. */
export interface UploadRecord {
  /** Records the upload as begun (status `uploading`) and returns its id. */
  begin(req: Request, file: Express.Multer.File, objectKey: string): Promise<number>;
  /** Forgets an upload that never completed. */
  abandon(id: number): Promise<void>;
}

/**
 * Multer storage that streams the file part straight into the object store
 * as a multipart upload while hashing it: nothing is buffered whole in
 * memory or written to local disk. A part that does not finish (size limit,
 * dropped connection) aborts the multipart upload and forgets its row, so
 * neither an object nor a trajectory is left behind.
 */
export function objectStoreStorage(
  store: ObjectStore, keyFor: (req: Request, file: Express.Multer.File) => string, record: UploadRecord,
): StorageEngine {
  function streamToStore(req: Request, file: Express.Multer.File, objectKey: string, trajectoryId: number,
    callback: (error?: Error | null, info?: Partial<Express.Multer.File>) => void): void {
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
    const upload = store.streamUpload(objectKey, body);
    let failed = false;
    const fail = (err: Error) => {
      if (failed) return;
      failed = true;
      void upload.abort().catch(() => {});
      void record.abandon(trajectoryId).catch(() => {});
      body.destroy();
      callback(err);
    };
    file.stream.on('limit', () => fail(new Error('file too large')));
    file.stream.on('error', fail);
    req.on('close', () => {
      if (!file.stream.readableEnded) fail(new Error('the upload was interrupted before the file was complete'));
    });
    file.stream.pipe(counter).pipe(body);
    upload.done().then(
      () => {
        if (failed) {
          void store.delete(objectKey).catch(() => {});
          return;
        }
        callback(null, { trajectoryId, objectKey, sizeBytes, sha256: hash.digest('hex') });
      },
      (err: Error) => fail(err),
    );
  }

  return {
    _handleFile(req, file, callback) {
      const objectKey = keyFor(req, file);
      record.begin(req, file, objectKey).then(
        (trajectoryId) => streamToStore(req, file, objectKey, trajectoryId, callback),
        (err: Error) => callback(err),
      );
    },
    _removeFile(_req, file, callback) {
      if (file.trajectoryId) void record.abandon(file.trajectoryId).catch(() => {});
      if (!file.objectKey) return callback(null);
      store.delete(file.objectKey).then(() => callback(null), (err: Error) => callback(err));
    },
  };
}
