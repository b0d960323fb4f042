import { HttpClient, HttpErrorResponse } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, catchError, firstValueFrom, map, of, throwError } from 'rxjs';
import type { NetworkDocument } from '../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../engine/index';
import { apiErrorBody, apiErrorMessage } from '../../core/api-errors';
import type { Project } from '../../core/api-types';
import { handleErrorsLocally } from '../../core/http-context';
import type { PutOutcome, ServerCopy } from './editor/save-controller';
import type { SurveyParse } from '../../../../../engine/survey-point';

export interface NetworkRecord {
  version: number;
  document: NetworkDocument;
  results: SteadyResult | null;
  updatedAt: string | null;
  updatedBy: string | null;
}
export interface FileRecord {
  id: string;
  kind: string;
  filename: string;
  mime: string;
  size: number;
  createdAt: string;
}

/** A failed upload or parse, in words for the user (413/415 messages come from the server). */
export class LayoutApiError extends Error {
  constructor(
    message: string,
    readonly status: number,
    readonly line?: number,
  ) {
    super(message);
  }
}

/**
 * The Layout screen's HTTP calls (server/API.md). The shell's interceptor adds the CSRF header;
 * calls whose errors this screen shows itself opt out of the global error snack bar.
 */
@Injectable({ providedIn: 'root' })
export class LayoutApi {
  private readonly http = inject(HttpClient);

  project(id: string): Observable<Project> {
    return this.http.get<Project>(`/api/projects/${encodeURIComponent(id)}`);
  }

  /** `quiet`: a background check — failures are the caller's (no error snack bar). */
  network(id: string, quiet = false): Observable<NetworkRecord> {
    return this.http.get<NetworkRecord>(`/api/projects/${encodeURIComponent(id)}/network`, quiet ? { context: handleErrorsLocally() } : {});
  }

  /** PUT the document; 409, network failures and 400s become outcomes instead of snack bars. */
  saveNetwork(id: string, version: number, document: NetworkDocument): Promise<PutOutcome> {
    return firstValueFrom(
      this.http
        .put<{ version: number }>(
          `/api/projects/${encodeURIComponent(id)}/network`,
          { version, document },
          {
            context: handleErrorsLocally(0, 400, 409, 500, 502, 503, 504),
          },
        )
        .pipe(
          map((r): PutOutcome => ({ kind: 'saved', version: r.version })),
          catchError((err: unknown) => {
            if (err instanceof HttpErrorResponse) {
              if (err.status === 409) {
                const current = (err.error as { current?: ServerCopy } | null)?.current;
                if (current) return of<PutOutcome>({ kind: 'conflict', current });
              }
              if (err.status === 0 || err.status >= 500) return of<PutOutcome>({ kind: 'offline' });
              return of<PutOutcome>({ kind: 'rejected', message: apiErrorMessage(err) });
            }
            return throwError(() => err);
          }),
        ),
    );
  }

  uploadBackdrop(id: string, file: File): Observable<FileRecord> {
    const form = new FormData();
    form.append('kind', 'backdrop');
    form.append('file', file);
    return this.http
      .post<FileRecord>(`/api/projects/${encodeURIComponent(id)}/files`, form, { context: handleErrorsLocally(400, 413, 415) })
      .pipe(catchError((err: unknown) => throwError(() => toLayoutError(err))));
  }

  fileUrl(projectId: string, fileId: string): string {
    return `/api/projects/${encodeURIComponent(projectId)}/files/${encodeURIComponent(fileId)}`;
  }

  parseSurvey(id: string, file: File): Observable<SurveyParse> {
    const form = new FormData();
    form.append('file', file);
    return this.http
      .post<SurveyParse>(`/api/projects/${encodeURIComponent(id)}/survey/parse`, form, {
        context: handleErrorsLocally(400, 413, 415),
      })
      .pipe(catchError((err: unknown) => throwError(() => toLayoutError(err))));
  }
}

function toLayoutError(err: unknown): LayoutApiError {
  const body = apiErrorBody(err);
  const status = err instanceof HttpErrorResponse ? err.status : 0;
  return new LayoutApiError(apiErrorMessage(err), status, body?.line);
}
