import {
  type AbstractControl,
  type FormGroupDirective,
  type NgForm,
  type ValidationErrors,
  Validators,
} from '@angular/forms';
import type { ErrorStateMatcher } from '@angular/material/core';

/** An e-mail address, ignoring spaces around it (the form trims before sending). */
export function emailAddress(control: AbstractControl<string>): ValidationErrors | null {
  const value = typeof control.value === 'string' ? control.value.trim() : control.value;
  if (!value) return null; // `required` reports an empty field
  return Validators.email({ value } as AbstractControl) ?? Validators.maxLength(254)({ value } as AbstractControl);
}

/** Group validator: `confirmPassword` must repeat `password`. */
export function passwordsMatch(group: AbstractControl): ValidationErrors | null {
  const password: unknown = group.get('password')?.value;
  const confirm: unknown = group.get('confirmPassword')?.value;
  return confirm && password !== confirm ? { mismatch: true } : null;
}

/** Shows the confirmation field in error when the two passwords differ (see `passwordsMatch`). */
export const confirmErrorMatcher: ErrorStateMatcher = {
  isErrorState(control: AbstractControl | null, form: FormGroupDirective | NgForm | null): boolean {
    if (!control) return false;
    const shown = control.touched || !!form?.submitted;
    return shown && (control.invalid || !!form?.hasError('mismatch'));
  },
};
