import { type AbstractControl, type ValidationErrors, Validators } from '@angular/forms';

/** An e-mail address, ignoring spaces around it (the form trims before sending). */
export function emailAddress(control: AbstractControl<string>): ValidationErrors | null {
  const value = typeof control.value === 'string' ? control.value.trim() : control.value;
  if (!value) return null; // `required` reports an empty field
  return Validators.email({ value } as AbstractControl) ?? Validators.maxLength(254)({ value } as AbstractControl);
}
