import type { RequestHandler } from 'express';
import multer from 'multer';
import { AppError, badRequest } from '../errors.ts';
import type { AppContext } from '../context.ts';
import { abandonUpload, beginUpload } from '../services/trajectories.ts';
import { objectKeyFor, objectStoreStorage } from '../services/upload-to-store.ts';

/** Multipart upload of one `file` part, streamed to the object store. */
export function trajectoryUpload(ctx: AppContext): RequestHandler {
  const storage = objectStoreStorage(ctx.store, (req, file) => objectKeyFor(Number(req.params['id']), file.originalname), {
    begin: (req, file, objectKey) => beginUpload(ctx, Number(req.params['id']), req.user!.id, file.originalname, objectKey),
    abandon: (id) => abandonUpload(ctx, id),
  });
  const parse = multer({
    storage,
    limits: { fileSize: ctx.config.UPLOAD_MAX_BYTES, files: 1, fields: 30, fieldSize: 64 * 1024, parts: 40 },
  }).single('file');
  return (req, res, next) => {
    parse(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(new AppError(413, 'too_large', `The file is larger than the upload limit of ${formatBytes(ctx.config.UPLOAD_MAX_BYTES)}.`));
        }
        if (err.code === 'LIMIT_UNEXPECTED_FILE') return next(badRequest(`Send the trajectory in a multipart field named "file" (got "${err.field}").`));
        return next(badRequest(`Upload refused: ${err.message}.`));
      }
      next(err instanceof Error && /interrupted|too large|Unexpected end|Request aborted/i.test(err.message) ? badRequest(`Upload failed: ${err.message}.`) : err);
    });
  };
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
