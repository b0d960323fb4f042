import { HttpContext, HttpContextToken } from '@angular/common/http';

/**
 * Opt out of the interceptor's error snack bar.
 * `true` skips it for every error status; an array skips it for the listed statuses only,
 * e.g. `[409]` for a save that handles its own conflict.
 */
export const SKIP_ERROR_SNACKBAR = new HttpContextToken<boolean | readonly number[]>(() => false);

/** Opt out of the "401 → go to /sign-in" redirect (session probes, the sign-in request itself). */
export const SKIP_AUTH_REDIRECT = new HttpContextToken<boolean>(() => false);

/** Context that lets the caller handle the given error statuses itself. */
export function handleErrorsLocally(...statuses: number[]): HttpContext {
  return new HttpContext().set(SKIP_ERROR_SNACKBAR, statuses.length ? statuses : true);
}
