import { HttpClient, HttpContext, HttpErrorResponse } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { Observable, catchError, map, of, shareReplay, tap, throwError } from 'rxjs';
import { Me, SignUpAnswer, SignUpRequest, TeamRef } from './api-types';
import { CsrfService } from './csrf.service';
import { SKIP_AUTH_REDIRECT, SKIP_ERROR_SNACKBAR } from './http-context';

/**
 * Who is signed in, in which team, with which permissions.
 * `me` is null when signed out; `loaded` turns true after the first probe of GET /api/auth/me.
 * Permission checks here only hide actions: the server decides.
 */
@Injectable({ providedIn: 'root' })
export class SessionService {
  private readonly http = inject(HttpClient);
  private readonly csrf = inject(CsrfService);
  private readonly state = signal<Me | null>(null);
  private readonly loadedState = signal(false);
  private probe: Observable<Me | null> | null = null;

  readonly me = this.state.asReadonly();
  readonly loaded = this.loadedState.asReadonly();
  readonly signedIn = computed(() => this.state() !== null);
  readonly currentTeam = computed<TeamRef | null>(() => {
    const me = this.state();
    return me?.teams.find((t) => t.id === me.currentTeamId) ?? null;
  });

  /** Ask the server who we are (once; later calls reuse the answer). Emits null when signed out. */
  load(): Observable<Me | null> {
    if (this.loadedState()) return of(this.state());
    this.probe ??= this.http.get<Me>('/api/auth/me', { context: new HttpContext().set(SKIP_AUTH_REDIRECT, true).set(SKIP_ERROR_SNACKBAR, [401]) }).pipe(
      catchError((err: unknown) => (err instanceof HttpErrorResponse && err.status === 401 ? of(null) : throwError(() => err))),
      tap((me) => this.set(me)),
      shareReplay({ bufferSize: 1, refCount: false }),
    );
    return this.probe.pipe(
      catchError(() => {
        this.probe = null;
        return of(null);
      }),
    );
  }

  /** Ask the server again (e.g. after changing one's own roles). */
  refresh(): Observable<Me | null> {
    this.loadedState.set(false);
    this.probe = null;
    return this.load();
  }

  /** Errors (401 bad credentials, 429 rate-limited) are left to the caller to show. */
  signIn(email: string, password: string): Observable<Me> {
    this.csrf.reset();
    return this.http.post<Me>('/api/auth/signin', { email, password }, { context: quiet() }).pipe(tap((me) => this.adopt(me)));
  }

  /**
   * Asks for an account: the server mails a link to finish it (or a note to the owner of an address
   * that already has one; the answer is the same either way). Field errors are left to the caller.
   */
  signUp(request: SignUpRequest): Observable<SignUpAnswer> {
    return this.http.post<SignUpAnswer>('/api/auth/signup', request, { context: quiet() });
  }

  /** Finishes from the mailed link with the password chosen there: creates the user and a team of which they are admin, and signs in. */
  confirmSignUp(token: string, password: string): Observable<Me> {
    this.csrf.reset();
    return this.http.post<Me>('/api/auth/signup/confirm', { token, password }, { context: quiet() }).pipe(tap((me) => this.adopt(me)));
  }

  signOut(): Observable<void> {
    // Already signed out on the server (401) is fine: no redirect, no message.
    return this.http.post<void>('/api/auth/signout', {}, { context: new HttpContext().set(SKIP_AUTH_REDIRECT, true) }).pipe(
      catchError((err: unknown) => (err instanceof HttpErrorResponse && err.status === 401 ? of(undefined) : throwError(() => err))),
      map(() => undefined),
      tap(() => {
        this.csrf.reset();
        this.set(null);
      }),
    );
  }

  switchTeam(teamId: string): Observable<Me> {
    return this.http.post<Me>('/api/auth/current-team', { teamId }).pipe(tap((me) => this.adopt(me)));
  }

  /** Take a `Me` the server returned from elsewhere (e.g. accepting an invitation). */
  adopt(me: Me): void {
    this.csrf.reset();
    this.set(me);
  }

  /** Forget the session locally (the server said 401). */
  clear(): void {
    this.csrf.reset();
    this.set(null);
  }

  can(permission: string): boolean {
    return this.state()?.permissions.includes(permission) ?? false;
  }

  private set(me: Me | null): void {
    this.state.set(me);
    this.loadedState.set(true);
    this.probe = null;
  }
}

function quiet(): HttpContext {
  return new HttpContext().set(SKIP_AUTH_REDIRECT, true).set(SKIP_ERROR_SNACKBAR, true);
}
