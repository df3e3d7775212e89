import {
  ChangeDetectionStrategy,
  Component,
  type ElementRef,
  Injector,
  afterNextRender,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import {
  NAME_MAX_LENGTH,
  ORGANIZATION_NAME_MAX_LENGTH,
  returnUrlSchema,
  type SignUpInput,
} from '@shared/auth/auth-schemas';
import { applyApiErrors, fieldError, safeReturnUrl } from '../../core/api-errors';
import { emailAddress } from '../../core/validators';
import { AuthCard } from '../../ui/auth-card/auth-card';
import { AuthStore } from '../auth-store';

/**
 * The first step of a new account: name, address and organisation. The password is chosen on the
 * page behind the e-mailed link, so only whoever reads that address's mail can finish the account.
 */
@Component({
  selector: 'app-create-account-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    AuthCard,
  ],
  templateUrl: './create-account-page.html',
  styleUrl: './create-account-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreateAccountPage {
  // services
  private readonly auth = inject(AuthStore);
  private readonly injector = inject(Injector);

  // inputs (query parameters)
  readonly returnUrl = input<string>();

  private readonly emailInput = viewChild<ElementRef<HTMLInputElement>>('emailInput');

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(NAME_MAX_LENGTH)]],
    email: ['', [Validators.required, emailAddress]],
    organizationName: ['', [Validators.maxLength(ORGANIZATION_NAME_MAX_LENGTH)]],
  });
  /** What was last sent, once the server has accepted it: the page then says to check the mail. */
  protected readonly sent = signal<SignUpInput | null>(null);
  /** The address the link was sent to again, to confirm it. */
  protected readonly resentTo = signal('');
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  protected readonly fieldError = fieldError;

  protected async sendLink(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const input = this.signUpInput();
    await this.run(async () => {
      await this.auth.signUp(input);
      this.resentTo.set('');
      this.sent.set(input);
    });
  }

  protected async sendAgain(): Promise<void> {
    const input = this.sent();
    if (!input || this.pending()) return;
    this.resentTo.set('');
    await this.run(async () => {
      await this.auth.signUp(input);
      this.resentTo.set(input.email);
    });
  }

  /** Back to the form, with what was typed still there. */
  protected useAnotherAddress(): void {
    this.sent.set(null);
    this.resentTo.set('');
    this.formError.set('');
    afterNextRender(() => this.emailInput()?.nativeElement.focus(), { injector: this.injector });
  }

  private signUpInput(): SignUpInput {
    const value = this.form.getRawValue();
    const input: SignUpInput = { name: value.name.trim(), email: value.email.trim() };
    const organizationName = value.organizationName.trim();
    if (organizationName) input.organizationName = organizationName;
    // A return address the server would refuse is dropped: the visitor did not type it.
    const returnUrl = safeReturnUrl(this.returnUrl());
    if (returnUrl && returnUrlSchema.safeParse(returnUrl).success) input.returnUrl = returnUrl;
    return input;
  }

  private async run(action: () => Promise<void>): Promise<void> {
    this.pending.set(true);
    this.formError.set('');
    try {
      await action();
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
    }
  }
}
