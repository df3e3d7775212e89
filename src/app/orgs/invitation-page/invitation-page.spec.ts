import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import type { InvitationPreview } from '@shared/orgs/org-schemas';
import { AuthStore } from '../../auth/auth-store';
import { settle, signedInSession, signedOutSession } from '../../testing/test-sessions';
import { InvitationPage } from './invitation-page';
import { nextRequest } from '../../testing/until';

const TOKEN = 'abcdefghijklmnopqrstuvwxyz012345';

function aPreview(overrides: Partial<InvitationPreview> = {}): InvitationPreview {
  return {
    organizationName: 'Frost Heating',
    role: 'designer',
    email: 'dana@example.com',
    invitedByName: 'Olive Owner',
    expiresAt: '2030-01-08T09:00:00.000Z',
    accountExists: false,
    ...overrides,
  };
}

describe('InvitationPage', () => {
  let fixture: ComponentFixture<InvitationPage>;
  let http: HttpTestingController;
  let navigateByUrl: jasmine.Spy;

  const el = () => fixture.nativeElement as HTMLElement;
  function type(name: string, value: string): void {
    const input = el().querySelector<HTMLInputElement>(`input[formcontrolname="${name}"]`);
    if (!input) throw new Error(`no input ${name}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }
  async function stable(): Promise<void> {
    await settle();
    await fixture.whenStable();
  }

  async function open(preview: InvitationPreview): Promise<void> {
    TestBed.inject(AuthStore).setSession(signedOutSession());
    fixture = TestBed.createComponent(InvitationPage);
    fixture.componentRef.setInput('token', TOKEN);
    await fixture.whenStable();
    (await nextRequest(http, { method: 'GET', url: `/api/v1/invitation-links/${TOKEN}` })).flush(preview);
    await stable();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [InvitationPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
  });
  afterEach(() => http.verify());

  it('makes the account for the invited address, then goes to projects signed in', async () => {
    await open(aPreview());
    type('name', ' Dana Frost ');
    type('password', 'a long enough passphrase');
    el().querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    await fixture.whenStable();
    const req = http.expectOne({ method: 'POST', url: `/api/v1/invitation-links/${TOKEN}/account` });
    expect(req.request.body).toEqual({ name: 'Dana Frost', password: 'a long enough passphrase' });
    req.flush(signedInSession('designer'), { status: 201, statusText: 'Created' });
    await stable();
    expect(TestBed.inject(AuthStore).currentRole()).toBe('designer');
    expect(navigateByUrl).toHaveBeenCalledWith('/projects');
  });

  it('sends nothing while the name or password is missing', async () => {
    await open(aPreview());
    el().querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    await fixture.whenStable();
    const errors = Array.from(el().querySelectorAll('mat-error'), (e) => e.textContent?.trim());
    expect(errors).toEqual(['Enter your name', 'Enter a password']);
    http.expectNone(`/api/v1/invitation-links/${TOKEN}/account`);
  });

  it('offers to sign in when the address has an account by the time it is sent', async () => {
    await open(aPreview());
    type('name', 'Dana Frost');
    type('password', 'a long enough passphrase');
    el().querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    await fixture.whenStable();
    http
      .expectOne(`/api/v1/invitation-links/${TOKEN}/account`)
      .flush(
        { error: { code: 'email_taken', message: 'An account with that e-mail already exists' } },
        { status: 409, statusText: 'Conflict' },
      );
    await stable();
    expect(el().querySelector('form')).toBeNull();
    const signIn = el().querySelector<HTMLAnchorElement>('a[href^="/sign-in"]');
    expect(signIn?.textContent?.trim()).toBe('Sign in to accept');
    expect(decodeURIComponent(signIn?.getAttribute('href') ?? '')).toContain(`returnUrl=/invitations/${TOKEN}`);
    expect(navigateByUrl).not.toHaveBeenCalled();
  });
});
