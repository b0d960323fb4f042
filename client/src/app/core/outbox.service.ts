import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import { OutboxMail } from './api-types';

/** Admin view of the mail the server sent, as captured by the dev/test SMTP sink. */
@Injectable({ providedIn: 'root' })
export class OutboxService {
  private readonly http = inject(HttpClient);

  mails(): Observable<OutboxMail[]> {
    return this.http.get<OutboxMail[]>('/api/team/outbox');
  }
}
