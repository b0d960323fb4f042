import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { SurveyParse } from '../../../../../engine/survey-point';

/** One upload as GET /api/projects/:id/files lists it (server/API.md). */
export interface ProjectFile {
  id: string;
  kind: 'backdrop' | 'survey' | 'photo' | string;
  filename: string;
  mime: string;
  size: number;
  createdAt: string;
  /** The uploader's name, or null when their account is gone. */
  createdBy: string | null;
}

/** The project's files: list, rename, delete, a survey's points, and the download address. */
@Injectable({ providedIn: 'root' })
export class FilesApi {
  private readonly http = inject(HttpClient);

  private base(projectId: string): string {
    return `/api/projects/${encodeURIComponent(projectId)}/files`;
  }

  list(projectId: string): Observable<ProjectFile[]> {
    return this.http.get<ProjectFile[]>(this.base(projectId));
  }

  rename(projectId: string, fileId: string, filename: string): Observable<ProjectFile> {
    return this.http.patch<ProjectFile>(`${this.base(projectId)}/${encodeURIComponent(fileId)}`, { filename });
  }

  remove(projectId: string, fileId: string): Observable<unknown> {
    return this.http.delete(`${this.base(projectId)}/${encodeURIComponent(fileId)}`);
  }

  points(projectId: string, fileId: string): Observable<SurveyParse> {
    return this.http.get<SurveyParse>(`${this.base(projectId)}/${encodeURIComponent(fileId)}/points`);
  }

  /** The bytes (an image shows inline; anything else downloads). */
  url(projectId: string, fileId: string): string {
    return `${this.base(projectId)}/${encodeURIComponent(fileId)}`;
  }
}

/** What a file is, in the farm's words. */
export function kindWords(f: ProjectFile): string {
  if (f.kind === 'backdrop') return 'Site backdrop';
  if (f.kind === 'photo') return 'Walk photo';
  if (f.kind === 'survey') return f.mime === 'application/gpx+xml' ? 'Survey (GPX)' : 'Survey (CSV)';
  return 'File';
}

/** Whether the Files tab can show the file itself (checked images and surveys). */
export function previewKind(f: ProjectFile): 'image' | 'survey' | 'none' {
  if ((f.kind === 'backdrop' || f.kind === 'photo') && (f.mime === 'image/png' || f.mime === 'image/jpeg')) return 'image';
  if (f.kind === 'survey') return 'survey';
  return 'none';
}

/** 512 B, 14 KB, 2.3 MB: file sizes in binary steps (1 KB = 1024 B). */
export function sizeWords(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${Math.round(bytes / 1024)} KB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MB`;
}
