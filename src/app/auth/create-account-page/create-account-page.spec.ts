import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter, Router } from '@angular/router';
import { settle, signedInSession } from '../../testing/test-sessions';
import { CreateAccountPage } from './create-account-page';

describe('CreateAccountPage', () => {
  let fixture: ComponentFixture<CreateAccountPage>;
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
  async function submit(): Promise<void> {
    el().querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    await fixture.whenStable();
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [CreateAccountPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = spyOn(TestBed.inject(Router), 'navigateByUrl').and.resolveTo(true);
    fixture = TestBed.createComponent(CreateAccountPage);
    await fixture.whenStable();
  });
  afterEach(() => http.verify());

  it('rejects a password shorter than 12 characters', async () => {
    type('name', 'Dana Frost');
    type('email', 'dana@example.com');
    type('password', 'short-pass1');
    await submit();
    expect(fieldText('password')).toBe('Use at least 12 characters');
    http.expectNone('/api/v1/auth/sign-up');
  });

  it('sends the account without an empty organisation name, then goes to projects', async () => {
    type('name', ' Dana Frost ');
    type('email', 'dana@example.com');
    type('password', 'twelve chars ok');
    await submit();
    const req = http.expectOne({ method: 'POST', url: '/api/v1/auth/sign-up' });
    expect(req.request.body).toEqual({ name: 'Dana Frost', email: 'dana@example.com', password: 'twelve chars ok' });
    req.flush(signedInSession('owner'), { status: 201, statusText: 'Created' });
    await settle();
    expect(navigateByUrl).toHaveBeenCalledWith('/projects');
  });

  it("puts the server's field messages on the fields they name", async () => {
    type('name', 'Dana Frost');
    type('email', 'dana@example.com');
    type('password', 'twelve chars ok');
    type('organizationName', 'Frost Heating');
    await submit();
    http.expectOne('/api/v1/auth/sign-up').flush(
      {
        error: {
          code: 'invalid_input',
          message: 'Some fields are not valid',
          details: [
            { path: 'email', message: 'That address cannot receive mail' },
            { path: 'organizationName', message: 'Pick another name' },
          ],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    await fixture.whenStable();
    expect(fieldText('email')).toBe('That address cannot receive mail');
    expect(fieldText('organizationName')).toBe('Pick another name');
    expect(el().querySelector('[role="alert"]')?.textContent).toContain('Some fields are not valid');
    expect(navigateByUrl).not.toHaveBeenCalled();
  });

  it('shows the message of a taken e-mail above the form', async () => {
    type('name', 'Dana Frost');
    type('email', 'dana@example.com');
    type('password', 'twelve chars ok');
    await submit();
    http
      .expectOne('/api/v1/auth/sign-up')
      .flush(
        { error: { code: 'email_taken', message: 'An account with that e-mail already exists' } },
        { status: 409, statusText: 'Conflict' },
      );
    await settle();
    await fixture.whenStable();
    expect(el().querySelector('[role="alert"]')?.textContent).toContain('An account with that e-mail already exists');
  });
});
