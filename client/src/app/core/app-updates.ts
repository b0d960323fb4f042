/**
 * The service worker (only in production builds, and only on a browser that has opened Walk mode:
 * see screens/walk/README.md) and what happens when a new version is deployed: the worker fetches
 * it in the background and a snack bar offers to reload into it.
 */
import { Injectable, inject, isDevMode, type EnvironmentProviders } from '@angular/core';
import { MatSnackBar } from '@angular/material/snack-bar';
import { SwUpdate, provideServiceWorker } from '@angular/service-worker';

export const OFFLINE_FLAG = 'runnel.offline';

/** True once Walk mode has asked for the app to be kept offline on this browser. */
export function offlineWanted(): boolean {
  try {
    return typeof localStorage !== 'undefined' && localStorage.getItem(OFFLINE_FLAG) === 'on';
  } catch {
    return false;
  }
}

export function provideRunnelServiceWorker(): EnvironmentProviders {
  // registerWhenStable: the worker installs after the first screen settles (or 30 s), never in its way.
  return provideServiceWorker('ngsw-worker.js', { enabled: !isDevMode() && offlineWanted(), registrationStrategy: 'registerWhenStable:30000' });
}

@Injectable({ providedIn: 'root' })
export class AppUpdates {
  private readonly updates = inject(SwUpdate);
  private readonly snack = inject(MatSnackBar);

  /** Called once by the app frame. */
  watch(): void {
    if (!this.updates.isEnabled) return;
    this.updates.versionUpdates.subscribe((event) => {
      if (event.type !== 'VERSION_READY') return;
      this.snack
        .open('A new version of Runnel is ready.', 'Reload', { duration: 0 })
        .onAction()
        .subscribe(() => document.location.reload());
    });
    this.updates.unrecoverable.subscribe(() => {
      this.snack
        .open('Runnel was updated and this page is out of date.', 'Reload', { duration: 0 })
        .onAction()
        .subscribe(() => document.location.reload());
    });
  }
}
