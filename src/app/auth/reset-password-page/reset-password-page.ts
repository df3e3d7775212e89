import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { apiErrorCode, applyApiErrors } from '../../core/api-errors';
import { AuthCard } from '../../ui/auth-card/auth-card';
import { NewPasswordFields, newPasswordForm } from '../new-password-fields/new-password-fields';

@Component({
  selector: 'app-reset-password-page',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatIconModule, AuthCard, NewPasswordFields],
  templateUrl: './reset-password-page.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ResetPasswordPage {
  // services
  private readonly http = inject(HttpClient);

  // inputs (route parameter)
  readonly token = input.required<string>();

  protected readonly form = newPasswordForm(inject(NonNullableFormBuilder));
  protected readonly pending = signal(false);
  protected readonly done = signal(false);
  protected readonly linkInvalid = signal(false);
  protected readonly formError = signal('');

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
    }
  }
}
