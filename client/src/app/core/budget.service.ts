import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import type { BudgetDocument } from '../../../../engine/budget';
import type { SaveBudgetResult, StoredBudget, StoredNetwork } from '../../../../shared/network-api';
import { handleErrorsLocally } from './http-context';

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
