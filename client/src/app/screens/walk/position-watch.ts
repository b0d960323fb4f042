/**
 * The phone's position as a signal (Geolocation API watchPosition, high accuracy), for as long as
 * the Walk screen is open. Errors become a sentence; the last good fix is kept.
 */
import { DestroyRef, Injectable, inject, signal } from '@angular/core';
import type { Fix } from './walk-types';

@Injectable()
export class PositionWatch {
  private readonly fixState = signal<Fix | null>(null);
  private readonly problemState = signal<string | null>(null);
  readonly fix = this.fixState.asReadonly();
  readonly problem = this.problemState.asReadonly();

  constructor() {
    if (typeof navigator === 'undefined' || !navigator.geolocation) {
      this.problemState.set('This browser cannot tell where you are (no Geolocation). Points need a fix.');
      return;
    }
    const id = navigator.geolocation.watchPosition(
      (pos) => {
        this.problemState.set(null);
        this.fixState.set({
          lat: pos.coords.latitude,
          lon: pos.coords.longitude,
          accuracy_m: pos.coords.accuracy,
          altitude_m: pos.coords.altitude ?? null,
          timestamp: pos.timestamp,
        });
      },
      (err) =>
        this.problemState.set(
          err.code === err.PERMISSION_DENIED
            ? 'Location is blocked for Runnel: allow it in the browser settings to record points.'
            : err.code === err.TIMEOUT
              ? 'Still looking for a position fix…'
              : 'The phone cannot find its position right now.',
        ),
      { enableHighAccuracy: true, maximumAge: 0, timeout: 30000 },
    );
    inject(DestroyRef).onDestroy(() => navigator.geolocation.clearWatch(id));
  }
}
