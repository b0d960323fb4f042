import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { BudgetDocument, BudgetPlan, LayoutDifference } from '../../../../engine/budget';
import type { NetworkDocument, SteadyResult } from '../../../../engine/index';
import { handleErrorsLocally } from './http-context';

/** GET /api/projects/:id/budget (server/API.md "Water budget of a project"). */
export interface StoredBudget {
  version: number;
  document: BudgetDocument;
  updatedAt: string | null;
  updatedBy: string | null;
  plan: BudgetPlan | null;
  networkVersion: number;
  /** Budget-driven outlets whose Layout flow differs from the budget's, left as typed. */
  held: LayoutDifference[];
}

export interface SaveBudgetResult {
  version: number;
  updatedAt: string;
  plan: BudgetPlan | null;
  network: { version: number; results: SteadyResult | null } | null;
  networkVersion: number;
  /** Outlets whose Layout-edited flow the save kept (not named in apply_outlets). */
  held: LayoutDifference[];
}

/** GET /api/projects/:id/network. */
export interface StoredNetwork {
  version: number;
  document: NetworkDocument;
  results: SteadyResult | null;
  updatedAt: string | null;
  updatedBy: string | null;
}

const url = (projectId: string, what: 'budget' | 'network') => `/api/projects/${encodeURIComponent(projectId)}/${what}`;

/** A project's water budget and (read-only) its saved network, for the Budget, Timeline and Profile tabs. */
@Injectable({ providedIn: 'root' })
export class BudgetService {
  private readonly http = inject(HttpClient);

  get(projectId: string): Observable<StoredBudget> {
    return this.http.get<StoredBudget>(url(projectId, 'budget'));
  }

  /**
   * Save from `version`; `applyOutlets` names the outlets whose Layout-edited flow the designer chose
   * to replace with the budget's. A 409 (someone saved since) is left to the caller.
   */
  save(projectId: string, version: number, document: BudgetDocument, applyOutlets: string[] = []): Observable<SaveBudgetResult> {
    const body = applyOutlets.length ? { version, document, apply_outlets: applyOutlets } : { version, document };
    return this.http.put<SaveBudgetResult>(url(projectId, 'budget'), body, { context: handleErrorsLocally(409) });
  }

  network(projectId: string): Observable<StoredNetwork> {
    return this.http.get<StoredNetwork>(url(projectId, 'network'));
  }
}
