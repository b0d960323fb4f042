/**
 * Walks recorded out of signal reach the server when the signal returns, whichever screen is open
 * (not only the Walk screen): on the browser's `online` event, on signing in, and again with a
 * growing pause while the network only seems to be back. Only on a browser that has opened Walk
 * mode (offlineWanted, read each time); the walk code and its IndexedDB are loaded lazily then.
 */
import { Injectable, Injector, effect, inject, untracked } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import { offlineWanted } from './app-updates';
import { SessionService } from './session.service';

const FIRST_RETRY_S = 15;
const LAST_RETRY_S = 300;

@Injectable({ providedIn: 'root' })
export class WalkAutoSync {
  private readonly session = inject(SessionService);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly injector = inject(Injector);
  private running = false;
  private retryTimer: ReturnType<typeof setTimeout> | null = null;
  private retryDelay_s = FIRST_RETRY_S;

  /** Called once by the app frame. */
  watch(): void {
    if (typeof window === 'undefined') return;
    window.addEventListener('online', () => void this.run());
    effect(
      () => {
        if (this.session.signedIn()) untracked(() => void this.run());
      },
      { injector: this.injector },
    );
  }

  private async run(): Promise<void> {
    if (this.running || !offlineWanted() || !this.session.signedIn() || !navigator.onLine) return;
    this.running = true;
    try {
      const { syncPendingWalks } = await import('../screens/walk/pending-walks');
      const outcome = await syncPendingWalks(this.injector);
      // The Walk screen words its own sync; elsewhere a snack bar says what arrived.
      if (outcome.synced.length && !/\/walk(\?|$)/.test(this.router.url)) {
        const words = outcome.synced.map(({ walk, result }) => `"${walk.name}" (${result.points} points, ${result.track} track fixes)`);
        this.snack.open(`Walk synced: ${words.join(', ')}.`, 'OK', { duration: 6000 });
      }
      if (outcome.failed.some((f) => f.noSignal)) this.retryLater();
      else this.retryDelay_s = FIRST_RETRY_S;
    } catch {
      this.retryLater(); // the walk chunk itself could not load: no signal yet
    } finally {
      this.running = false;
    }
  }

  private retryLater(): void {
    if (this.retryTimer) return;
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null;
      void this.run();
    }, this.retryDelay_s * 1000);
    this.retryDelay_s = Math.min(LAST_RETRY_S, this.retryDelay_s * 2);
  }
}
