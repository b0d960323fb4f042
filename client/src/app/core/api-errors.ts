import { HttpErrorResponse } from '@angular/common/http';
import { ApiErrorBody } from './api-types';

/** The server's error body, when the response carries one in the contract's shape. */
export function apiErrorBody(err: unknown): ApiErrorBody['error'] | null {
  if (!(err instanceof HttpErrorResponse)) return null;
  const body = err.error as Partial<ApiErrorBody> | null;
  return body && typeof body === 'object' && body.error && typeof body.error.message === 'string' ? body.error : null;
}

/** Screen-specific sentences for some statuses, e.g. `{ 404: 'This project does not exist…' }`. */
export type StatusMessages = Partial<Record<number, string>>;

/**
 * One human sentence (plus one line per field error) for a failed request.
 * Never shows a stack trace or raw HTML: unknown bodies fall back to a sentence about the status.
 * `byStatus` lets a screen say it in its own words for statuses it expects (these win over the body).
 * Accepts the error of an `rxResource` too: a wrapped error is unwrapped through `cause`.
 */
export function apiErrorMessage(error: unknown, byStatus: StatusMessages = {}): string {
  const err = error instanceof Error && error.cause instanceof HttpErrorResponse ? error.cause : error;
  const own = err instanceof HttpErrorResponse ? byStatus[err.status] : undefined;
  if (own) return own;
  const body = apiErrorBody(err);
  if (body) {
    const fields = (body.fields ?? []).map((f) => `• ${f.path ? `${f.path}: ` : ''}${f.message}`);
    return [body.message, ...fields].join('\n');
  }
  if (err instanceof HttpErrorResponse) {
    if (err.status === 0) return 'Cannot reach the Runnel server. Check the connection and try again.';
    if (err.status === 429) return 'Too many attempts. Wait a minute and try again.';
    if (err.status >= 500) return 'The server could not complete the request. Try again in a moment.';
    return `The request failed (HTTP ${err.status}).`;
  }
  return 'Something went wrong.';
}
