import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { DesignSummary, NetworkDocument, SizingResult } from '../../../../engine';

/** An option as the list returns it, with its comparison figures (server/API.md "Options of a project"). */
export interface OptionRow {
  id: string;
  name: string;
  notes: string;
  baseVersion: number;
  createdAt: string;
  createdBy: string | null;
  updatedAt: string;
  preferred: boolean;
  preferredAt: string | null;
  preferredBy: string | null;
  promotedVersion: number | null;
  sizing: SizingReport | null;
  summary: DesignSummary | null;
  differences: { pipes: string[]; nodes: string[] };
}

export type SizingReport = Omit<SizingResult, 'document'> & { at: string; request: SizeRequest };
export interface SizeRequest {
  pipes?: string[];
  minPressure_m?: number;
  sameSeries?: boolean;
}
/** `currency`: the code the team's prices and the project's estimate are kept in (Takeoff settings). */
export interface OptionList {
  currency: string;
  current: { version: number; summary: DesignSummary | null };
  options: OptionRow[];
}
export interface OptionDetail {
  id: string;
  name: string;
  notes: string;
  baseVersion: number;
  document: NetworkDocument;
  sizing: SizingReport | null;
  preferred: boolean;
}

/** Options of a project: list with comparison, create, edit, size, promote, prefer, delete. */
@Injectable({ providedIn: 'root' })
export class OptionsService {
  private readonly http = inject(HttpClient);
  private base(projectId: string): string {
    return `/api/projects/${projectId}/options`;
  }

  list(projectId: string): Observable<OptionList> {
    return this.http.get<OptionList>(this.base(projectId));
  }
  get(projectId: string, id: string): Observable<OptionDetail> {
    return this.http.get<OptionDetail>(`${this.base(projectId)}/${id}`);
  }
  create(projectId: string, name: string, notes = ''): Observable<{ id: string }> {
    return this.http.post<{ id: string }>(this.base(projectId), { name, notes });
  }
  edit(
    projectId: string,
    id: string,
    body: {
      name?: string;
      notes?: string;
      pipes?: { id: string; series: string; nominal: string }[];
      tanks?: { id: string; elevation_m: number }[];
      countedMinorLoss?: boolean;
    },
  ): Observable<unknown> {
    return this.http.patch(`${this.base(projectId)}/${id}`, body);
  }
  size(projectId: string, id: string, body: SizeRequest): Observable<SizingReport> {
    return this.http.post<SizingReport>(`${this.base(projectId)}/${id}/size`, body);
  }
  promote(projectId: string, id: string): Observable<{ version: number }> {
    return this.http.post<{ version: number }>(`${this.base(projectId)}/${id}/promote`, {});
  }
  prefer(projectId: string, id: string): Observable<unknown> {
    return this.http.post(`${this.base(projectId)}/${id}/prefer`, {});
  }
  remove(projectId: string, id: string): Observable<unknown> {
    return this.http.delete(`${this.base(projectId)}/${id}`);
  }
  network(projectId: string): Observable<{ version: number; document: NetworkDocument }> {
    return this.http.get<{ version: number; document: NetworkDocument }>(`/api/projects/${projectId}/network`);
  }
}
