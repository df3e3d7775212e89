import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { signedInSession } from '../../testing/test-sessions';
import { SignInPage } from './sign-in-page';
import { until } from '../../testing/until';

describe('SignInPage', () => {
  let fixture: ComponentFixture<SignInPage>;
  let http: HttpTestingController;
  let navigateByUrl: jasmine.Spy;

  const el = () => fixture.nativeElement as HTMLElement;
  function type(label: string, value: string): void {
    const input = el().querySelector<HTMLInputElement>(`input[formcontrolname="${label}"]`);
    if (!input) throw new Error(`no input ${label}`);
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
      imports: [SignInPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    fixture = TestBed.createComponent(SignInPage);
    await fixture.whenStable();
  });
  afterEach(() => http.verify());

  it('shows what is missing and sends nothing when the form is empty', async () => {
    await submit();
    const errors = Array.from(el().querySelectorAll('mat-error'), (e) => e.textContent?.trim());
    expect(errors).toEqual(['Enter your e-mail address', 'Enter your password']);
    http.expectNone('/api/v1/auth/sign-in');
  });

  it('rejects an address that is not an e-mail', async () => {
    type('email', 'dana-at-example');
    type('password', 'secret');
    await submit();
    expect(el().querySelector('mat-error')?.textContent).toContain('Enter a valid e-mail address');
    http.expectNone('/api/v1/auth/sign-in');
  });

  it('signs in with the trimmed e-mail and goes to the return URL', async () => {
    fixture.componentRef.setInput('returnUrl', '/team');
    // An e-mail input strips spaces itself, so put them on the control as a paste could.
    fixture.componentInstance['form'].controls.email.setValue('  dana@example.com  ');
    type('password', 'correct horse battery');
    await submit();
    const req = http.expectOne({ method: 'POST', url: '/api/v1/auth/sign-in' });
    expect(req.request.body).toEqual({ email: 'dana@example.com', password: 'correct horse battery' });
    req.flush(signedInSession('owner'));
    await until(() => navigateByUrl.calls.any(), 'the navigation after signing in');
    expect(navigateByUrl).toHaveBeenCalledWith('/team');
  });

  it("shows the server's message when the credentials are refused", async () => {
    type('email', 'dana@example.com');
    type('password', 'wrong password');
    await submit();
    http
      .expectOne('/api/v1/auth/sign-in')
      .flush(
        { error: { code: 'invalid_credentials', message: 'That e-mail and password do not match an account' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    await until(() => el().querySelector('[role="alert"]') !== null, 'the error message');
    expect(el().querySelector('[role="alert"]')?.textContent).toContain(
      'That e-mail and password do not match an account',
    );
    expect(navigateByUrl).not.toHaveBeenCalled();
    expect(el().querySelector<HTMLButtonElement>('button[type="submit"]')?.disabled).toBeFalse();
  });
});
