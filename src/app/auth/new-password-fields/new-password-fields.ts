import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import {
  ControlContainer,
  FormGroupDirective,
  type FormControl,
  type FormGroup,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '@shared/auth/auth-schemas';
import { fieldError } from '../../core/api-errors';
import { confirmErrorMatcher, passwordsMatch } from '../../core/validators';

export type NewPasswordForm = FormGroup<{ password: FormControl<string>; confirmPassword: FormControl<string> }>;

/** A new password and its confirmation, with the length rules of the API and the "do not match" check. */
export function newPasswordForm(fb: NonNullableFormBuilder): NewPasswordForm {
  return fb.group(
    {
      password: [
        '',
        [Validators.required, Validators.minLength(PASSWORD_MIN_LENGTH), Validators.maxLength(PASSWORD_MAX_LENGTH)],
      ],
      confirmPassword: ['', [Validators.required]],
    },
    { validators: [passwordsMatch] },
  );
}

/**
 * The two password fields of a `newPasswordForm`, inside the page's own `<form [formGroup]>` (the
 * page submits; these fields show the hint and the errors).
 */
@Component({
  selector: 'app-new-password-fields',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  viewProviders: [{ provide: ControlContainer, useExisting: FormGroupDirective }],
  host: { style: 'display: contents' },
  template: `
    <mat-form-field>
      <mat-label>{{ passwordLabel() }}</mat-label>
      <input matInput type="password" formControlName="password" autocomplete="new-password" />
      <mat-hint>At least {{ passwordMin }} characters</mat-hint>
      <mat-error>{{ fieldError(form().controls.password, { required: passwordRequired() }) }}</mat-error>
    </mat-form-field>
    <mat-form-field>
      <mat-label>{{ confirmLabel() }}</mat-label>
      <input
        matInput
        type="password"
        formControlName="confirmPassword"
        autocomplete="new-password"
        [errorStateMatcher]="confirmErrorMatcher"
      />
      <mat-error>{{ confirmError() }}</mat-error>
    </mat-form-field>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewPasswordFields {
  // inputs
  readonly form = input.required<NewPasswordForm>();
  readonly passwordLabel = input('Password');
  readonly confirmLabel = input('Confirm password');
  readonly passwordRequired = input('Enter a password');
  readonly confirmRequired = input('Repeat the password');

  protected readonly passwordMin = PASSWORD_MIN_LENGTH;
  protected readonly confirmErrorMatcher = confirmErrorMatcher;
  protected readonly fieldError = fieldError;

  protected confirmError(): string {
    const control = this.form().controls.confirmPassword;
    if (control.errors) return fieldError(control, { required: this.confirmRequired() });
    return this.form().hasError('mismatch') ? 'The passwords do not match' : '';
  }
}
