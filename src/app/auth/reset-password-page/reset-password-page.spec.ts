import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { ResetPasswordPage } from './reset-password-page';
import { until } from '../../testing/until';

const TOKEN = 'abcdefghijklmnopqrstuvwxyz012345';

describe('ResetPasswordPage', () => {
  let fixture: ComponentFixture<ResetPasswordPage>;
  let http: HttpTestingController;

  const el = () => fixture.nativeElement as HTMLElement;
  function type(name: string, value: string): void {
    const input = el().querySelector<HTMLInputElement>(`input[formcontrolname="${name}"]`);
    if (!input) throw new Error(`no input ${name}`);
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
  }
  async function submit(): Promise<void> {
    el().querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    await fixture.whenStable();
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [ResetPasswordPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(ResetPasswordPage);
    fixture.componentRef.setInput('token', TOKEN);
    await fixture.whenStable();
  });
  afterEach(() => http.verify());

  it('refuses two passwords that differ', async () => {
    type('password', 'a long new password');
    type('confirmPassword', 'a long new passw0rd');
    await submit();
    const confirmField = el().querySelector('input[formcontrolname="confirmPassword"]')?.closest('mat-form-field');
    expect(confirmField?.querySelector('mat-error')?.textContent?.trim()).toBe('The passwords do not match');
    http.expectNone(`/api/v1/auth/password-resets/${TOKEN}`);
  });

  it('sets the new password and offers to sign in', async () => {
    type('password', 'a long new password');
    type('confirmPassword', 'a long new password');
    await submit();
    const req = http.expectOne({ method: 'POST', url: `/api/v1/auth/password-resets/${TOKEN}` });
    expect(req.request.body).toEqual({ password: 'a long new password' });
    req.flush(null, { status: 204, statusText: 'No Content' });
    await until(() => (el().textContent ?? '').includes('Your password has been changed'), 'the confirmation');
    expect(el().textContent).toContain('Your password has been changed');
    expect(el().querySelector('a[href="/sign-in"]')).not.toBeNull();
  });

  it('explains an unknown, used or expired link', async () => {
    type('password', 'a long new password');
    type('confirmPassword', 'a long new password');
    await submit();
    http
      .expectOne(`/api/v1/auth/password-resets/${TOKEN}`)
      .flush(
        { error: { code: 'invalid_reset_link', message: 'This link has expired or was already used' } },
        { status: 400, statusText: 'Bad Request' },
      );
    await until(() => el().querySelector('[role="alert"]') !== null, 'the error message');
    const alert = el().querySelector('[role="alert"]');
    expect(alert?.textContent).toContain('This link has expired or was already used');
    expect(alert?.querySelector('a[href="/forgot-password"]')).not.toBeNull();
  });
});
