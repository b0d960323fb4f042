import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { DesignSummary, Estimate, OtherItem, Takeoff } from '../../../../engine';
import type { PriceItem } from '../../../../shared/prices-api';

export interface TakeoffSettingsBody {
  waste_fraction: number;
  bendAngle_deg: number;
  other: OtherItem[];
  labour_hours: number;
  labour_rate: number;
  markup_fraction: number;
  tax_fraction: number;
  currency: string;
}

export interface Acceptance {
  id: string;
  networkVersion: number;
  optionId: string | null;
  design: string;
  total: number;
  currency: string;
  acceptedAt: string;
  acceptedBy: string | null;
}

export interface TakeoffView {
  design: { kind: 'current' | 'option'; optionId: string | null; name: string; version: number };
  takeoff: Takeoff;
  estimate: Estimate;
  summary: DesignSummary;
  settings: TakeoffSettingsBody;
  acceptances: Acceptance[];
  cautions: string[];
  note: string;
}

export type { PriceItem };

/** Takeoff, estimate, settings, acceptance and exports of a project; the team's price list. */
@Injectable({ providedIn: 'root' })
export class TakeoffService {
  private readonly http = inject(HttpClient);
  private query(option: string | null): string {
    return option ? `?option=${encodeURIComponent(option)}` : '';
  }

  takeoff(projectId: string, option: string | null): Observable<TakeoffView> {
    return this.http.get<TakeoffView>(`/api/projects/${projectId}/takeoff${this.query(option)}`);
  }
  saveSettings(projectId: string, body: TakeoffSettingsBody): Observable<TakeoffSettingsBody> {
    return this.http.put<TakeoffSettingsBody>(`/api/projects/${projectId}/takeoff/settings`, body);
  }
  accept(projectId: string, option: string | null, total: number): Observable<unknown> {
    return this.http.post(`/api/projects/${projectId}/estimate/accept`, { option, total });
  }
  workbookUrl(projectId: string, option: string | null): string {
    return `/api/projects/${projectId}/export.xlsx${this.query(option)}`;
  }
  csvUrl(projectId: string, option: string | null): string {
    return `/api/projects/${projectId}/takeoff.csv${this.query(option)}`;
  }

  prices(): Observable<PriceItem[]> {
    return this.http.get<PriceItem[]>('/api/prices');
  }
  setPrice(id: string, price: number | null): Observable<PriceItem> {
    return this.http.patch<PriceItem>(`/api/prices/${id}`, { price });
  }
  addPrice(body: { code: string; description: string; unit: string; price: number | null }): Observable<PriceItem> {
    return this.http.post<PriceItem>('/api/prices', body);
  }
  importPrices(file: File): Observable<{ imported: number; created: number; updated: number }> {
    const form = new FormData();
    form.append('file', file, file.name);
    return this.http.post<{ imported: number; created: number; updated: number }>('/api/prices/import', form);
  }
}
