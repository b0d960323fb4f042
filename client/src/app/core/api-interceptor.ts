import { HttpErrorResponse, HttpInterceptorFn, HttpRequest } from '@angular/common/http';
import { inject } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { NavigationStart, Router } from '@angular/router';
import { catchError, filter, switchMap, take, takeUntil, throwError } from 'rxjs';
import { apiErrorBody, apiErrorMessage } from './api-errors';
import { CsrfService } from './csrf.service';
import { SKIP_AUTH_REDIRECT, SKIP_ERROR_SNACKBAR } from './http-context';
import { SessionService } from './session.service';

const MUTATING = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function isCsrfRejection(err: unknown): boolean {
  if (!(err instanceof HttpErrorResponse) || err.status !== 403) return false;
  const body = apiErrorBody(err);
  return body?.code === 'csrf' || /csrf/i.test(body?.message ?? '');
}

/**
 * Attaches `x-csrf-token` to state-changing /api requests. When the server rejects the token
 * (403, code `csrf`: the session was regenerated or expired) it fetches a fresh one and retries once.
 */
export const csrfInterceptor: HttpInterceptorFn = (req, next) => {
  if (!MUTATING.has(req.method) || !req.url.startsWith('/api/')) return next(req);
  const csrf = inject(CsrfService);
  const withToken = (r: HttpRequest<unknown>, token: string) => r.clone({ setHeaders: { 'x-csrf-token': token } });
  return csrf.token().pipe(
    switchMap((token) => next(withToken(req, token))),
    catchError((err: unknown) => {
      if (!isCsrfRejection(err)) return throwError(() => err);
      csrf.reset();
      return csrf.token().pipe(switchMap((token) => next(withToken(req, token))));
    }),
  );
};

/**
 * Central handling of failed /api requests:
 * 401 → forget the session and go to /sign-in (unless SKIP_AUTH_REDIRECT);
 * everything else → the server's message in a snack bar (unless SKIP_ERROR_SNACKBAR covers the status).
 * The error is always re-thrown so callers can still react.
 */
export const errorInterceptor: HttpInterceptorFn = (req, next) => {
  const snackBar = inject(MatSnackBar);
  const router = inject(Router);
  const session = inject(SessionService);
  return next(req).pipe(
    catchError((err: unknown) => {
      if (!(err instanceof HttpErrorResponse)) return throwError(() => err);
      if (err.status === 401 && !req.context.get(SKIP_AUTH_REDIRECT)) {
        session.clear();
        const returnUrl = router.url.startsWith('/sign-in') ? undefined : router.url;
        void router.navigate(['/sign-in'], { queryParams: returnUrl ? { returnUrl } : {} });
        snackBar.open('Your session has ended. Please sign in again.', 'Close', { duration: 5000 });
        return throwError(() => err);
      }
      const skip = req.context.get(SKIP_ERROR_SNACKBAR);
      const skipped = skip === true || (Array.isArray(skip) && skip.includes(err.status));
      if (!skipped && !(err.status === 401 && req.context.get(SKIP_AUTH_REDIRECT))) {
        const ref = snackBar.open(apiErrorMessage(err), 'Close', { duration: 8000, panelClass: ['rn-snack-error', 'rn-snack-lines'] });
        // An error belongs to the page it happened on: leaving that page clears it.
        router.events
          .pipe(
            filter((e) => e instanceof NavigationStart),
            take(1),
            takeUntil(ref.afterDismissed()),
          )
          .subscribe(() => ref.dismiss());
      }
      return throwError(() => err);
    }),
  );
};
