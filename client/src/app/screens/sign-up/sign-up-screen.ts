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
import { MIN_PASSWORD_LENGTH } from '../../core/api-types';
import { SessionService } from '../../core/session.service';
import { EmailField, NameField, PasswordField } from '../../shared/account-fields';

/**
 * Asking for an account: the server mails a link (the answer never says whether the address is
 * registered); the link opens sign-up-confirm-screen, which creates the account.
 */
@Component({
  selector: 'rn-sign-up-screen',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    EmailField,
    NameField,
    PasswordField,
    MatCardModule,
    MatFormFieldModule,
    MatInputModule,
    MatButtonModule,
    MatProgressBarModule,
  ],
  templateUrl: './sign-up-screen.html',
})
export class SignUpScreen {
  private readonly session = inject(SessionService);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(120)]],
    email: ['', [Validators.required, Validators.email]],
    password: ['', [Validators.required, Validators.minLength(MIN_PASSWORD_LENGTH)]],
    teamName: ['', [Validators.required, Validators.maxLength(120)]],
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
          this.error.set(apiErrorMessage(err, { 429: 'Too many attempts. Wait a few minutes, then try again.' }));
        },
      });
  }
}
