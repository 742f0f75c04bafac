import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { Logger } from './logger.ts';
import { isOutage, serviceUnavailable } from './outage.ts';

/** An expected failure with a status and a message fit to show the user. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'AppError';
  }
}

export const badRequest = (message: string, details?: unknown) => new AppError(400, 'bad_request', message, details);
export const unauthorized = (message = 'Sign in to continue.') => new AppError(401, 'unauthorized', message);
export const forbidden = (message = 'You do not have access to this.') => new AppError(403, 'forbidden', message);
export const notFound = (what = 'Resource') => new AppError(404, 'not_found', `${what} not found.`);
export const conflict = (message: string) => new AppError(409, 'conflict', message);

export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not_found', `No API route for ${req.method} ${req.path}.`));
};

/** The one place errors become JSON responses: `{ error: { code, message, details? } }`. */
export function errorHandler(log: Logger): ErrorRequestHandler {
  return (error, _req, res, _next) => {
    let err: unknown = error;
    // A streamed answer that fails half-way cannot become an error document: the connection is cut instead.
    if (res.headersSent) {
      log.warn({ err: error instanceof Error ? error.message : String(error) }, 'answer failed while streaming');
      res.destroy();
      return;
    }
    if (err instanceof ZodError) {
      const details = err.issues.map((i) => ({ field: i.path.join('.'), message: i.message }));
      const message = details.map((d) => (d.field ? `${d.field}: ${d.message}` : d.message)).join('; ');
      res.status(400).json({ error: { code: 'invalid_input', message, details } });
      return;
    }
    if (!(err instanceof AppError) && isOutage(err)) {
      log.warn({ err: err instanceof Error ? err.message : String(err) }, 'backing service unreachable');
      err = serviceUnavailable();
    }
    if (err instanceof AppError) {
      if (err.status >= 500 && err.status !== 503) log.error({ err }, err.message);
      const wait = (err.details as { retryAfterSeconds?: unknown } | undefined)?.retryAfterSeconds;
      if ((err.status === 429 || err.status === 503) && typeof wait === 'number') res.setHeader('Retry-After', String(Math.ceil(wait)));
      res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details } });
      return;
    }
    const plain = (err ?? {}) as { status?: unknown; message?: unknown };
    const status = typeof plain.status === 'number' && plain.status >= 400 && plain.status < 600 ? plain.status : 500;
    if (status >= 500) log.error({ err }, 'unhandled error');
    const message = status >= 500 ? 'Something went wrong on the server.' : String(plain.message ?? 'Bad request.');
    res.status(status).json({ error: { code: status >= 500 ? 'internal' : 'bad_request', message } });
  };
}
