import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { UnitSystem } from '@shared/units/units';
import type { ClimateSite } from '@shared/climate/climate-schemas';
import { AuthStore } from '../../auth/auth-store';
import { aPublishedSite, sessionWithUnits } from '../testing/climate-fixtures';
import { ClimateSiteForm } from './climate-site-form';
import { until } from '../../testing/until';

describe('ClimateSiteForm (published values)', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [ClimateSiteForm],
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(units: UnitSystem, site: ClimateSite | null = null) {
    TestBed.inject(AuthStore).setSession(sessionWithUnits('designer', units));
    const fixture = TestBed.createComponent(ClimateSiteForm);
    fixture.componentRef.setInput('sourceKind', 'published');
    fixture.componentRef.setInput('site', site);
    const saved: ClimateSite[] = [];
    fixture.componentInstance.saved.subscribe((s) => saved.push(s));
    fixture.detectChanges();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const type = (selector: string, value: string) => {
      const input = el.querySelector<HTMLInputElement | HTMLTextAreaElement>(selector);
      if (!input) throw new Error(`No field ${selector}`);
      input.value = value;
      input.dispatchEvent(new Event('input'));
    };
    const field = (path: string) => `input[data-field="${path}"]`;
    const submit = async () => {
      el.querySelector<HTMLButtonElement>('button[type="submit"]')!.click();
      await fixture.whenStable();
    };
    return { fixture, el, type, field, submit, saved };
  }

  it('labels the fields with the user’s units', async () => {
    const { el } = await render('IP');
    const labels = Array.from(el.querySelectorAll('mat-label'), (l) => l.textContent?.trim());
    expect(labels).toContain('99.6 % dry-bulb (°F)');
    expect(labels).toContain('Elevation (ft)');
    expect(labels).toContain('Humidity ratio (gr/lb)');
    expect(labels).toContain('Annual 1 % (mph)');
    expect(labels).toContain('Standard deviation (°F)');
    expect(labels).toContain('HDD, base 65 °F (°F·day)');
    const legends = Array.from(el.querySelectorAll('legend'), (l) => l.textContent?.trim());
    expect(legends).toEqual([
      'Site',
      'Source',
      'Heating',
      'Cooling',
      'Extreme annual minimum',
      'Humidification 99.6 %',
      'Humidification 99 %',
      'Wind',
      'Degree-days',
    ]);
  });

  it('sends values typed in IP units in SI', async () => {
    const { type, field, submit, saved } = await render('IP');
    type('input[formcontrolname="name"]', 'Hilltop (table)');
    type('input[formcontrolname="source"]', 'Regional design table, 2020 edition');
    type(field('publishedValues.heating.db99_6'), '0');
    type(field('publishedValues.heating.db99'), '5');
    type(field('elevationM'), '1000');
    type(field('publishedValues.wind.annual1'), '10');
    type(field('publishedValues.humidification.dp99_6.humidityRatio'), '7');
    type(field('publishedValues.hdd18'), '9000');
    await submit();

    const req = http.expectOne({ method: 'POST', url: '/api/v1/climate-sites' });
    const body = req.request.body;
    expect(body.sourceKind).toBe('published');
    expect(body.name).toBe('Hilltop (table)');
    // (0 °F − 32) × 5/9 = −17.78 °C; (5 − 32) × 5/9 = −15 °C.
    expect(body.publishedValues.heating.db99_6).toBeCloseTo(-17.78, 2);
    expect(body.publishedValues.heating.db99).toBeCloseTo(-15, 6);
    // 1000 ft × 0.3048 = 304.8 m; 10 mph × 0.44704 = 4.4704 m/s; 7 gr/lb = 1 g/kg; 9000 °F·day × 5/9 = 5000 °C·day.
    expect(body.elevationM).toBeCloseTo(304.8, 6);
    expect(body.publishedValues.elevation).toBeCloseTo(304.8, 6);
    expect(body.publishedValues.wind.annual1).toBeCloseTo(4.47, 2);
    expect(body.publishedValues.humidification.dp99_6.humidityRatio).toBeCloseTo(1, 6);
    expect(body.publishedValues.hdd18).toBeCloseTo(5000, 6);
    expect(body.publishedValues.source).toBe('Regional design table, 2020 edition');
    expect(body.publishedValues.cooling).toBeUndefined();

    req.flush({ ...aPublishedSite(), name: 'Hilltop (table)' });
    await until(() => saved.length > 0, 'the saved site to be passed on');
    expect(saved.map((s) => s.name)).toEqual(['Hilltop (table)']);
  });

  it('puts a server field error on its field', async () => {
    const { type, field, submit, el, saved } = await render('SI');
    type('input[formcontrolname="name"]', 'Hilltop (table)');
    type('input[formcontrolname="source"]', 'Regional table');
    type(field('publishedValues.heating.db99_6'), '-10');
    type(field('publishedValues.heating.db99'), '-12');
    await submit();

    http.expectOne({ method: 'POST', url: '/api/v1/climate-sites' }).flush(
      {
        error: {
          code: 'invalid_input',
          message: 'Some values need attention',
          details: [
            {
              path: 'publishedValues.heating.db99_6',
              message: 'The 99.6 % heating dry-bulb cannot be warmer than the 99 % value',
            },
          ],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await until(() => el.querySelector('[role="alert"]') !== null, 'the form-level error message');

    const input = el.querySelector(field('publishedValues.heating.db99_6'))!;
    const formField = input.closest('mat-form-field')!;
    expect(formField.querySelector('mat-error')?.textContent).toContain(
      'The 99.6 % heating dry-bulb cannot be warmer than the 99 % value',
    );
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Some values need attention');
    expect(saved).toEqual([]);
  });

  it('asks for the heating values and the source before sending', async () => {
    const { type, submit, el } = await render('SI');
    type('input[formcontrolname="name"]', 'Hilltop (table)');
    await submit();
    http.expectNone({ method: 'POST', url: '/api/v1/climate-sites' });
    const errors = Array.from(el.querySelectorAll('mat-error'), (e) => e.textContent?.trim());
    expect(errors).toContain('Name the source of these values');
    expect(errors).toContain('Enter the 99.6 % dry-bulb');
  });

  it('shows a published site’s stored values in °F for editing and saves with PATCH', async () => {
    const { el, field, submit, saved } = await render('IP', aPublishedSite());
    // −20 °C = −4 °F; −17.5 °C = 0.5 °F.
    expect(el.querySelector<HTMLInputElement>(field('publishedValues.heating.db99_6'))!.value).toBe('-4');
    expect(el.querySelector<HTMLInputElement>(field('publishedValues.heating.db99'))!.value).toBe('0.5');
    await submit();
    const req = http.expectOne({ method: 'PATCH', url: `/api/v1/climate-sites/${aPublishedSite().id}` });
    expect(req.request.body.publishedValues.heating.db99_6).toBeCloseTo(-20, 6);
    expect(req.request.body.sourceKind).toBeUndefined();
    req.flush(aPublishedSite());
    await until(() => saved.length > 0, 'the saved site to be passed on');
  });
});
