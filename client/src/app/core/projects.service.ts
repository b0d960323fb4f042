import { HttpClient, HttpContext, HttpParams } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import { Project, ProjectCreate, ProjectPatch } from './api-types';

const base = '/api/projects';

/** Projects of the current team (server/API.md, "Projects"). */
@Injectable({ providedIn: 'root' })
export class ProjectsService {
  private readonly http = inject(HttpClient);

  list(options: { archived?: boolean } = {}): Observable<Project[]> {
    const params = options.archived ? new HttpParams().set('archived', 'true') : undefined;
    return this.http.get<Project[]>(base, { params });
  }

  get(id: string, context?: HttpContext): Observable<Project> {
    return this.http.get<Project>(`${base}/${encodeURIComponent(id)}`, { context });
  }

  create(project: ProjectCreate): Observable<Project> {
    return this.http.post<Project>(base, project);
  }

  update(id: string, patch: ProjectPatch): Observable<Project> {
    return this.http.patch<Project>(`${base}/${encodeURIComponent(id)}`, patch);
  }

  archive(id: string, archived = true): Observable<Project> {
    return this.update(id, { archived });
  }

  delete(id: string): Observable<void> {
    return this.http.delete<void>(`${base}/${encodeURIComponent(id)}`).pipe(map(() => undefined));
  }
}
