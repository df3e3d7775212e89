import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, type OnInit, computed, inject, input, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { NAME_MAX_LENGTH, PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH, sessionSchema } from '@shared/auth/auth-schemas';
import { roleLabels } from '@shared/auth/roles';
import { invitationPreviewSchema, type InvitationPreview } from '@shared/orgs/org-schemas';
import { apiErrorCode, apiErrorMessage, applyApiErrors, fieldError } from '../../core/api-errors';
import { AuthStore } from '../../auth/auth-store';
import { AuthCard } from '../../ui/auth-card/auth-card';

/** Public page behind the link in an invitation e-mail. */
@Component({
  selector: 'app-invitation-page',
  imports: [
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    AuthCard,
  ],
  templateUrl: './invitation-page.html',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvitationPage implements OnInit {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly http = inject(HttpClient);
  private readonly router = inject(Router);

  // inputs (route parameter)
  readonly token = input.required<string>();

  protected readonly loading = signal(true);
  protected readonly preview = signal<InvitationPreview | null>(null);
  protected readonly loadError = signal('');
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  /** Set when creating the account finds the address already has one. */
  private readonly accountFound = signal(false);
  protected readonly passwordMin = PASSWORD_MIN_LENGTH;
  protected readonly fieldError = fieldError;

  protected readonly roleLabel = computed(() => {
    const p = this.preview();
    return p ? roleLabels[p.role].toLowerCase() : '';
  });
  /** 'join' | 'wrong-account' | 'sign-in' | 'create-account' */
  protected readonly mode = computed(() => {
    const p = this.preview();
    const user = this.auth.user();
    if (!p) return null;
    if (user) return user.email.toLowerCase() === p.email.toLowerCase() ? 'join' : 'wrong-account';
    return p.accountExists || this.accountFound() ? 'sign-in' : 'create-account';
  });
  protected readonly returnUrl = computed(() => `/invitations/${this.token()}`);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(NAME_MAX_LENGTH)]],
    password: [
      '',
      [Validators.required, Validators.minLength(PASSWORD_MIN_LENGTH), Validators.maxLength(PASSWORD_MAX_LENGTH)],
    ],
  });

  ngOnInit(): void {
    void this.load();
  }

  private async load(): Promise<void> {
    try {
      await this.auth.whenLoaded();
      const body = await firstValueFrom(
        this.http.get<unknown>(`/api/v1/invitation-links/${encodeURIComponent(this.token())}`),
      );
      this.preview.set(invitationPreviewSchema.parse(body));
    } catch (err) {
      const code = apiErrorCode(err);
      this.loadError.set(
        code === 'invitation_expired'
          ? 'This invitation has expired. Ask the person who invited you to send a new one.'
          : code === 'invitation_not_found'
            ? 'This invitation link is not valid. It may have been revoked or already used.'
            : apiErrorMessage(err),
      );
    } finally {
      this.loading.set(false);
    }
  }

  protected async join(): Promise<void> {
    await this.run(async () => {
      const body = await firstValueFrom(
        this.http.post<unknown>(`/api/v1/invitation-links/${encodeURIComponent(this.token())}/accept`, null),
      );
      this.auth.setSession(sessionSchema.parse(body));
      await this.router.navigateByUrl('/projects');
    });
  }

  protected async signOut(): Promise<void> {
    await this.run(() => this.auth.signOut());
  }

  protected async createAccountAndJoin(): Promise<void> {
    const p = this.preview();
    if (!p) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { name, password } = this.form.getRawValue();
    await this.run(async () => {
      await this.auth.createInvitedAccount(this.token(), { name: name.trim(), password });
      await this.router.navigateByUrl('/projects');
    });
  }

  private async run(action: () => Promise<unknown>): Promise<void> {
    if (this.pending()) return;
    this.pending.set(true);
    this.formError.set('');
    try {
      await action();
    } catch (err) {
      // The address has an account by now (made since the page loaded): offer to sign in instead.
      if (apiErrorCode(err) === 'email_taken') this.accountFound.set(true);
      else this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
    }
  }
}
