import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/auth/roles';
import type { UnitSystem } from '@shared/auth/auth-schemas';
import type { ClimateSite } from '@shared/climate-sites/climate-site-schemas';
import { AuthStore } from '../../auth/auth-store';
import { settle } from '../../testing/test-sessions';
import { SITE_ID, aPublishedSite, anHourlySite, sessionWithUnits, someChartData } from '../testing/climate-fixtures';
import { ClimateSitePage } from './climate-site-page';

const SITE_URL = `/api/v1/climate-sites/${SITE_ID}`;

describe('ClimateSitePage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [ClimateSitePage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(site: ClimateSite, units: UnitSystem = 'SI', role: Role = 'viewer') {
    TestBed.inject(AuthStore).setSession(sessionWithUnits(role, units));
    const fixture = TestBed.createComponent(ClimateSitePage);
    fixture.componentRef.setInput('id', SITE_ID);
    fixture.detectChanges();
    await settle(1);
    http.expectOne({ method: 'GET', url: SITE_URL }).flush(site);
    await settle();
    // An open request keeps the fixture unstable: answer the chart data first when the site has a record.
    if (site.computed) {
      http.expectOne({ method: 'GET', url: `${SITE_URL}/chart-data` }).flush(someChartData());
      await settle();
    }
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    /** Label, value and explanation of one row of the design-values table. */
    const row = (key: string) => {
      const tr = el.querySelector(`[data-testid="design-values"] tr[data-key="${key}"]`);
      return ['.label', 'td.num', 'td.explain'].map((sel) => tr?.querySelector(sel)?.textContent?.trim());
    };
    return { fixture, el, row };
  }

  it('explains each heating value with the hours a year it stands for', async () => {
    const { el, row } = await render(anHourlySite());
    expect(el.querySelector('h1')?.textContent).toContain('Lakeview station');
    expect(row('heating-99.6')).toEqual([
      'Heating 99.6 %',
      '−20.0 °C',
      'Colder than this for about 35 hours in an average year (0.4 % of the hours).',
    ]);
    expect(row('heating-99')[2]).toContain('about 88 hours a year');
    expect(row('extreme-mean')[2]).toBe("Mean of each year's coldest hour.");
    expect(row('return-50')[2]).toContain('50-year night');
    expect(el.querySelector('[data-testid="record-period"]')?.textContent).toContain('1995–2024');
    expect(el.querySelector('[data-testid="design-caution"]')?.textContent).toContain(
      'Sizing decisions are governed by local codes and a licensed professional',
    );
    expect(el.querySelector('[data-testid="cdf-chart"]')).not.toBeNull();
    expect(el.querySelector('[data-testid="monthly-chart"]')).not.toBeNull();
  });

  it('shows the values in °F and ft for an IP user', async () => {
    const { el, row } = await render(anHourlySite(), 'IP');
    // −20 °C × 9/5 + 32 = −4 °F; −33.5 °C = −28.3 °F; 3 K = 5.4 °F (a difference); 36 m = 118 ft.
    expect(row('heating-99.6')[1]).toBe('−4 °F');
    expect(row('return-50')[1]).toBe('−28 °F');
    expect(row('extreme-sd')[1]).toBe('5.4 °F');
    expect(row('hdd')[0]).toBe('Heating degree-days (base 65 °F)');
    expect(el.textContent).toContain('Elevation 118 ft');
    expect(el.querySelector('[data-testid="design-values"]')?.textContent).not.toContain('°C');
  });

  it('shows a published site’s source and values without charts', async () => {
    const { el, row } = await render(aPublishedSite());
    http.expectNone(`${SITE_URL}/chart-data`);
    expect(el.querySelector('[data-testid="published-source"]')?.textContent).toContain(
      'Regional design table, 2020 edition',
    );
    expect(row('heating-99')[1]).toBe('−17.5 °C');
    expect(row('cooling-db0_4')[1]).toBe('—');
    expect(el.querySelector('[data-testid="cdf-chart"]')).toBeNull();
  });

  it('offers upload, edit and delete to designers, and nothing to viewers', async () => {
    const designer = await render(anHourlySite(), 'SI', 'designer');
    const labels = Array.from(designer.el.querySelectorAll('header button'), (b) =>
      b.textContent?.replace(/upload_file|edit(?=Edit)|delete(?=Delete)/, '').trim(),
    );
    expect(labels).toEqual(['Upload hourly data', 'Edit', 'Delete']);
    const edit = Array.from(designer.el.querySelectorAll<HTMLButtonElement>('header button')).find((b) =>
      b.textContent?.includes('Edit'),
    );
    edit?.click();
    designer.fixture.detectChanges();
    expect(designer.el.querySelector('h2')?.textContent).toContain('Edit site');
    expect(designer.el.querySelector('app-climate-site-form')).not.toBeNull();
    designer.fixture.destroy();

    const viewer = await render(aPublishedSite(), 'SI', 'viewer');
    expect(viewer.el.querySelectorAll('header button').length).toBe(0);
  });
});
