import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, catchError, of } from 'rxjs';
import type { NewComment, ReviewComment, ReviewThread } from '../../../../../shared/review-api';
import type { StoredVersion, VersionComparison, VersionStatus, VersionSummary } from '../../../../../shared/versions-api';
import { handleErrorsLocally } from '../../core/http-context';

/** Wire types kept once in shared/ (the server's stores answer these shapes). */
export type { NewComment, ReviewComment, ReviewThread, StoredVersion, VersionComparison, VersionStatus, VersionSummary };

/** The review's HTTP calls (server/API.md "Versions" and "Review sign-off and comments"). */
@Injectable({ providedIn: 'root' })
export class ReviewApi {
  private readonly http = inject(HttpClient);
  private url(projectId: string, rest: string): string {
    return `/api/projects/${encodeURIComponent(projectId)}${rest}`;
  }

  versions(projectId: string): Observable<{ versions: VersionSummary[] }> {
    return this.http.get<{ versions: VersionSummary[] }>(this.url(projectId, '/versions'));
  }
  version(projectId: string, version: number): Observable<StoredVersion> {
    return this.http.get<StoredVersion>(this.url(projectId, `/versions/${version}`));
  }
  compare(projectId: string, from: number, to: number): Observable<VersionComparison> {
    return this.http.get<VersionComparison>(this.url(projectId, `/versions/${from}/compare/${to}`));
  }
  restore(projectId: string, version: number, current: number): Observable<{ version: number }> {
    return this.http.post<{ version: number }>(this.url(projectId, `/versions/${version}/restore`), { version: current });
  }
  transition(
    projectId: string,
    version: number,
    action: 'submit' | 'approve' | 'return',
    note: string,
  ): Observable<{ version: number; status: VersionStatus }> {
    return this.http.post<{ version: number; status: VersionStatus }>(this.url(projectId, `/versions/${version}/${action}`), note ? { note } : {});
  }
  threads(projectId: string): Observable<{ threads: ReviewThread[] }> {
    return this.http.get<{ threads: ReviewThread[] }>(this.url(projectId, '/comments'));
  }
  comment(projectId: string, c: NewComment): Observable<ReviewComment> {
    return this.http.post<ReviewComment>(this.url(projectId, '/comments'), c);
  }
  resolve(projectId: string, commentId: string, resolved: boolean): Observable<ReviewThread> {
    return this.http.patch<ReviewThread>(this.url(projectId, `/comments/${commentId}`), { resolved });
  }
  /** The project's water budget document, or null when none is saved or the call fails (the review then estimates from flows). */
  budget(projectId: string): Observable<{ version: number; document: unknown } | null> {
    return this.http
      .get<{ version: number; document: unknown }>(this.url(projectId, '/budget'), { context: handleErrorsLocally() })
      .pipe(catchError(() => of(null)));
  }
}
