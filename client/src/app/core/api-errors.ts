import { HttpErrorResponse } from '@angular/common/http';
import { ApiErrorBody } from './api-types';

/** The server's error body, when the response carries one in the contract's shape. */
export function apiErrorBody(err: unknown): ApiErrorBody['error'] | null {
  if (!(err instanceof HttpErrorResponse)) return null;
  const body = err.error as Partial<ApiErrorBody> | null;
  return body && typeof body === 'object' && body.error && typeof body.error.message === 'string' ? body.error : null;
}

/**
 * One human sentence (plus one line per field error) for a failed request.
 * Never shows a stack trace or raw HTML: unknown bodies fall back to a sentence about the status.
 */
export function apiErrorMessage(err: unknown): string {
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
