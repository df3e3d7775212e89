import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/auth/roles';
import type { UnitSystem } from '@shared/units/units';
import type { ClimateSite } from '@shared/climate/climate-schemas';
import { AuthStore } from '../../auth/auth-store';
import {
  SITE_ID,
  aPublishedSite,
  anHourlySite,
  sessionWithUnits,
  someChartData,
  someRecentYears,
} from '../testing/climate-fixtures';
import { ClimateSitePage } from './climate-site-page';
import { nextRequest } from '../../testing/until';

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
    (await nextRequest(http, { method: 'GET', url: SITE_URL })).flush(site);
    // An open request keeps the fixture unstable: answer the chart data first when the site has a record.
    if (site.computed) {
      (await nextRequest(http, { method: 'GET', url: `${SITE_URL}/chart-data` })).flush(someChartData());
      (await nextRequest(http, { method: 'GET', url: `${SITE_URL}/recent-years` })).flush(someRecentYears());
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

  it('shows the whole record beside its latest 10 and 15 years, and the trend sentence', async () => {
    const { el } = await render(anHourlySite());
    const table = el.querySelector('[data-testid="recent-years-table"]');
    expect(Array.from(table?.querySelectorAll('thead th') ?? [], (th) => th.textContent?.trim())).toEqual([
      'Design value',
      'Whole record2009–2024, 16 years',
      'Latest 10 years2015–2024, 10 years',
      'Latest 15 years2010–2024, 15 years',
    ]);
    expect(table?.querySelector('tbody tr td')?.textContent?.trim()).toBe('−22.4 °C');
    expect(el.querySelector('[data-testid="trend-sentence"]')?.textContent).toContain(
      'warmed by about 1.0 K per decade',
    );
  });

  it('labels a published site’s estimated record in plain words', async () => {
    const label =
      "Hour-by-hour figures estimated from Lakeview's record, adjusted to Hilltop (table)'s published values.";
    const site: ClimateSite = {
      ...aPublishedSite(),
      computed: anHourlySite().computed,
      estimate: {
        referenceSiteId: null,
        referenceSiteName: 'Lakeview',
        shiftK: -1.2,
        stretch: 0.05,
        referenceMeanC: 6.4,
        methodVersion: 'shift-stretch-1.0.0',
        matched: { db99_6: -20, hdd18: null },
        referenceComputedAt: '2026-11-20T10:00:00.000Z',
        computedAt: '2026-11-21T10:00:00.000Z',
        label,
      },
    };
    const { el } = await render(site);
    expect(
      el.querySelector('[data-testid="estimate-panel"] [data-testid="estimate-label"] span')?.textContent?.trim(),
    ).toBe(label);
    expect(el.querySelector('[data-testid="estimate-button"]')).toBeNull(); // a viewer cannot estimate
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
