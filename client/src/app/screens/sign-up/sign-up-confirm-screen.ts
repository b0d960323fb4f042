import { Component, DestroyRef, inject, signal } from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { ActivatedRoute, Router, RouterLink } from '@angular/router';
import { apiErrorBody, apiErrorMessage } from '../../core/api-errors';
import { SessionService } from '../../core/session.service';
import { NEW_PASSWORD_VALIDATORS, PasswordField } from '../../shared/account-fields';

/**
 * Finishing a sign-up from the mailed link (`/sign-up/confirm#<token>`; the fragment never reaches a
 * server log): the password is chosen here, by whoever holds the mailbox. Nothing happens until the
 * button is pressed: a mail scanner or a link preview that opens the page creates no account.
 * Someone already signed in is told that finishing replaces that sign-in with the new account, and
 * may keep it instead.
 */
@Component({
  selector: 'rn-sign-up-confirm-screen',
  imports: [ReactiveFormsModule, RouterLink, PasswordField, MatCardModule, MatButtonModule, MatProgressBarModule],
  templateUrl: './sign-up-confirm-screen.html',
})
export class SignUpConfirmScreen {
  protected readonly session = inject(SessionService);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly token = inject(ActivatedRoute).snapshot.fragment ?? '';
  /** Whether someone is signed in decides what the page offers. */
  protected readonly sessionProbe = rxResource({ stream: () => this.session.load() });
  protected readonly form = inject(NonNullableFormBuilder).group({ password: ['', NEW_PASSWORD_VALIDATORS] });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  /** 409: the account exists (the link was used already); the page then points to sign-in. */
  protected readonly exists = signal(false);

  protected confirm(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.session
      .confirmSignUp(this.token, this.form.getRawValue().password)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: () => void this.router.navigate(['/projects']),
        error: (err: unknown) => {
          this.busy.set(false);
          this.exists.set(apiErrorBody(err)?.code === 'conflict');
          this.error.set(apiErrorMessage(err));
        },
      });
  }
}
