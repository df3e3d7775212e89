import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { AuthStore } from '../auth-store';
import { settle, signedOutSession } from '../../testing/test-sessions';
import { CreateAccountPage } from './create-account-page';

const SIGN_UP = '/api/v1/auth/sign-up';

describe('CreateAccountPage', () => {
  let fixture: ComponentFixture<CreateAccountPage>;
  let http: HttpTestingController;

  const el = () => fixture.nativeElement as HTMLElement;
  function input(name: string): HTMLInputElement | null {
    return el().querySelector<HTMLInputElement>(`input[formcontrolname="${name}"]`);
  }
  function type(name: string, value: string): void {
    const box = input(name);
    if (!box) throw new Error(`no input ${name}`);
    box.value = value;
    box.dispatchEvent(new Event('input'));
    box.dispatchEvent(new Event('blur'));
  }
  function fieldText(name: string): string {
    const field = input(name)?.closest('mat-form-field');
    return field?.querySelector('mat-error')?.textContent?.trim() ?? '';
  }
  function button(text: string): HTMLButtonElement {
    const found = Array.from(el().querySelectorAll<HTMLButtonElement>('button')).find(
      (b) => b.textContent?.trim() === text,
    );
    if (!found) throw new Error(`no button "${text}"`);
    return found;
  }
  async function stable(): Promise<void> {
    await settle();
    await fixture.whenStable();
  }
  async function submit(): Promise<void> {
    el().querySelector<HTMLButtonElement>('button[type="submit"]')?.click();
    await fixture.whenStable();
  }
  const sentState = () => el().querySelector('[data-testid="sign-up-sent"]');
  const alertText = () => el().querySelector('[role="alert"]')?.textContent?.trim() ?? '';
  const accepted = (email: string) => ({ email, message: 'If the address can be used, a link is on its way' });

  /** Fills the form with a valid account and sends it; the request is left open. */
  async function sendDana(): Promise<void> {
    type('name', ' Dana Frost ');
    type('email', 'dana@example.com');
    type('organizationName', 'Frost Heating');
    await submit();
  }

  beforeEach(async () => {
    TestBed.configureTestingModule({
      imports: [CreateAccountPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    TestBed.inject(AuthStore).setSession(signedOutSession());
    fixture = TestBed.createComponent(CreateAccountPage);
    await fixture.whenStable();
  });
  afterEach(() => http.verify());

  it('asks for no password: that is chosen behind the e-mailed link', () => {
    expect(el().querySelector('input[type="password"]')).toBeNull();
    const labels = Array.from(el().querySelectorAll('mat-label'), (l) => l.textContent?.trim());
    expect(labels).toEqual(['Name', 'E-mail', 'Organisation name']);
  });

  it('shows what is missing or wrong and sends nothing', async () => {
    type('email', 'dana-at-example');
    await submit();
    expect(fieldText('name')).toBe('Enter your name');
    expect(fieldText('email')).toBe('Enter a valid e-mail address');
    http.expectNone(SIGN_UP);
    expect(sentState()).toBeNull();
  });

  it('sends the trimmed fields without an empty organisation name', async () => {
    type('name', ' Dana Frost ');
    type('email', 'dana@example.com');
    type('organizationName', '   ');
    await submit();
    const req = http.expectOne({ method: 'POST', url: SIGN_UP });
    expect(req.request.body).toEqual({ name: 'Dana Frost', email: 'dana@example.com' });
    req.flush(accepted('dana@example.com'), { status: 202, statusText: 'Accepted' });
    await stable();
  });

  it('sends a return address of this site, and drops one of another site', async () => {
    fixture.componentRef.setInput('returnUrl', '/invitations/abc?x=1');
    await sendDana();
    let req = http.expectOne(SIGN_UP);
    expect(req.request.body.returnUrl).toBe('/invitations/abc?x=1');
    req.flush(
      { error: { code: 'rate_limited', message: 'Slow down' } },
      { status: 429, statusText: 'Too Many Requests' },
    );
    await stable();

    fixture.componentRef.setInput('returnUrl', '//elsewhere.example/steal');
    await submit();
    req = http.expectOne(SIGN_UP);
    expect('returnUrl' in req.request.body).toBeFalse();
    req.flush(accepted('dana@example.com'), { status: 202, statusText: 'Accepted' });
    await stable();
  });

  it('after the 202 says to check the mail, naming the address, and signs nobody in', async () => {
    await sendDana();
    http.expectOne(SIGN_UP).flush(accepted('dana@example.com'), { status: 202, statusText: 'Accepted' });
    await stable();

    const sent = sentState();
    expect(sent).not.toBeNull();
    expect(sent?.getAttribute('role')).toBe('status');
    const text = sent?.textContent ?? '';
    expect(text).toContain('dana@example.com');
    expect(text).toContain('24 hours');
    expect(text).toContain('spam');
    expect(el().querySelector('h1')?.textContent?.trim()).toBe('Check your e-mail');
    expect(el().querySelector('form')).toBeNull();
    expect(TestBed.inject(AuthStore).signedIn()).toBeFalse();
  });

  it('sends the same link request again and confirms it', async () => {
    fixture.componentRef.setInput('returnUrl', '/team');
    await sendDana();
    const first = http.expectOne(SIGN_UP);
    const firstBody: unknown = first.request.body;
    first.flush(accepted('dana@example.com'), { status: 202, statusText: 'Accepted' });
    await stable();
    expect(el().textContent).not.toContain('Sent again');

    button('Send the link again').click();
    await fixture.whenStable();
    const again = http.expectOne({ method: 'POST', url: SIGN_UP });
    expect(again.request.body).toEqual(firstBody);
    expect(again.request.body).toEqual({
      name: 'Dana Frost',
      email: 'dana@example.com',
      organizationName: 'Frost Heating',
      returnUrl: '/team',
    });
    again.flush(accepted('dana@example.com'), { status: 202, statusText: 'Accepted' });
    await stable();
    expect(sentState()?.textContent).toContain('Sent again to dana@example.com');
  });

  it('says why sending again failed and stays on the check-your-mail state', async () => {
    await sendDana();
    http.expectOne(SIGN_UP).flush(accepted('dana@example.com'), { status: 202, statusText: 'Accepted' });
    await stable();

    button('Send the link again').click();
    await fixture.whenStable();
    http
      .expectOne(SIGN_UP)
      .flush(
        { error: { code: 'rate_limited', message: 'Too many sign-ups; wait up to 15 minutes and try again' } },
        { status: 429, statusText: 'Too Many Requests' },
      );
    await stable();
    expect(alertText()).toContain('Too many sign-ups; wait up to 15 minutes and try again');
    expect(sentState()).not.toBeNull();
    expect(sentState()?.textContent).not.toContain('Sent again');
  });

  it('goes back to the form with the fields kept to use another address', async () => {
    await sendDana();
    http.expectOne(SIGN_UP).flush(accepted('dana@example.com'), { status: 202, statusText: 'Accepted' });
    await stable();

    button('Use another address').click();
    await fixture.whenStable();
    expect(sentState()).toBeNull();
    expect(input('name')?.value).toBe(' Dana Frost ');
    expect(input('email')?.value).toBe('dana@example.com');
    expect(input('organizationName')?.value).toBe('Frost Heating');
    expect(document.activeElement).toBe(input('email'));

    type('email', 'dana.frost@example.com');
    await submit();
    const req = http.expectOne(SIGN_UP);
    expect(req.request.body.email).toBe('dana.frost@example.com');
    req.flush(accepted('dana.frost@example.com'), { status: 202, statusText: 'Accepted' });
    await stable();
    expect(sentState()?.textContent).toContain('dana.frost@example.com');
  });

  it("puts the server's field messages on the fields they name", async () => {
    await sendDana();
    http.expectOne(SIGN_UP).flush(
      {
        error: {
          code: 'validation',
          message: 'Some fields are not valid',
          details: [
            { path: 'email', message: 'That address cannot receive mail' },
            { path: 'organizationName', message: 'Pick another name' },
          ],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await stable();
    expect(fieldText('email')).toBe('That address cannot receive mail');
    expect(fieldText('organizationName')).toBe('Pick another name');
    expect(alertText()).toContain('Some fields are not valid');
    expect(sentState()).toBeNull();
    expect(input('name')?.value).toBe(' Dana Frost ');
  });

  it('shows the rate limit message and keeps the form as it was', async () => {
    await sendDana();
    http
      .expectOne(SIGN_UP)
      .flush(
        { error: { code: 'rate_limited', message: 'Too many sign-ups; wait up to 15 minutes and try again' } },
        { status: 429, statusText: 'Too Many Requests' },
      );
    await stable();
    expect(alertText()).toContain('Too many sign-ups; wait up to 15 minutes and try again');
    expect(sentState()).toBeNull();
    expect(input('email')?.value).toBe('dana@example.com');
    expect(button('Continue').disabled).toBeFalse();
  });
});
