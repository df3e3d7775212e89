import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import { App } from './app';
import { settle, signedInSession, signedOutSession } from './testing/test-sessions';

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
    await settle();
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
    const { el, fixture } = await render();
    const ip = Array.from(el.querySelectorAll<HTMLButtonElement>('mat-button-toggle button')).find(
      (b) => b.textContent?.trim() === 'IP',
    );
    ip?.click();
    await fixture.whenStable();
    const req = http.expectOne({ method: 'PATCH', url: '/api/v1/me' });
    expect(req.request.body).toEqual({ unitSystem: 'IP' });
    const session = signedInSession('owner');
    req.flush({ ...session, user: session.user && { ...session.user, unitSystem: 'IP' } });
    await settle();
    await fixture.whenStable();
    const checked = el.querySelector('mat-button-toggle.mat-button-toggle-checked');
    expect(checked?.textContent?.trim()).toBe('IP');
  });
});
