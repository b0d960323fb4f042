import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { map } from 'rxjs';
import { SessionService } from './session.service';

/** Signed-in users only; others go to /sign-in and come back afterwards. */
export const signedInGuard: CanActivateFn = (_route, state) => {
  const router = inject(Router);
  return inject(SessionService)
    .load()
    .pipe(map((me) => (me ? true : router.createUrlTree(['/sign-in'], { queryParams: { returnUrl: state.url } }))));
};

/** Signed-out users only (sign-in, sign-up); signed-in users go to their projects. */
export const signedOutGuard: CanActivateFn = () => {
  const router = inject(Router);
  return inject(SessionService)
    .load()
    .pipe(map((me) => (me ? router.createUrlTree(['/projects']) : true)));
};

/** Users whose current team grants `permission`; others go to /projects. */
export function permissionGuard(permission: string): CanActivateFn {
  return () => {
    const router = inject(Router);
    const session = inject(SessionService);
    return session.load().pipe(
      map((me) => {
        if (!me) return router.createUrlTree(['/sign-in']);
        return session.can(permission) ? true : router.createUrlTree(['/projects']);
      }),
    );
  };
}
