import { Component, booleanAttribute, input } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MIN_PASSWORD_LENGTH } from '../core/api-types';

/**
 * The account fields the sign-in, sign-up and join forms share, with their wording and rules
 * written once: each binds a control of the screen's form (built with the validators below) and
 * keeps the screen's data-testid on its input.
 */

/** A person's or team's name (the server's limit is 120 characters). */
export const NAME_VALIDATORS = [Validators.required, Validators.maxLength(120)];
/** A password being chosen. */
export const NEW_PASSWORD_VALIDATORS = [Validators.required, Validators.minLength(MIN_PASSWORD_LENGTH)];

@Component({
  selector: 'rn-name-field',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  template: `
    <mat-form-field>
      <mat-label>Your name</mat-label>
      <input matInput [formControl]="control()" autocomplete="name" required [attr.data-testid]="testId()" />
      @if (control().hasError('required')) {
        <mat-error>Enter your name.</mat-error>
      } @else if (control().hasError('maxlength')) {
        <mat-error>Use at most 120 characters.</mat-error>
      }
    </mat-form-field>
  `,
  styles: ':host { display: block; }',
})
export class NameField {
  readonly control = input.required<FormControl<string>>();
  readonly testId = input.required<string>();
}

/** An email address; `autocomplete` is `username` where it signs in, `email` where it makes an account. */
@Component({
  selector: 'rn-email-field',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  template: `
    <mat-form-field>
      <mat-label>Email</mat-label>
      <input matInput type="email" [formControl]="control()" [attr.autocomplete]="autocomplete()" required [attr.data-testid]="testId()" />
      @if (control().hasError('required')) {
        <mat-error>Enter your email address.</mat-error>
      } @else if (control().hasError('email')) {
        <mat-error>That does not look like an email address.</mat-error>
      }
    </mat-form-field>
  `,
  styles: ':host { display: block; }',
})
export class EmailField {
  readonly control = input.required<FormControl<string>>();
  readonly testId = input.required<string>();
  readonly autocomplete = input<'username' | 'email'>('email');
}

/** A password being chosen (the minimum length as a hint and its own error) or, with `current`, one being entered. */
@Component({
  selector: 'rn-password-field',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  template: `
    <mat-form-field>
      <mat-label>{{ label() }}</mat-label>
      <input
        matInput
        type="password"
        [formControl]="control()"
        [attr.autocomplete]="current() ? 'current-password' : 'new-password'"
        required
        [attr.data-testid]="testId()"
      />
      @if (!current()) {
        <mat-hint>At least {{ minPassword }} characters.</mat-hint>
      }
      @if (control().hasError('required')) {
        <mat-error>{{ current() ? 'Enter your password.' : 'Choose a password.' }}</mat-error>
      } @else if (control().hasError('minlength')) {
        <mat-error>Use at least {{ minPassword }} characters.</mat-error>
      }
    </mat-form-field>
  `,
  styles: ':host { display: block; }',
})
export class PasswordField {
  readonly control = input.required<FormControl<string>>();
  readonly testId = input.required<string>();
  readonly label = input('Password');
  /** Signing in with an existing password rather than choosing one. */
  readonly current = input(false, { transform: booleanAttribute });
  protected readonly minPassword = MIN_PASSWORD_LENGTH;
}
