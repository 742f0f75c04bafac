import { HttpErrorResponse } from '@angular/common/http';

interface ApiErrorBody {
  error?: { code?: string; message?: string };
}

/** The server's own words for a failed request, or a plain fallback when it never answered. */
export function apiErrorMessage(err: unknown, fallback = 'Something went wrong. Try again.'): string {
  if (err instanceof HttpErrorResponse) {
    const body = err.error as ApiErrorBody | null;
    if (typeof body?.error?.message === 'string') return body.error.message;
    if (err.status === 0) return 'The server could not be reached. Check your connection and try again.';
  }
  return fallback;
}
