import { Component, DestroyRef, computed, inject, input, signal } from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatChipsModule } from '@angular/material/chips';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { Observable } from 'rxjs';
import { apiErrorMessage } from '../../core/api-errors';
import { loadErrorText } from '../../core/resource-state';
import { Me } from '../../core/api-types';
import { SessionService } from '../../core/session.service';
import { NAME_VALIDATORS, NameField, NEW_PASSWORD_VALIDATORS, PasswordField } from '../../shared/account-fields';
import { TeamService } from '../../core/team.service';

/** Accepting an invitation link (/join/:token): a new user picks a name and password; a signed-in user just joins. */
@Component({
  selector: 'rn-join-screen',
  imports: [ReactiveFormsModule, RouterLink, NameField, PasswordField, MatCardModule, MatChipsModule, MatButtonModule, MatProgressBarModule],
  templateUrl: './join-screen.html',
  styleUrl: './join-screen.scss',
})
export class JoinScreen {
  private readonly team = inject(TeamService);
  protected readonly session = inject(SessionService);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  readonly token = input.required<string>();

  protected readonly invitation = rxResource({
    params: () => this.token(),
    stream: ({ params }) => this.team.previewInvitation(params),
  });
  /** The session probe runs alongside, so the screen knows whether to offer "Join" or the account form. */
  private readonly sessionProbe = rxResource({ stream: () => this.session.load() });
  protected readonly ready = computed(() => !this.invitation.isLoading() && !this.sessionProbe.isLoading());
  protected readonly loadError = loadErrorText([this.invitation], { 404: 'This invitation link is not valid. Ask your team admin for a new one.' });
  protected readonly returnUrl = computed(() => `/join/${this.token()}`);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', NAME_VALIDATORS],
    password: ['', NEW_PASSWORD_VALIDATORS],
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected joinAsNewUser(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, password } = this.form.getRawValue();
    this.accept(this.team.acceptInvitation(this.token(), { name: name.trim(), password }));
  }

  protected joinSignedIn(): void {
    this.accept(this.team.acceptInvitation(this.token()));
  }

  /** Signed in with another address than the invited one: sign out and come back to this link. */
  protected switchAccount(): void {
    this.busy.set(true);
    this.session
      .signOut()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: () => {
          this.busy.set(false);
          this.invitation.reload();
        },
        error: () => this.busy.set(false),
      });
  }

  private accept(request: Observable<Me>): void {
    this.busy.set(true);
    this.error.set(null);
    request.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (me) => {
        this.session.adopt(me);
        void this.router.navigate(['/projects']);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(apiErrorMessage(err));
      },
    });
  }
}
