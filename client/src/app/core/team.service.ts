import { HttpClient, HttpContext } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable, map } from 'rxjs';
import { Invitation, InvitationPreview, Me, Member, Role, Team } from './api-types';
import { SKIP_AUTH_REDIRECT, SKIP_ERROR_SNACKBAR } from './http-context';

/** The current team: members, roles and invitations (server/API.md, "Team"). */
@Injectable({ providedIn: 'root' })
export class TeamService {
  private readonly http = inject(HttpClient);

  team(): Observable<Team> {
    return this.http.get<Team>('/api/team');
  }

  members(): Observable<Member[]> {
    return this.http.get<Member[]>('/api/team/members');
  }

  /** 409 when it would leave the team without an admin (shown by the interceptor). */
  setRoles(userId: string, roles: Role[]): Observable<Member> {
    return this.http.patch<Member>(`/api/team/members/${encodeURIComponent(userId)}`, { roles });
  }

  removeMember(userId: string): Observable<void> {
    return this.http.delete<void>(`/api/team/members/${encodeURIComponent(userId)}`).pipe(map(() => undefined));
  }

  invitations(): Observable<Invitation[]> {
    return this.http.get<Invitation[]>('/api/team/invitations');
  }

  /** 409 (already a member, or an open invitation) is left to the caller, which shows it on the e-mail field. */
  invite(email: string, roles: Role[], anyAccount = false): Observable<Invitation> {
    return this.http.post<Invitation>(
      '/api/team/invitations',
      { email, roles, anyAccount },
      {
        context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [409]),
      },
    );
  }

  /** The link stops working. */
  revokeInvitation(id: string): Observable<void> {
    return this.http.delete<void>(`/api/team/invitations/${encodeURIComponent(id)}`).pipe(map(() => undefined));
  }

  /** Mails a fresh link; the earlier one stops working. */
  resendInvitation(id: string): Observable<Invitation> {
    return this.http.post<Invitation>(`/api/team/invitations/${encodeURIComponent(id)}/resend`, {});
  }

  /** Public: what an invitation link offers. Errors (404 for an unknown link) are left to the caller. */
  previewInvitation(token: string): Observable<InvitationPreview> {
    return this.http.get<InvitationPreview>(`/api/invitations/${encodeURIComponent(token)}`, {
      context: new HttpContext().set(SKIP_ERROR_SNACKBAR, [404]),
    });
  }

  /** `account` is required for a new user and omitted when already signed in. */
  acceptInvitation(token: string, account?: { name: string; password: string }): Observable<Me> {
    return this.http.post<Me>(`/api/invitations/${encodeURIComponent(token)}/accept`, account ?? {}, {
      context: new HttpContext().set(SKIP_AUTH_REDIRECT, true).set(SKIP_ERROR_SNACKBAR, [400, 401, 403, 409]),
    });
  }
}
