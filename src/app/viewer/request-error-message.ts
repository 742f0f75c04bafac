import { HttpErrorResponse } from '@angular/common/http';

/**
 * The server's own words for a failed request. Binary requests receive their
 * error body as bytes, so the JSON `{ error: { message } }` is decoded here.
 */
export function requestErrorMessage(err: unknown, fallback: string): string {
  if (err instanceof HttpErrorResponse) {
    const message = messageIn(err.error);
    if (message) return message;
    if (err.status === 0) return 'The server could not be reached. Check your connection and try again.';
    return `${fallback} (HTTP ${err.status})`;
  }
  if (err instanceof Error && err.message) return err.message;
  return fallback;
}

function messageIn(body: unknown): string | null {
  let value = body;
  if (value instanceof ArrayBuffer) value = new TextDecoder().decode(value);
  if (typeof value === 'string') {
    try {
      value = JSON.parse(value);
    } catch {
      return null;
    }
  }
  if (typeof value !== 'object' || value === null || !('error' in value)) return null;
  const error: unknown = value.error;
  if (typeof error !== 'object' || error === null || !('message' in error)) return null;
  return typeof error.message === 'string' && error.message ? error.message : null;
}
