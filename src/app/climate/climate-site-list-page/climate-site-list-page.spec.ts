import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/auth/roles';
import type { UnitSystem } from '@shared/units/units';
import type { ClimateSiteSummary } from '@shared/climate/climate-schemas';
import { AuthStore } from '../../auth/auth-store';
import { aSummary, sessionWithUnits } from '../testing/climate-fixtures';
import { ClimateSiteListPage } from './climate-site-list-page';
import { nextRequest } from '../../testing/until';

const threeSites: ClimateSiteSummary[] = [
  aSummary({ id: '5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c41', name: 'Maple Ridge airport' }),
  aSummary({
    id: '5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c42',
    name: 'Harbour point',
    sourceKind: 'published',
    firstYear: null,
    lastYear: null,
    qualifyingYearCount: null,
  }),
  aSummary({ id: '5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c43', name: 'Cold Hollow', isDemo: true }),
];

describe('ClimateSiteListPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [ClimateSiteListPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(role: Role, sites: ClimateSiteSummary[], units: UnitSystem = 'SI') {
    TestBed.inject(AuthStore).setSession(sessionWithUnits(role, units));
    const fixture = TestBed.createComponent(ClimateSiteListPage);
    fixture.detectChanges();
    (await nextRequest(http, { method: 'GET', url: '/api/v1/climate-sites' })).flush(sites);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const actions = Array.from(el.querySelectorAll('a, button'), (b) => b.textContent?.trim() ?? '');
    const rowNames = () => Array.from(el.querySelectorAll('tr.mat-mdc-row .name a'), (a) => a.textContent?.trim());
    return { fixture, el, actions, rowNames };
  }

  it('lists sites with source, years and heating values', async () => {
    const { el, rowNames } = await render('viewer', threeSites);
    expect(el.querySelector('h1')?.textContent).toBe('Climate sites');
    expect(rowNames()).toEqual(['Maple Ridge airport', 'Harbour point', 'Cold Hollow']);
    const firstRow = Array.from(el.querySelectorAll('tr.mat-mdc-row')[0]?.querySelectorAll('td') ?? [], (td) =>
      td.textContent?.trim(),
    );
    expect(firstRow.slice(0, 6)).toEqual([
      'Maple Ridge airport',
      'Hourly record',
      '1995–2024 (30)',
      '−20.0 °C',
      '−17.5 °C',
      '36 m',
    ]);
    expect(el.textContent).toContain('Published values');
    expect(el.querySelectorAll('.demo-chip').length).toBe(1);
    expect(el.querySelector('.demo-chip')?.textContent?.trim()).toBe('Invented demo');
  });

  it('shows heating values in °F for an IP user', async () => {
    const { el } = await render('viewer', [threeSites[0]!], 'IP');
    const cells = Array.from(el.querySelectorAll('tr.mat-mdc-row td'), (td) => td.textContent?.trim());
    // −20 °C × 9/5 + 32 = −4 °F; 36 m / 0.3048 = 118 ft.
    expect(cells).toContain('−4 °F');
    expect(cells).toContain('118 ft');
  });

  it('narrows the rows with the filter box', async () => {
    const { el, fixture, rowNames } = await render('viewer', threeSites);
    const input = el.querySelector<HTMLInputElement>('input[type="search"]')!;
    input.value = 'maple';
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(rowNames()).toEqual(['Maple Ridge airport']);

    input.value = 'published';
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(rowNames()).toEqual(['Harbour point']);

    input.value = 'nowhere at all';
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    expect(rowNames()).toEqual([]);
    expect(el.textContent).toContain('No site matches');
  });

  it('offers both ways of adding a site to designers', async () => {
    const { actions } = await render('designer', threeSites);
    expect(actions.some((t) => t.includes('New site from published values'))).toBeTrue();
    expect(actions.some((t) => t.includes('New site from hourly data'))).toBeTrue();
  });

  it('hides the buttons that add sites from viewers', async () => {
    const { actions, el } = await render('viewer', []);
    expect(actions.some((t) => t.includes('New site'))).toBeFalse();
    expect(el.textContent).toContain('No climate sites yet');
    expect(el.textContent).toContain('Designers and owners in your organisation can add climate sites.');
  });
});
