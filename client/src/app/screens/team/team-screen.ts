import { DatePipe } from '@angular/common';
import { HttpErrorResponse } from '@angular/common/http';
import { Component, computed, inject, signal, viewChild } from '@angular/core';
import { rxResource, toSignal } from '@angular/core/rxjs-interop';
import { FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router } from '@angular/router';
import { filter, map, switchMap } from 'rxjs';
import { apiErrorMessage } from '../../core/api-errors';
import { valueOr } from '../../core/resource-state';
import { Invitation, Member, ROLES, Role } from '../../core/api-types';
import { SessionService } from '../../core/session.service';
import { TeamService } from '../../core/team.service';
import { confirmAction } from '../../shared/confirm-dialog';

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  admin: 'manages the team, members and roles',
  designer: 'lays out and edits designs',
  reviewer: 'checks designs and approves or returns them',
  estimator: 'keeps prices, takeoffs and estimates',
  owner: 'views designs, compares options, comments',
};

/** Admin: members and their roles, invitations. */
@Component({
  selector: 'rn-team-screen',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    MatTableModule,
    MatSelectModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatCheckboxModule,
    MatIconModule,
    MatProgressBarModule,
    MatTooltipModule,
  ],
  templateUrl: './team-screen.html',
  styleUrl: './team-screen.scss',
})
export class TeamScreen {
  private readonly teamApi = inject(TeamService);
  protected readonly session = inject(SessionService);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  protected readonly roles = ROLES;
  protected readonly roleDescriptions = ROLE_DESCRIPTIONS;
  protected readonly memberColumns = ['name', 'email', 'roles', 'actions'];

  protected readonly members = rxResource({
    params: () => this.session.me()?.currentTeamId ?? undefined,
    stream: () => this.teamApi.members(),
  });
  protected readonly invitations = rxResource({
    params: () => this.session.me()?.currentTeamId ?? undefined,
    stream: () => this.teamApi.invitations(),
  });
  protected readonly memberRows = valueOr(this.members, []);
  private readonly allInvitations = valueOr(this.invitations, []);
  protected readonly pending = computed(() => this.allInvitations().filter((invitation) => !invitation.acceptedAt));
  /** Members whose role change is on its way to the server. */
  protected readonly saving = signal<ReadonlySet<string>>(new Set());

  /** No role is chosen in advance: the admin picks each one, so nothing is added unseen. */
  protected readonly inviteForm = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    roles: [[] as Role[], Validators.required],
    anyAccount: [false],
  });
  protected readonly inviting = signal(false);
  /** Invitations whose resend or revoke is on its way. */
  protected readonly invitationBusy = signal<ReadonlySet<string>>(new Set());
  /** resetForm() also clears the form's "submitted" state, which otherwise paints the emptied field red. */
  private readonly inviteFormDirective = viewChild.required(FormGroupDirective);
  private readonly typedEmail = toSignal(this.inviteForm.controls.email.valueChanges.pipe(map((value) => value.trim().toLowerCase())), { initialValue: '' });
  /** Said before sending: the address is already a member, or already has an open invitation. */
  protected readonly emailWarning = computed(() => {
    const email = this.typedEmail();
    if (!email) return null;
    const member = this.memberRows().find((m) => m.email.toLowerCase() === email);
    if (member) return `${member.name} is already a member (${member.roles.join(', ')}). Change their roles above instead.`;
    const open = this.pending().find((i) => i.email.toLowerCase() === email);
    if (open) return `${open.email} already has an open invitation below: resend it instead.`;
    return null;
  });

  protected isSelf(member: Member): boolean {
    return member.userId === this.session.me()?.user.id;
  }

  protected setRoles(member: Member, roles: Role[]): void {
    const sorted = ROLES.filter((role) => roles.includes(role));
    if (sorted.length === 0) {
      this.snackBar.open('A member needs at least one role. Remove the member instead.', 'Close', { duration: 5000 });
      this.members.reload();
      return;
    }
    if (sorted.join() === ROLES.filter((role) => member.roles.includes(role)).join()) return;
    this.mark(member.userId, true);
    this.teamApi.setRoles(member.userId, sorted).subscribe({
      next: (saved) => {
        this.mark(member.userId, false);
        this.members.update((list) => list?.map((m) => (m.userId === saved.userId ? saved : m)));
        this.snackBar.open(`${saved.name}: ${saved.roles.join(', ')}.`, undefined, { duration: 3000 });
        // One's own roles decide what the app shows: reload the session's permissions.
        if (this.isSelf(member)) {
          this.session.refresh().subscribe(() => {
            if (!this.session.can('team.manage')) void this.router.navigate(['/projects']);
          });
        }
      },
      error: () => {
        this.mark(member.userId, false);
        this.members.reload();
      },
    });
  }

  protected remove(member: Member): void {
    confirmAction(this.dialog, {
      title: 'Remove member?',
      message: `${member.name} (${member.email}) will lose access to this team’s projects. Their account stays.`,
      confirmLabel: 'Remove',
      destructive: true,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.teamApi.removeMember(member.userId)),
      )
      .subscribe(() => {
        this.members.update((list) => list?.filter((m) => m.userId !== member.userId));
        this.snackBar.open(`${member.name} removed from the team.`, undefined, { duration: 4000 });
      });
  }

  protected invite(): void {
    if (this.inviteForm.invalid || this.emailWarning()) {
      this.inviteForm.markAllAsTouched();
      return;
    }
    const { email, roles, anyAccount } = this.inviteForm.getRawValue();
    this.inviting.set(true);
    this.teamApi
      .invite(
        email.trim(),
        ROLES.filter((role) => roles.includes(role)),
        anyAccount,
      )
      .subscribe({
        next: (invitation: Invitation) => {
          this.inviting.set(false);
          this.invitations.update((list) => [invitation, ...(list ?? [])]);
          this.inviteFormDirective().resetForm({ email: '', roles: [], anyAccount: false });
          this.snackBar.open(`Invitation sent to ${invitation.email}.`, undefined, { duration: 4000 });
        },
        error: (err: unknown) => {
          this.inviting.set(false);
          // Already a member, or an open invitation: say it on the field, where the admin is looking.
          if (err instanceof HttpErrorResponse && err.status === 409) {
            this.inviteForm.controls.email.setErrors({ server: apiErrorMessage(err).split('\n')[0] });
            this.inviteForm.controls.email.markAsTouched();
            this.members.reload();
            this.invitations.reload();
          }
        },
      });
  }

  protected resend(invitation: Invitation): void {
    this.markInvitation(invitation.id, true);
    this.teamApi.resendInvitation(invitation.id).subscribe({
      next: (renewed) => {
        this.markInvitation(invitation.id, false);
        this.invitations.update((list) => list?.map((i) => (i.id === renewed.id ? renewed : i)));
        this.snackBar.open(`A new link was sent to ${renewed.email}; the earlier one no longer works.`, undefined, { duration: 5000 });
      },
      error: () => {
        this.markInvitation(invitation.id, false);
        this.invitations.reload();
      },
    });
  }

  protected revoke(invitation: Invitation): void {
    confirmAction(this.dialog, {
      title: 'Revoke invitation?',
      message: `The link sent to ${invitation.email} will stop working. You can invite the address again later.`,
      confirmLabel: 'Revoke',
      destructive: true,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => {
          this.markInvitation(invitation.id, true);
          return this.teamApi.revokeInvitation(invitation.id);
        }),
      )
      .subscribe({
        next: () => {
          this.markInvitation(invitation.id, false);
          this.invitations.update((list) => list?.filter((i) => i.id !== invitation.id));
          this.snackBar.open(`Invitation for ${invitation.email} revoked.`, undefined, { duration: 4000 });
        },
        error: () => {
          this.markInvitation(invitation.id, false);
          this.invitations.reload();
        },
      });
  }

  private markInvitation(id: string, busy: boolean): void {
    this.invitationBusy.update((set) => {
      const next = new Set(set);
      if (busy) next.add(id);
      else next.delete(id);
      return next;
    });
  }

  private mark(userId: string, busy: boolean): void {
    this.saving.update((set) => {
      const next = new Set(set);
      if (busy) next.add(userId);
      else next.delete(userId);
      return next;
    });
  }
}
