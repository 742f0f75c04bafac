import type { RequestHandler } from 'express';
import multer from 'multer';
import { currentUser } from '../auth/authorize.ts';
import { tooLargeMessage } from '../../shared/upload-policy.ts';
import { AppError, badRequest } from '../errors.ts';
import type { AppContext } from '../context.ts';
import { isOutage, serviceUnavailable } from '../outage.ts';
import { abandonUpload, beginUpload, touchUpload } from '../services/trajectories.ts';
import { objectKeyFor, objectStoreStorage, UploadInterrupted } from '../services/upload-to-store.ts';

/** Text fields and parts an upload may carry beside its file (multer's limits below). */
const MAX_FIELDS = 30;
const MAX_FIELD_BYTES = 64 * 1024;
const MAX_PARTS = 40;
/** busboy refuses a part whose headers are longer than this. */
const MAX_PART_HEADER_BYTES = 16 * 1024;

/**
 * The largest body an upload within the limit can have: the file plus every
 * field, part header and boundary it may carry. A Content-Length above it
 * can only hold a file over the limit, so it is refused before any byte of
 * the body is read, rather than after gigabytes have been sent.
 */
export function largestUploadBody(uploadMaxBytes: number): number {
  return uploadMaxBytes + MAX_FIELDS * MAX_FIELD_BYTES + MAX_PARTS * (MAX_PART_HEADER_BYTES + 256);
}

/** Multipart upload of one `file` part, streamed to the object store. */
export function trajectoryUpload(ctx: AppContext): RequestHandler {
  const storage = objectStoreStorage(ctx.store, (req, file) => objectKeyFor(Number(req.params['id']), file.originalname), {
    begin: (req, file, objectKey) => beginUpload(ctx, Number(req.params['id']), currentUser(req).id, file.originalname, objectKey),
    heartbeat: (id) => touchUpload(ctx, id),
    abandon: (id, objectKey) => abandonUpload(ctx, id, objectKey),
  }, ctx.config.UPLOAD_MAX_BYTES);
  const parse = multer({
    storage,
    // RFC 7578 §4.2: file names are sent as UTF-8; busboy's default would read them as Latin-1.
    defParamCharset: 'utf8',
    limits: { fileSize: ctx.config.UPLOAD_MAX_BYTES, files: 1, fields: MAX_FIELDS, fieldSize: MAX_FIELD_BYTES, parts: MAX_PARTS },
  }).single('file');
  return (req, res, next) => {
    const type = req.get('content-type') ?? '';
    if (/^multipart\//i.test(type) && !/;\s*boundary=/i.test(type)) {
      return next(badRequest('The multipart body has no boundary: send Content-Type "multipart/form-data; boundary=…" (curl -F and browsers do this).'));
    }
    const declared = Number(req.get('content-length'));
    if (declared > largestUploadBody(ctx.config.UPLOAD_MAX_BYTES)) {
      // Answered at once and the connection closed, so the client stops sending the rest.
      res.set('Connection', 'close');
      return next(tooLarge(ctx, declared));
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
    if (err.code === 'LIMIT_FILE_SIZE') return tooLarge(ctx);
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

function tooLarge(ctx: AppContext, declaredBytes?: number): AppError {
  return new AppError(413, 'too_large', tooLargeMessage(ctx.config.UPLOAD_MAX_BYTES, declaredBytes === undefined ? undefined : { what: 'The upload', bytes: declaredBytes }));
}
