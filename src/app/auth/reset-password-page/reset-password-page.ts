import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, ChangeDetectorRef, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '@shared/auth/auth-schemas';
import { apiErrorCode, applyApiErrors, fieldError } from '../../core/api-errors';
import { confirmErrorMatcher, passwordsMatch } from '../../core/validators';
import { AuthCard } from '../../ui/auth-card/auth-card';

@Component({
  selector: 'app-reset-password-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, AuthCard],
  templateUrl: './reset-password-page.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ResetPasswordPage {
  // services
  private readonly http = inject(HttpClient);
  private readonly cdr = inject(ChangeDetectorRef);

  // inputs (route parameter)
  readonly token = input.required<string>();

  protected readonly passwordMin = PASSWORD_MIN_LENGTH;
  protected readonly confirmErrorMatcher = confirmErrorMatcher;
  protected readonly form = inject(NonNullableFormBuilder).group(
    {
      password: [
        '',
        [Validators.required, Validators.minLength(PASSWORD_MIN_LENGTH), Validators.maxLength(PASSWORD_MAX_LENGTH)],
      ],
      confirmPassword: ['', [Validators.required]],
    },
    { validators: [passwordsMatch] },
  );
  protected readonly pending = signal(false);
  protected readonly done = signal(false);
  protected readonly linkInvalid = signal(false);
  protected readonly formError = signal('');
  protected readonly fieldError = fieldError;

  protected confirmError(): string {
    const control = this.form.controls.confirmPassword;
    if (control.errors) return fieldError(control, { required: 'Repeat the new password' });
    return this.form.hasError('mismatch') ? 'The passwords do not match' : '';
  }

  protected async setPassword(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.formError.set('');
    try {
      const password = this.form.controls.password.value;
      await firstValueFrom(
        this.http.post(`/api/v1/auth/password-resets/${encodeURIComponent(this.token())}`, { password }),
      );
      this.done.set(true);
    } catch (err) {
      this.linkInvalid.set(apiErrorCode(err) === 'invalid_reset_link');
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
      this.cdr.markForCheck();
    }
  }
}
