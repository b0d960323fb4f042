import { Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import { apiErrorMessage } from '../../core/api-errors';
import { SessionService } from '../../core/session.service';
import { EmailField, NAME_VALIDATORS, NameField } from '../../shared/account-fields';

/**
 * Asking for an account: the server mails a link (the answer never says whether the address is
 * registered); the link opens sign-up-confirm-screen, where the password is chosen and the account
 * created (a password typed here could be someone else's, asking for your address).
 */
@Component({
  selector: 'rn-sign-up-screen',
  imports: [ReactiveFormsModule, RouterLink, EmailField, NameField, MatCardModule, MatFormFieldModule, MatInputModule, MatButtonModule, MatProgressBarModule],
  templateUrl: './sign-up-screen.html',
})
export class SignUpScreen {
  private readonly session = inject(SessionService);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', NAME_VALIDATORS],
    email: ['', [Validators.required, Validators.email]],
    teamName: ['', NAME_VALIDATORS],
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  /** The server's "check your e-mail" answer once the request is sent. */
  protected readonly sent = signal<string | null>(null);

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    this.busy.set(true);
    this.error.set(null);
    this.session
      .signUp({ ...value, email: value.email.trim(), name: value.name.trim(), teamName: value.teamName.trim() })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (answer) => {
          this.busy.set(false);
          this.sent.set(answer.message);
        },
        error: (err: unknown) => {
          this.busy.set(false);
          // the server's 429 says how long to wait
          this.error.set(apiErrorMessage(err));
        },
      });
  }
}
