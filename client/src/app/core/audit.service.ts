import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import { AuditEntry } from './api-types';

/** Admin view of the team's audit log (latest 200 entries). */
@Injectable({ providedIn: 'root' })
export class AuditService {
  private readonly http = inject(HttpClient);

  entries(): Observable<AuditEntry[]> {
    return this.http.get<AuditEntry[]>('/api/team/audit');
  }
}
