import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import type { PendingSignUp } from '@shared/auth/auth-schemas';
import { AuthStore } from '../auth-store';
import { settle, signedInSession, signedOutSession } from '../../testing/test-sessions';
import { FinishSignUpPage } from './finish-sign-up-page';

const TOKEN = 'abcdefghijklmnopqrstuvwxyz012345';
const LINK = `/api/v1/auth/sign-ups/${TOKEN}`;

function aPendingSignUp(overrides: Partial<PendingSignUp> = {}): PendingSignUp {
  return {
    email: 'dana@example.com',
    name: 'Dana Frost',
    organizationName: 'Frost Heating',
    expiresAt: '2030-01-02T09:00:00.000Z',
    ...overrides,
  };
}

describe('FinishSignUpPage', () => {
  let fixture: ComponentFixture<FinishSignUpPage>;
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
  function fieldText(name: string): string {
    const field = el().querySelector(`input[formcontrolname="${name}"]`)?.closest('mat-form-field');
    return field?.querySelector('mat-error')?.textContent?.trim() ?? '';
  }
  async function stable(): Promise<void> {
    await settle();
    await fixture.whenStable();
  }
  async function submit(): Promise<void> {
    el().querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    await fixture.whenStable();
  }
  /** Renders the page for the link; the GET is left open. */
  function open(returnUrl?: string): void {
    fixture = TestBed.createComponent(FinishSignUpPage);
    fixture.componentRef.setInput('token', TOKEN);
    if (returnUrl !== undefined) fixture.componentRef.setInput('returnUrl', returnUrl);
    fixture.detectChanges(); // first render; httpResource sends its request
  }
  async function openLoaded(pending = aPendingSignUp(), returnUrl?: string): Promise<void> {
    open(returnUrl);
    http.expectOne({ method: 'GET', url: LINK }).flush(pending);
    await stable();
  }
  async function fillPasswords(): Promise<void> {
    type('password', 'a long enough passphrase');
    type('confirmPassword', 'a long enough passphrase');
    await fixture.whenStable();
  }
  const alert = () => el().querySelector('[role="alert"]');

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [FinishSignUpPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    TestBed.inject(AuthStore).setSession(signedOutSession());
  });
  afterEach(() => http.verify());

  it('shows progress while the link loads, then the address, name and organisation', async () => {
    open();
    expect(el().querySelector('mat-progress-bar')).not.toBeNull();
    expect(el().querySelector('form')).toBeNull();

    http
      .expectOne({ method: 'GET', url: LINK })
      .flush(aPendingSignUp({ email: 'cleo@example.org', name: 'Cleo Hart' }));
    await stable();
    expect(el().querySelector('mat-progress-bar')).toBeNull();
    const summary = el().querySelector('[data-testid="pending-sign-up"]')?.textContent ?? '';
    expect(summary).toContain('cleo@example.org');
    expect(summary).toContain('Cleo Hart');
    expect(summary).toContain('Frost Heating');
    const labels = Array.from(el().querySelectorAll('mat-label'), (l) => l.textContent?.trim());
    expect(labels).toEqual(['Password', 'Confirm password']);
  });

  it('leaves out the organisation when none was named', async () => {
    await openLoaded(aPendingSignUp({ organizationName: null }));
    const summary = el().querySelector('[data-testid="pending-sign-up"]')?.textContent ?? '';
    expect(summary).not.toContain('Organisation');
    expect(summary).toContain('Dana Frost');
  });

  it('makes the account with the password, signs in and goes to projects', async () => {
    await openLoaded();
    await fillPasswords();
    await submit();
    const req = http.expectOne({ method: 'POST', url: LINK });
    expect(req.request.body).toEqual({ password: 'a long enough passphrase' });
    req.flush(signedInSession('owner'), { status: 201, statusText: 'Created' });
    await stable();
    expect(TestBed.inject(AuthStore).signedIn()).toBeTrue();
    expect(navigateByUrl).toHaveBeenCalledOnceWith('/projects');
  });

  it('goes to the return address of this site after making the account, never to another site', async () => {
    await openLoaded(aPendingSignUp(), '/invitations/xyz');
    await fillPasswords();
    await submit();
    http
      .expectOne({ method: 'POST', url: LINK })
      .flush(signedInSession('owner'), { status: 201, statusText: 'Created' });
    await stable();
    expect(navigateByUrl).toHaveBeenCalledOnceWith('/invitations/xyz');

    navigateByUrl.calls.reset();
    fixture.destroy();
    await openLoaded(aPendingSignUp(), '//elsewhere.example/');
    await fillPasswords();
    await submit();
    http
      .expectOne({ method: 'POST', url: LINK })
      .flush(signedInSession('owner'), { status: 201, statusText: 'Created' });
    await stable();
    expect(navigateByUrl).toHaveBeenCalledOnceWith('/projects');
  });

  it('refuses two passwords that differ and sends nothing', async () => {
    await openLoaded();
    type('password', 'a long enough passphrase');
    type('confirmPassword', 'a long enough passphrasE');
    await submit();
    expect(fieldText('confirmPassword')).toBe('The passwords do not match');
    http.expectNone({ method: 'POST', url: LINK });
  });

  it('refuses a password shorter than 12 characters', async () => {
    await openLoaded();
    type('password', 'short-pass1');
    type('confirmPassword', 'short-pass1');
    await submit();
    expect(fieldText('password')).toBe('Use at least 12 characters');
    http.expectNone({ method: 'POST', url: LINK });
  });

  it('explains a used or expired link and offers to start again', async () => {
    open();
    http
      .expectOne(LINK)
      .flush(
        { error: { code: 'invalid_sign_up_link', message: 'This link has expired or was already used' } },
        { status: 400, statusText: 'Bad Request' },
      );
    await stable();
    expect(el().querySelector('form')).toBeNull();
    expect(el().querySelector('mat-progress-bar')).toBeNull();
    expect(alert()?.textContent).toContain('expired or has already been used');
    expect(alert()?.querySelector('a[href="/create-account"]')?.textContent?.trim()).toBe('Start again');
  });

  it('explains a link that stopped working while the page was open', async () => {
    await openLoaded();
    await fillPasswords();
    await submit();
    http
      .expectOne({ method: 'POST', url: LINK })
      .flush(
        { error: { code: 'invalid_sign_up_link', message: 'This link has expired or was already used' } },
        { status: 400, statusText: 'Bad Request' },
      );
    await stable();
    expect(alert()?.querySelector('a[href="/create-account"]')).not.toBeNull();
    expect(TestBed.inject(AuthStore).signedIn()).toBeFalse();
    expect(navigateByUrl).not.toHaveBeenCalled();
  });

  it('sends to sign-in when the address has an account by now', async () => {
    await openLoaded(aPendingSignUp(), '/team');
    await fillPasswords();
    await submit();
    http
      .expectOne({ method: 'POST', url: LINK })
      .flush(
        { error: { code: 'email_taken', message: 'An account with that e-mail already exists' } },
        { status: 409, statusText: 'Conflict' },
      );
    await stable();
    expect(el().querySelector('form')).toBeNull();
    expect(alert()?.textContent).toContain('An account already exists for dana@example.com');
    const signIn = alert()?.querySelector<HTMLAnchorElement>('a[href^="/sign-in"]');
    expect(signIn?.textContent?.trim()).toBe('Sign in');
    expect(decodeURIComponent(signIn?.getAttribute('href') ?? '')).toBe('/sign-in?returnUrl=/team');
    expect(navigateByUrl).not.toHaveBeenCalled();
  });

  it("puts the server's password message on the password field", async () => {
    await openLoaded();
    await fillPasswords();
    await submit();
    http.expectOne({ method: 'POST', url: LINK }).flush(
      {
        error: {
          code: 'validation',
          message: 'Some fields are not valid',
          details: [{ path: 'password', message: 'Choose a password that is harder to guess' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await stable();
    expect(fieldText('password')).toBe('Choose a password that is harder to guess');
    expect(alert()?.textContent).toContain('Some fields are not valid');
    expect(el().querySelector<HTMLInputElement>('input[formcontrolname="confirmPassword"]')?.value).toBe(
      'a long enough passphrase',
    );
  });

  it('offers to try again when the server cannot be reached', async () => {
    open();
    http.expectOne(LINK).error(new ProgressEvent('error'), { status: 0, statusText: 'Unknown Error' });
    await stable();
    expect(alert()?.textContent).toContain('The server could not be reached');
    const retry = Array.from(el().querySelectorAll<HTMLButtonElement>('button')).find(
      (b) => b.textContent?.trim() === 'Try again',
    );
    retry?.click();
    fixture.detectChanges(); // the resource asks again (whenStable would wait for the answer)
    http.expectOne(LINK).flush(aPendingSignUp());
    await stable();
    expect(el().querySelector('form')).not.toBeNull();
  });
});
