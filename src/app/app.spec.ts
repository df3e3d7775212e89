import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { provideRouter } from '@angular/router';
import { App } from './app';
import { AuthStore } from './auth/auth-store';
import { signedInSession, signedOutSession } from './testing/test-sessions';
import { until } from './testing/until';

describe('App shell', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [App],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(session = signedInSession('owner')) {
    const fixture = TestBed.createComponent(App);
    fixture.detectChanges();
    http.expectOne('/api/v1/session').flush(session);
    await until(() => TestBed.inject(AuthStore).loaded(), 'the session to be read');
    await fixture.whenStable();
    return { fixture, el: fixture.nativeElement as HTMLElement };
  }

  it('shows the toolbar with navigation and the current organisation when signed in', async () => {
    const { el } = await render();
    expect(el.querySelector('.brand')?.textContent).toBe('Tailroom');
    const nav = Array.from(el.querySelectorAll('nav a'), (a) => a.textContent?.trim());
    expect(nav).toEqual(['Projects', 'Climate sites', 'Equipment', 'Team', 'Dev outbox']);
    expect(el.querySelector('.org-button')?.getAttribute('aria-label')).toBe('Organisation: Frost Heating');
    expect(el.querySelector('mat-button-toggle-group')?.getAttribute('aria-label')).toBe('Units');
  });

  it('shows no toolbar when signed out', async () => {
    const { el } = await render(signedOutSession());
    expect(el.querySelector('mat-toolbar')).toBeNull();
  });

  it('saves the unit choice through PATCH /api/v1/me', async () => {
    const { fixture } = await render();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const ip = await loader.getHarness(MatButtonToggleHarness.with({ text: 'IP' }));
    await ip.check();
    const req = http.expectOne({ method: 'PATCH', url: '/api/v1/me' });
    expect(req.request.body).toEqual({ unitSystem: 'IP' });
    const session = signedInSession('owner');
    req.flush({ ...session, user: session.user && { ...session.user, unitSystem: 'IP' } });
    await until(() => TestBed.inject(AuthStore).unitSystem() === 'IP', 'the session in IP units');
    const checked = await loader.getAllHarnesses(MatButtonToggleHarness.with({ checked: true }));
    expect(await Promise.all(checked.map((t) => t.getText()))).toEqual(['IP']);
  });
});
