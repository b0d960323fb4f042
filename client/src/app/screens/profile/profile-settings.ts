import { HttpClient } from '@angular/common/http';
import { Injectable, inject, signal } from '@angular/core';
import { Observable, of, tap } from 'rxjs';
import { handleErrorsLocally } from '../../core/http-context';

/** GET/PUT /api/projects/:id/profile-settings (server/API.md "Profile settings of a project"). */
export interface ProfileSettingsRecord {
  /** Default cover over pipes without their own, m; null: the engine's default. */
  cover_m: number | null;
  default_cover_m: number;
  updatedAt: string | null;
  updatedBy: string | null;
}

const url = (projectId: string) => `/api/projects/${encodeURIComponent(projectId)}/profile-settings`;

/**
 * A project's Profile settings, saved on the server and shared by the Profile tab and the Layout's
 * profile marks (both draw the pipe at the same cover). Loaded once per project on first read.
 */
@Injectable({ providedIn: 'root' })
export class ProfileSettings {
  private readonly http = inject(HttpClient);
  private readonly byProject = signal<ReadonlyMap<string, ProfileSettingsRecord>>(new Map());
  private readonly loading = new Set<string>();

  /** The saved settings (undefined until loaded; reading starts the load). */
  get(projectId: string): ProfileSettingsRecord | undefined {
    const found = this.byProject().get(projectId);
    if (!found && !this.loading.has(projectId)) {
      this.loading.add(projectId);
      // outside the reading effect or computed: a signal must not be written while it is read
      // quietly: the Layout reads this too, offline or not; without it the engine's default cover applies
      queueMicrotask(() =>
        this.http.get<ProfileSettingsRecord>(url(projectId), { context: handleErrorsLocally() }).subscribe({
          next: (r) => this.put(projectId, r),
          error: () => this.loading.delete(projectId),
        }),
      );
    }
    return found;
  }

  /** The saved settings, from the cache or the server: for work that must wait for them (the Review checklist). */
  load(projectId: string): Observable<ProfileSettingsRecord> {
    const found = this.byProject().get(projectId);
    return found
      ? of(found)
      : this.http.get<ProfileSettingsRecord>(url(projectId), { context: handleErrorsLocally() }).pipe(tap((r) => this.put(projectId, r)));
  }

  /** The cover for pipes without their own, m, or undefined for the engine's default. */
  cover(projectId: string): number | undefined {
    return this.get(projectId)?.cover_m ?? undefined;
  }

  /** Save the default cover (null: back to the engine's); a 400 is left to the caller. */
  saveCover(projectId: string, cover_m: number | null): Observable<ProfileSettingsRecord> {
    return this.http.put<ProfileSettingsRecord>(url(projectId), { cover_m }, { context: handleErrorsLocally(400) }).pipe(tap((r) => this.put(projectId, r)));
  }

  private put(projectId: string, r: ProfileSettingsRecord): void {
    this.byProject.update((m) => new Map(m).set(projectId, r));
  }
}
