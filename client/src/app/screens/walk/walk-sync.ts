/**
 * Sends a walk to the server when there is signal: photos first (each PUT under its own id), then
 * the whole recording (PUT …/walks/:walkId). Both are idempotent on the server, so a sync cut off
 * half-way is simply sent again; only rows the server acknowledged are marked synced.
 */
import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { apiErrorBody } from '../../core/api-errors';
import { handleErrorsLocally } from '../../core/http-context';
import { WalkDb } from './walk-db';
import type { Walk, WalkRecording } from './walk-types';

export interface SyncResult {
  added: number;
  points: number;
  track: number;
  filename: string;
}

/** The request never reached the server (no signal; or the service worker answered 504 for it). */
export function noSignal(e: unknown): boolean {
  return e instanceof HttpErrorResponse && (e.status === 0 || (e.status === 504 && !apiErrorBody(e)));
}

@Injectable({ providedIn: 'root' })
export class WalkSync {
  private readonly http = inject(HttpClient);
  private readonly db = inject(WalkDb);

  /** A sync under way per walk: the Walk screen and the app-wide sync share it instead of sending twice. */
  private readonly inFlight = new Map<string, Promise<SyncResult>>();

  private base(projectId: string, walkId: string): string {
    return `/api/projects/${encodeURIComponent(projectId)}/walks/${encodeURIComponent(walkId)}`;
  }

  sync(walk: Walk): Promise<SyncResult> {
    let running = this.inFlight.get(walk.id);
    if (!running) {
      running = this.send(walk).finally(() => this.inFlight.delete(walk.id));
      this.inFlight.set(walk.id, running);
    }
    return running;
  }

  private async send(walk: Walk): Promise<SyncResult> {
    const base = this.base(walk.projectId, walk.id);
    for (const photo of await this.db.unsyncedPhotos(walk.id)) {
      const form = new FormData();
      form.append('file', photo.blob, photo.filename);
      await firstValueFrom(this.http.put(`${base}/photos/${photo.id}`, form, { context: handleErrorsLocally() }));
      await this.db.markPhotoSynced(photo.id);
    }
    const points = await this.db.points(walk.id);
    const track = await this.db.track(walk.id);
    const body = {
      name: walk.name,
      points: points.map(({ walkId: _w, synced: _s, ...p }) => p),
      track: track.map(({ walkId: _w, synced: _s, ...t }) => t),
    };
    const res = await firstValueFrom(this.http.put<SyncResult>(base, body, { context: handleErrorsLocally() }));
    await this.db.markSynced(
      points.map((p) => p.id),
      track.map((t) => t.id),
    );
    return res;
  }

  /** The walk as the server holds it (every phone's sync of this walk id). */
  fetch(projectId: string, walkId: string): Promise<WalkRecording> {
    return firstValueFrom(this.http.get<WalkRecording>(this.base(projectId, walkId), { context: handleErrorsLocally() }));
  }
}
