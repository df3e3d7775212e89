import { HttpErrorResponse, httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { pendingSignUpSchema } from '@shared/auth/auth-schemas';
import { apiErrorCode, apiErrorMessage, applyApiErrors, safeReturnUrl } from '../../core/api-errors';
import { AuthCard } from '../../ui/auth-card/auth-card';
import { AuthStore } from '../auth-store';
import { NewPasswordFields, newPasswordForm } from '../new-password-fields/new-password-fields';

/** Why the link cannot make an account: used, expired or unknown; or the address has an account by now. */
type LinkProblem = 'invalid' | 'taken';

/** `/finish-sign-up/:token`: behind the e-mailed sign-up link, where the password is chosen. */
@Component({
  selector: 'app-finish-sign-up-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    AuthCard,
    NewPasswordFields,
  ],
  templateUrl: './finish-sign-up-page.html',
  styleUrl: './finish-sign-up-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FinishSignUpPage {
  // services
  private readonly auth = inject(AuthStore);
  private readonly router = inject(Router);

  // inputs (route parameter, query parameter)
  readonly token = input.required<string>();
  readonly returnUrl = input<string>();

  protected readonly pendingSignUp = httpResource(() => `/api/v1/auth/sign-ups/${encodeURIComponent(this.token())}`, {
    parse: pendingSignUpSchema.parse,
  });

  protected readonly form = newPasswordForm(inject(NonNullableFormBuilder));
  protected readonly pending = signal(false);
  protected readonly formError = signal('');

  /** A problem the server reported when the password was sent. */
  private readonly submitProblem = signal<LinkProblem | null>(null);
  protected readonly problem = computed<LinkProblem | null>(() => {
    const submitted = this.submitProblem();
    if (submitted) return submitted;
    const err = this.pendingSignUp.error();
    // 400 is the server's answer for a used, expired or malformed link; 404 for one it never made.
    return err instanceof HttpErrorResponse && (err.status === 400 || err.status === 404) ? 'invalid' : null;
  });
  /** Why the link could not be read, when it is not the link's fault (network, server …). */
  protected readonly loadError = computed(() => {
    const err = this.pendingSignUp.error();
    return err && !this.problem() ? apiErrorMessage(err, 'This sign-up could not be loaded. Please try again.') : '';
  });
  /** The address of the link, once known. */
  protected readonly address = computed(() =>
    this.pendingSignUp.hasValue() ? this.pendingSignUp.value().email : 'this address',
  );
  protected readonly signInQuery = computed(() => {
    const returnUrl = safeReturnUrl(this.returnUrl());
    return returnUrl ? { returnUrl } : {};
  });

  protected async createAccount(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.formError.set('');
    try {
      await this.auth.finishSignUp(this.token(), this.form.controls.password.value);
      await this.router.navigateByUrl(safeReturnUrl(this.returnUrl()) ?? '/projects');
    } catch (err) {
      const code = apiErrorCode(err);
      if (code === 'invalid_sign_up_link') this.submitProblem.set('invalid');
      else if (code === 'email_taken') this.submitProblem.set('taken');
      else this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
    }
  }
}
