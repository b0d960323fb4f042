/**
 * Walk: the phone recorder used on site (README.md in this folder). Everything recorded goes to
 * IndexedDB first (walk-db.ts) and reaches the server when there is signal (walk-sync.ts).
 */
import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Component, DestroyRef, computed, effect, inject, input, isDevMode, signal, untracked } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { NetworkDocument } from '../../../../../engine/network-document';
import { formatQuantity, fromDisplay, toDisplay, unitLabel } from '../../../../../engine/units';
import { apiErrorMessage } from '../../core/api-errors';
import { OFFLINE_FLAG } from '../../core/app-updates';
import { handleErrorsLocally } from '../../core/http-context';
import { ProjectContext } from '../../core/project-context';
import { SessionService } from '../../core/session.service';
import { QuantityPipe } from '../../shared/quantity.pipe';
import { PhotoError, compressPhoto } from './photo';
import { checkPoint } from './point-check';
import { PositionWatch } from './position-watch';
import { type BuildSummary, buildFromWalk } from './walk-to-network';
import { WalkDb } from './walk-db';
import { noSignal, WalkSync } from './walk-sync';
import { POINT_KINDS, type PointKind, type TrackPoint, type Walk, type WalkPhoto, type WalkPoint } from './walk-types';
import { countOf, CountPipe } from '../../shared/count';

/** No answer from Runnel itself: offline, or the service worker's 504 when the network failed under it. */
/** Accuracy limits offered, metres (a phone in the open manages 3–5 m; under trees 10–30 m). */
const LIMITS_M = [5, 10, 20, 50];
const INTERVALS_S = [2, 5, 10, 30];
// OFFLINE_FLAG: the app frame's service worker provider reads it on the next start.

@Component({
  selector: 'rn-walk-screen',
  imports: [FormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatInputModule, MatIconModule, MatSlideToggleModule, QuantityPipe, CountPipe],
  providers: [PositionWatch],
  templateUrl: './walk-screen.html',
  styleUrl: './walk-screen.scss',
})
export class WalkScreen {
  private readonly db = inject(WalkDb);
  private readonly syncer = inject(WalkSync);
  private readonly http = inject(HttpClient);
  private readonly session = inject(SessionService);
  protected readonly context = inject(ProjectContext);
  protected readonly position = inject(PositionWatch);

  readonly projectId = input.required<string>();

  protected readonly kinds = POINT_KINDS;
  protected readonly limits = LIMITS_M;
  protected readonly intervals = INTERVALS_S;
  protected readonly units = this.context.units;
  protected readonly canRecord = computed(() => !!this.session.me() && this.session.can('files.write'));
  protected readonly canBuild = computed(() => !!this.session.me() && this.session.can('network.write'));

  protected readonly online = signal(typeof navigator === 'undefined' ? true : navigator.onLine);
  protected readonly walks = signal<Walk[]>([]);
  protected readonly walk = signal<Walk | null>(null);
  protected readonly points = signal<WalkPoint[]>([]);
  protected readonly track = signal<TrackPoint[]>([]);
  protected readonly waiting = signal({ points: 0, track: 0, photos: 0 });
  protected readonly syncing = signal(false);
  protected readonly syncStatus = signal<string | null>(null);
  protected readonly building = signal(false);
  protected readonly built = signal<BuildSummary | null>(null);
  protected readonly buildError = signal<string | null>(null);
  protected readonly photoUrls = signal<Record<string, string>>({});
  /** Retry after a failed sync: 3 s, doubling to 60 s, while the screen is open. */
  private retryDelay_s = 3;
  private retryTimer: ReturnType<typeof setTimeout> | null = null;

  // Settings and the point form (kept on a refusal: nothing typed is lost).
  protected readonly limit_m = signal(10);
  protected readonly interval_s = signal(5);
  protected readonly tracking = signal(false);
  protected walkName = '';
  protected label = '';
  protected kind: PointKind = 'tee';
  protected typedElevation: number | null = null;
  protected note = '';
  protected photo: File | null = null;
  protected readonly message = signal<{ text: string; overridable: boolean } | null>(null);
  protected readonly saved = signal<string | null>(null);

  protected readonly fixText = computed(() => {
    const f = this.position.fix();
    if (!f) return this.position.problem() ?? 'Looking for a position fix…';
    const acc = `±${formatQuantity('length', f.accuracy_m, this.units())}`;
    return f.accuracy_m > this.limit_m() ? `Poor fix ${acc}` : `Fix ${acc}`;
  });
  protected readonly poorFix = computed(() => {
    const f = this.position.fix();
    return !f || f.accuracy_m > this.limit_m();
  });
  protected readonly elevationUnit = computed(() => unitLabel('elevation', this.units()));

  constructor() {
    const destroyRef = inject(DestroyRef);
    const onOnline = () => {
      this.online.set(true);
      void this.syncNow();
    };
    const onOffline = () => this.online.set(false);
    window.addEventListener('online', onOnline);
    window.addEventListener('offline', onOffline);
    destroyRef.onDestroy(() => {
      window.removeEventListener('online', onOnline);
      window.removeEventListener('offline', onOffline);
      for (const url of Object.values(this.photoUrls())) URL.revokeObjectURL(url);
      if (this.retryTimer) clearTimeout(this.retryTimer);
    });
    this.keepAvailableOffline();

    effect(() => {
      const id = this.projectId();
      untracked(() => void this.loadWalks(id));
    });
    // The track: one fix every interval while the toggle is on (standing still adds nothing).
    effect((onCleanup) => {
      const walk = this.walk();
      if (!walk || !this.tracking()) return;
      const timer = setInterval(() => void this.recordTrackFix(walk), this.interval_s() * 1000);
      onCleanup(() => clearInterval(timer));
    });
  }

  /** Walk mode is the one place that needs the app offline: register the service worker here. */
  private keepAvailableOffline(): void {
    if (isDevMode() || typeof navigator === 'undefined' || !('serviceWorker' in navigator)) return;
    localStorage.setItem(OFFLINE_FLAG, 'on');
    navigator.serviceWorker.register('/ngsw-worker.js', { scope: '/' }).catch(() => undefined);
  }

  private async loadWalks(projectId: string): Promise<void> {
    const walks = await this.db.walksOf(projectId);
    this.walks.set(walks);
    if (!this.walk() && walks.length > 0) await this.open(walks[walks.length - 1]);
    if (this.online()) void this.syncNow();
  }

  protected async open(walk: Walk): Promise<void> {
    this.walk.set(walk);
    this.built.set(null);
    await this.refresh();
  }

  private async refresh(): Promise<void> {
    const walk = this.walk();
    if (!walk) return;
    const [points, track, waiting] = await Promise.all([this.db.points(walk.id), this.db.track(walk.id), this.db.waiting(walk.id)]);
    this.points.set(points);
    this.track.set(track);
    this.waiting.set(waiting);
    const urls = { ...this.photoUrls() };
    for (const p of points) {
      if (p.photo_id && !urls[p.photo_id]) {
        const photo = await this.db.photo(p.photo_id);
        if (photo) urls[p.photo_id] = URL.createObjectURL(photo.blob);
      }
    }
    this.photoUrls.set(urls);
  }

  protected async startWalk(): Promise<void> {
    const name = this.walkName.trim() || `Walk ${new Date().toLocaleDateString()}`;
    const walk: Walk = { id: crypto.randomUUID(), projectId: this.projectId(), name, startedAt: new Date().toISOString() };
    await this.db.addWalk(walk);
    this.walks.update((w) => [...w, walk]);
    this.walkName = '';
    await this.open(walk);
  }

  protected setTypedElevation(value: number | string | null): void {
    const n = value === null || String(value).trim() === '' ? NaN : Number(value);
    this.typedElevation = Number.isFinite(n) ? fromDisplay('elevation', n, this.units()) : null;
  }

  protected typedElevationShown(): string {
    return this.typedElevation === null ? '' : String(Math.round(toDisplay('elevation', this.typedElevation, this.units()) * 100) / 100);
  }

  protected pickPhoto(input: HTMLInputElement): void {
    this.photo = input.files?.[0] ?? null;
  }

  protected async recordPoint(anyway = false, photoInput?: HTMLInputElement): Promise<void> {
    const walk = this.walk();
    if (!walk) return;
    this.saved.set(null);
    const fix = this.position.fix();
    const check = checkPoint({ label: this.label, typedElevation_m: this.typedElevation }, fix, this.limit_m(), this.units(), anyway);
    if (!check.ok) {
      this.message.set({ text: check.message, overridable: check.overridable });
      return;
    }
    let photo: WalkPhoto | null = null;
    if (this.photo) {
      try {
        const blob = await compressPhoto(this.photo);
        photo = { id: crypto.randomUUID(), walkId: walk.id, blob, filename: `${this.label.trim().replace(/[^\w.-]+/g, '-')}.jpg`, synced: 0 };
      } catch (e) {
        this.message.set({ text: e instanceof PhotoError ? e.message : 'The photo could not be read. The point itself is kept.', overridable: false });
        return;
      }
    }
    const point: WalkPoint = {
      id: crypto.randomUUID(),
      walkId: walk.id,
      recordedAt: new Date().toISOString(),
      lat: fix!.lat,
      lon: fix!.lon,
      accuracy_m: fix!.accuracy_m,
      label: this.label.trim(),
      kind: this.kind,
      elevation_m: check.elevation_m,
      elevation_source: check.elevation_source,
      note: this.note.trim(),
      photo_id: photo?.id ?? null,
      poor_fix: check.poor_fix,
      synced: 0,
    };
    await this.db.addPoint(point, photo);
    this.message.set(null);
    this.saved.set(`Recorded ${point.label}${photo ? ' with its photo' : ''}.`);
    this.label = '';
    this.note = '';
    this.typedElevation = null;
    this.photo = null;
    if (photoInput) photoInput.value = '';
    await this.refresh();
    if (this.online()) void this.syncNow();
  }

  private async recordTrackFix(walk: Walk): Promise<void> {
    const fix = this.position.fix();
    if (!fix) return;
    const last = this.track().at(-1);
    if (last && Math.abs(last.lat - fix.lat) < 1e-6 && Math.abs(last.lon - fix.lon) < 1e-6) return;
    const t: TrackPoint = {
      id: crypto.randomUUID(),
      walkId: walk.id,
      recordedAt: new Date().toISOString(),
      lat: fix.lat,
      lon: fix.lon,
      accuracy_m: fix.accuracy_m,
      elevation_m: fix.altitude_m,
      synced: 0,
    };
    this.track.update((tr) => [...tr, t]);
    await this.db.addTrackPoint(t);
    this.waiting.update((w) => ({ ...w, track: w.track + 1 }));
  }

  protected async syncNow(): Promise<void> {
    const walk = this.walk();
    if (!walk || this.syncing() || !this.canRecord()) return;
    const waiting = await this.db.waiting(walk.id);
    // The background sync (core/walk-autosync) may have sent everything since this screen last read
    // its counts: show that rather than a stale "waiting to sync".
    if (waiting.points + waiting.track + waiting.photos === 0) return this.refresh();
    this.syncing.set(true);
    try {
      const res = await this.syncer.sync(walk);
      this.syncStatus.set(`Synced: ${countOf(res.points, 'point')} and ${countOf(res.track, 'track fix', 'track fixes')} in ${res.filename}.`);
      this.retryDelay_s = 3;
    } catch (e) {
      const offline = noSignal(e);
      this.syncStatus.set(
        offline
          ? 'No signal: everything stays on this phone and syncs when the network is back.'
          : `Not synced: ${apiErrorMessage(e)} Everything stays on this phone.`,
      );
      if (offline) this.retryLater();
    } finally {
      this.syncing.set(false);
      await this.refresh();
    }
  }

  /** Signal comes and goes on a hillside: try again with a growing pause (the online event alone is not enough). */
  private retryLater(): void {
    if (this.retryTimer) return;
    this.retryTimer = setTimeout(() => {
      this.retryTimer = null;
      if (this.online()) void this.syncNow();
    }, this.retryDelay_s * 1000);
    this.retryDelay_s = Math.min(60, this.retryDelay_s * 2);
  }

  protected async build(): Promise<void> {
    const walk = this.walk();
    if (!walk) return;
    this.building.set(true);
    this.buildError.set(null);
    this.built.set(null);
    try {
      await this.syncNow();
      const recording = await this.syncer.fetch(walk.projectId, walk.id);
      const url = `/api/projects/${encodeURIComponent(walk.projectId)}/network`;
      // One retry after a 409: the build is idempotent, so it is simply made again on the newer version.
      for (let attempt = 0; ; attempt++) {
        const current = await firstValueFrom(this.http.get<{ version: number; document: NetworkDocument }>(url, { context: handleErrorsLocally() }));
        const { doc, summary } = buildFromWalk(current.document, recording, walk.name, this.units());
        try {
          await firstValueFrom(this.http.put(url, { version: current.version, document: doc }, { context: handleErrorsLocally() }));
          this.built.set(summary);
          return;
        } catch (e) {
          if (!(e instanceof HttpErrorResponse && e.status === 409) || attempt > 0) throw e;
        }
      }
    } catch (e) {
      this.buildError.set(e instanceof HttpErrorResponse ? `Not built: ${apiErrorMessage(e)}` : `Not built: ${(e as Error).message}`);
    } finally {
      this.building.set(false);
    }
  }

  protected kindLabel(kind: PointKind): string {
    return POINT_KINDS.find((k) => k.value === kind)?.label ?? kind;
  }
}
