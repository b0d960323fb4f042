import { HttpBackend, HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, defer, finalize, map, of, shareReplay, tap } from 'rxjs';

/**
 * Holds the CSRF token the server binds to the session cookie (GET /api/csrf).
 * Uses a bare HttpClient over HttpBackend so fetching the token never passes through the
 * interceptor that needs it.
 */
@Injectable({ providedIn: 'root' })
export class CsrfService {
  private readonly http = new HttpClient(inject(HttpBackend));
  private current: string | null = null;
  private pending: Observable<string> | null = null;

  /** The token, fetched once and then reused until `reset()`. */
  token(): Observable<string> {
    if (this.current) return of(this.current);
    this.pending ??= defer(() => this.http.get<{ token: string }>('/api/csrf', { withCredentials: true })).pipe(
      map((body) => body.token),
      tap((token) => (this.current = token)),
      finalize(() => (this.pending = null)),
      shareReplay({ bufferSize: 1, refCount: false }),
    );
    return this.pending;
  }

  /** Forget the token; call when the session changes (sign-in, sign-out, team switch). */
  reset(): void {
    this.current = null;
    this.pending = null;
  }
}
