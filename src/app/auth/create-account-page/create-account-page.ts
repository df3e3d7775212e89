import { ChangeDetectionStrategy, ChangeDetectorRef, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import {
  NAME_MAX_LENGTH,
  ORGANIZATION_NAME_MAX_LENGTH,
  PASSWORD_MAX_LENGTH,
  PASSWORD_MIN_LENGTH,
  type SignUpInput,
} from '@shared/auth/auth-schemas';
import { applyApiErrors, fieldError, safeReturnUrl } from '../../core/api-errors';
import { emailAddress } from '../../core/validators';
import { AuthCard } from '../../ui/auth-card/auth-card';
import { AuthStore } from '../auth-store';

@Component({
  selector: 'app-create-account-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, AuthCard],
  templateUrl: './create-account-page.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreateAccountPage {
  // services
  private readonly auth = inject(AuthStore);
  private readonly router = inject(Router);
  private readonly cdr = inject(ChangeDetectorRef);

  // inputs (query parameters)
  readonly returnUrl = input<string>();

  protected readonly passwordMin = PASSWORD_MIN_LENGTH;
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(NAME_MAX_LENGTH)]],
    email: ['', [Validators.required, emailAddress]],
    password: [
      '',
      [Validators.required, Validators.minLength(PASSWORD_MIN_LENGTH), Validators.maxLength(PASSWORD_MAX_LENGTH)],
    ],
    organizationName: ['', [Validators.maxLength(ORGANIZATION_NAME_MAX_LENGTH)]],
  });
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  protected readonly fieldError = fieldError;

  protected async createAccount(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    const input: SignUpInput = {
      name: value.name.trim(),
      email: value.email.trim(),
      password: value.password,
    };
    const organizationName = value.organizationName.trim();
    if (organizationName) input.organizationName = organizationName;

    this.pending.set(true);
    this.formError.set('');
    try {
      await this.auth.signUp(input);
      await this.router.navigateByUrl(safeReturnUrl(this.returnUrl()) ?? '/projects');
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
      this.cdr.markForCheck();
    }
  }
}
