import type { RequestHandler } from 'express';
import multer from 'multer';
import { currentUser } from '../auth/authorize.ts';
import { AppError, badRequest } from '../errors.ts';
import type { AppContext } from '../context.ts';
import { isOutage, serviceUnavailable } from '../outage.ts';
import { abandonUpload, beginUpload, touchUpload } from '../services/trajectories.ts';
import { objectKeyFor, objectStoreStorage, UploadInterrupted } from '../services/upload-to-store.ts';

/** Multipart upload of one `file` part, streamed to the object store. */
export function trajectoryUpload(ctx: AppContext): RequestHandler {
  const storage = objectStoreStorage(ctx.store, (req, file) => objectKeyFor(Number(req.params['id']), file.originalname), {
    begin: (req, file, objectKey) => beginUpload(ctx, Number(req.params['id']), currentUser(req).id, file.originalname, objectKey),
    heartbeat: (id) => touchUpload(ctx, id),
    abandon: (id, objectKey) => abandonUpload(ctx, id, objectKey),
  });
  const parse = multer({
    storage,
    // RFC 7578 §4.2: file names are sent as UTF-8; busboy's default would read them as Latin-1.
    defParamCharset: 'utf8',
    limits: { fileSize: ctx.config.UPLOAD_MAX_BYTES, files: 1, fields: 30, fieldSize: 64 * 1024, parts: 40 },
  }).single('file');
  return (req, res, next) => {
    const type = req.get('content-type') ?? '';
    if (/^multipart\//i.test(type) && !/;\s*boundary=/i.test(type)) {
      return next(badRequest('The multipart body has no boundary: send Content-Type "multipart/form-data; boundary=…" (curl -F and browsers do this).'));
    }
    parse(req, res, (err: unknown) => {
      if (!err) return next();
      // The answer waits until the part's row and object are gone, so nothing is seen `uploading` after it.
      void storage.settled(req).then(() => next(uploadError(ctx, err)));
    });
  };
}

function uploadError(ctx: AppContext, err: unknown): unknown {
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') {
      return new AppError(413, 'too_large', `The file is larger than the upload limit of ${formatBytes(ctx.config.UPLOAD_MAX_BYTES)}.`);
    }
    if (err.code === 'LIMIT_UNEXPECTED_FILE') return badRequest(`Send the trajectory in a multipart field named "file" (got "${err.field}").`);
    return badRequest(`Upload refused: ${err.message}.`);
  }
  if (err instanceof AppError) return err;
  if (isOutage(err)) return serviceUnavailable('The file store or database is not reachable, so the upload was not kept. Try again in a minute.');
  if (err instanceof UploadInterrupted) return badRequest(`Upload failed: ${err.message}.`);
  if (err instanceof Error && /Unexpected end of (form|file)|Malformed part header|Request (aborted|closed)|Boundary not found/i.test(err.message)) {
    return badRequest(`Upload failed: the multipart body is incomplete or malformed (${err.message}).`);
  }
  return err;
}

export function formatBytes(bytes: number): string {
  const units = ['bytes', 'KiB', 'MiB', 'GiB', 'TiB'];
  let value = bytes;
  let unit = 0;
  while (value >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit++;
  }
  return `${Number.isInteger(value) ? value : value.toFixed(1)} ${units[unit]}`;
}
