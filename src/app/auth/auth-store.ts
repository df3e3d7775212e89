import { HttpClient } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { firstValueFrom, type Observable } from 'rxjs';
import type { InvitedAccountInput, Session, SignInInput, SignUpInput, SignUpStarted } from '@shared/auth/auth-schemas';
import { can, type Action } from '@shared/auth/roles';
import type { UnitSystem } from '@shared/units/units';

/** The schemas (and zod with them) load beside the first request, outside the initial bundle. */
const loadAuthSchemas = () => import('@shared/auth/auth-schemas');

const SIGNED_OUT: Session = {
  user: null,
  organizations: [],
  currentOrganizationId: null,
  devOutbox: false,
};

/** The signed-in user, their organisations and what they may do. */
@Injectable({ providedIn: 'root' })
export class AuthStore {
  private readonly http = inject(HttpClient);

  private readonly state = signal<Session | null>(null);
  private loading: Promise<Session> | null = null;

  /** The last session the server reported; null until GET /api/v1/session has answered. */
  readonly session = this.state.asReadonly();
  readonly loaded = computed(() => this.state() !== null);
  readonly user = computed(() => this.state()?.user ?? null);
  readonly signedIn = computed(() => this.user() !== null);
  readonly organizations = computed(() => this.state()?.organizations ?? []);
  readonly currentOrganizationId = computed(() => this.state()?.currentOrganizationId ?? null);
  readonly currentOrganization = computed(() => {
    const id = this.currentOrganizationId();
    return this.organizations().find((o) => o.id === id) ?? null;
  });
  readonly currentRole = computed(() => this.currentOrganization()?.role ?? null);
  readonly unitSystem = computed<UnitSystem>(() => this.user()?.unitSystem ?? 'SI');
  readonly devOutbox = computed(() => this.state()?.devOutbox ?? false);

  /** Whether the current user may do `action` in the current organisation (reactive in templates). */
  can(action: Action): boolean {
    return can(this.currentRole(), action);
  }

  /** Resolves once the session is known (asks the server only the first time). */
  whenLoaded(): Promise<Session> {
    this.loading ??= this.refresh().catch(() => {
      // Server unreachable: behave as signed out and ask again next time.
      this.loading = null;
      this.state.update((s) => s ?? SIGNED_OUT);
      return this.state() ?? SIGNED_OUT;
    });
    return this.loading;
  }

  /** Asks the server for the session again. */
  refresh(): Promise<Session> {
    return this.apply(this.http.get<unknown>('/api/v1/session'));
  }

  signIn(input: SignInInput): Promise<Session> {
    return this.apply(this.http.post<unknown>('/api/v1/auth/sign-in', input));
  }

  /**
   * Asks for the e-mail that finishes a new account. The answer is the same whether or not the
   * address already has an account, and nobody is signed in by it.
   */
  async signUp(input: SignUpInput): Promise<SignUpStarted> {
    const [{ signUpStartedSchema }, body] = await Promise.all([
      loadAuthSchemas(),
      firstValueFrom(this.http.post<unknown>('/api/v1/auth/sign-up', input)),
    ]);
    return signUpStartedSchema.parse(body);
  }

  /** Chooses the password behind an e-mailed sign-up link, which makes the account and signs it in. */
  finishSignUp(token: string, password: string): Promise<Session> {
    return this.apply(this.http.post<unknown>(`/api/v1/auth/sign-ups/${encodeURIComponent(token)}`, { password }));
  }

  /** Makes an account for the address of an invitation; it joins the inviting organisation and is signed in. */
  createInvitedAccount(invitationToken: string, input: InvitedAccountInput): Promise<Session> {
    return this.apply(
      this.http.post<unknown>(`/api/v1/invitation-links/${encodeURIComponent(invitationToken)}/account`, input),
    );
  }

  async signOut(): Promise<void> {
    try {
      await firstValueFrom(this.http.post('/api/v1/auth/sign-out', null));
    } finally {
      this.markSignedOut();
    }
  }

  /** Ends every session of this user, on every device. */
  async signOutEverywhere(): Promise<void> {
    try {
      await firstValueFrom(this.http.post('/api/v1/auth/sign-out-everywhere', null));
    } finally {
      this.markSignedOut();
    }
  }

  switchOrganization(organizationId: string): Promise<Session> {
    return this.apply(this.http.put<unknown>('/api/v1/session/organization', { organizationId }));
  }

  createOrganization(name: string): Promise<Session> {
    return this.apply(this.http.post<unknown>('/api/v1/organizations', { name }));
  }

  setUnitSystem(unitSystem: UnitSystem): Promise<Session> {
    return this.apply(this.http.patch<unknown>('/api/v1/me', { unitSystem }));
  }

  /** Takes a session answered by another endpoint (for example accepting an invitation). */
  setSession(session: Session): void {
    this.state.set(session);
    this.loading = Promise.resolve(session);
  }

  /** Forgets the user locally (after sign-out, or when the server says the session ended). */
  markSignedOut(): void {
    const devOutbox = this.devOutbox();
    this.setSession({ ...SIGNED_OUT, devOutbox });
  }

  private async apply(request: Observable<unknown>): Promise<Session> {
    const [{ sessionSchema }, body] = await Promise.all([loadAuthSchemas(), firstValueFrom(request)]);
    const session = sessionSchema.parse(body);
    this.setSession(session);
    return session;
  }
}
