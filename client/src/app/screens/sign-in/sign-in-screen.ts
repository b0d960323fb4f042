import { Component, DestroyRef, inject, input, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCardModule } from '@angular/material/card';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { apiErrorMessage } from '../../core/api-errors';
import { SessionService } from '../../core/session.service';
import { EmailField, PasswordField } from '../../shared/account-fields';
import { safeReturnUrl } from '../../shared/return-url';

@Component({
  selector: 'rn-sign-in-screen',
  imports: [ReactiveFormsModule, RouterLink, EmailField, PasswordField, MatCardModule, MatButtonModule, MatProgressBarModule],
  templateUrl: './sign-in-screen.html',
})
export class SignInScreen {
  private readonly session = inject(SessionService);
  private readonly router = inject(Router);
  private readonly destroyRef = inject(DestroyRef);

  /** Where to go after signing in (query parameter, set by the guard). */
  readonly returnUrl = input<string>();

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email]],
    password: ['', Validators.required],
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email, password } = this.form.getRawValue();
    this.busy.set(true);
    this.error.set(null);
    this.session
      .signIn(email.trim(), password)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: () => void this.router.navigateByUrl(safeReturnUrl(this.returnUrl())),
        error: (err: unknown) => {
          this.busy.set(false);
          this.error.set(apiErrorMessage(err, SIGN_IN_MESSAGES));
        },
      });
  }
}

const SIGN_IN_MESSAGES = {
  401: 'That email and password do not match an account.',
  429: 'Too many sign-in attempts. Wait a few minutes, then try again.',
};
