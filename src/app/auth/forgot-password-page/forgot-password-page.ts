import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { applyApiErrors, fieldError } from '../../core/api-errors';
import { emailAddress } from '../../core/validators';
import { AuthCard } from '../../ui/auth-card/auth-card';

@Component({
  selector: 'app-forgot-password-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    AuthCard,
  ],
  templateUrl: './forgot-password-page.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ForgotPasswordPage {
  // services
  private readonly http = inject(HttpClient);

  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, emailAddress]],
  });
  protected readonly pending = signal(false);
  protected readonly sent = signal(false);
  protected readonly formError = signal('');
  protected readonly fieldError = fieldError;

  protected async sendResetLink(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.formError.set('');
    try {
      const email = this.form.controls.email.value.trim();
      await firstValueFrom(this.http.post('/api/v1/auth/password-resets', { email }));
      this.sent.set(true);
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
    }
  }
}
