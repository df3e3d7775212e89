import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import type { UnitSystem } from '@shared/units/units';
import type { Role } from '@shared/auth/roles';
import type { Building } from '@shared/building/building-schemas';
import { AuthStore } from '../../auth/auth-store';
import { sessionWithUnits } from '../../climate/testing/climate-fixtures';
import { settle } from '../../testing/test-sessions';
import { nextRequest } from '../../testing/until';
import { LIST_ID, aBuilding, aSite, anEquipmentList } from '../testing/building-fixtures';
import { BuildingSection } from './building-section';

const PROJECT_ID = '0b6f1c3e-9d2a-4e5b-8c7d-6e5f4a3b2c00';
const SITE_ID = '5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c41';
const BUILDING_URL = `/api/v1/projects/${PROJECT_ID}/building`;
const STALE_MESSAGE = 'Sam Reed changed this project since you opened it; reload to see their changes';

interface Setup {
  role?: Role;
  units?: UnitSystem;
  building?: Building | null;
  version?: number;
  siteId?: string | null;
  listId?: string | null;
}

describe('BuildingSection', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [BuildingSection],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(setup: Setup = {}) {
    const { role = 'designer', units = 'SI', building = null, version = 4, siteId = SITE_ID, listId = null } = setup;
    const auth = TestBed.inject(AuthStore);
    auth.setSession(sessionWithUnits(role, units));
    const fixture = TestBed.createComponent(BuildingSection);
    fixture.componentRef.setInput('projectId', PROJECT_ID);
    fixture.componentRef.setInput('climateSiteId', siteId);
    fixture.componentRef.setInput('climateSiteName', siteId ? 'Lakeview station' : null);
    fixture.componentRef.setInput('equipmentListId', listId);
    fixture.componentRef.setInput('projectVersion', version);
    fixture.detectChanges();
    (await nextRequest(http, { method: 'GET', url: BUILDING_URL })).flush({ version, building });
    if (siteId) http.expectOne({ method: 'GET', url: `/api/v1/climate-sites/${siteId}` }).flush(aSite(siteId));
    if (listId) http.expectOne({ method: 'GET', url: `/api/v1/equipment-lists/${listId}` }).flush(anEquipmentList());
    const stable = async () => {
      await settle();
      await fixture.whenStable();
    };
    await stable();
    const el = fixture.nativeElement as HTMLElement;
    const text = () => el.textContent?.replace(/\s+/g, ' ') ?? '';
    const formField = (label: string, root: ParentNode = el) =>
      Array.from(root.querySelectorAll('mat-form-field')).find(
        (f) => f.querySelector('mat-label')?.textContent?.trim() === label,
      );
    const field = (label: string, root: ParentNode = el) =>
      formField(label, root)?.querySelector<HTMLInputElement>('input') ?? null;
    const errorOf = (label: string) => formField(label)?.querySelector('mat-error')?.textContent?.trim() ?? '';
    const type = async (label: string, value: string, root: ParentNode = el) => {
      const input = field(label, root);
      expect(input).withContext(`field ${label}`).not.toBeNull();
      input!.value = value;
      input!.dispatchEvent(new Event('input'));
      input!.dispatchEvent(new Event('blur'));
      await stable();
    };
    /** A button by its words (an icon's ligature is not part of them). */
    const button = (label: string) =>
      Array.from(el.querySelectorAll<HTMLButtonElement>('button')).find(
        (b) => b.textContent?.replace(b.querySelector('mat-icon')?.textContent ?? '', '').trim() === label,
      );
    const click = async (label: string) => {
      const b = button(label);
      expect(b).withContext(`button ${label}`).toBeDefined();
      b!.click();
      await stable();
    };
    const radio = async (value: string) => {
      const input = el.querySelector<HTMLInputElement>(`mat-radio-button[value="${value}"] input`);
      expect(input).withContext(`radio ${value}`).not.toBeNull();
      input!.click();
      await stable();
    };
    const designLoad = () => el.querySelector('[data-testid="design-load"]')?.textContent?.trim() ?? '';
    const setUnits = async (system: UnitSystem) => {
      auth.setSession(sessionWithUnits(role, system));
      await stable();
    };
    return { fixture, el, text, field, errorOf, type, button, click, radio, designLoad, setUnits, stable };
  }

  /** Fills the air leakage and thermal mass of a new building (the modes open by default). */
  async function fillTheRest(t: Awaited<ReturnType<typeof render>>) {
    await t.type('Air changes at 50 Pa', '3');
    await t.type('Heated volume', '10000');
    await t.type('Heated floor area', '1500');
  }

  it('sends values typed in IP units in SI', async () => {
    const t = await render({ units: 'IP' });
    expect(t.field('Conduction UA')?.closest('mat-form-field')?.textContent).toContain('Btu/(h·°F)');
    await t.type('Indoor design temperature', '68');
    await t.type('Conduction UA', '100');
    await fillTheRest(t);
    await t.click('Save building');
    const put = http.expectOne({ method: 'PUT', url: BUILDING_URL });
    const body = put.request.body as { version: number; building: Building };
    expect(body.version).toBe(4);
    const b = body.building;
    // 100 Btu/(h·°F) = 100 × 1055.056 J / 3600 s per 5/9 K = 52.753 W/K.
    expect(b.conduction).toEqual({ mode: 'ua', uaWPerK: jasmine.any(Number) });
    expect(b.conduction.mode === 'ua' && b.conduction.uaWPerK).toBeCloseTo(52.753, 3);
    // 68 °F = 20 °C.
    expect(b.indoorDesignC).toBeCloseTo(20, 9);
    expect(b.airLeakage.mode).toBe('ach50');
    // 10 000 ft³ = 283.168 m³; ACH50 and the n-factor have no unit to convert.
    if (b.airLeakage.mode === 'ach50') {
      expect(b.airLeakage.volumeM3).toBeCloseTo(283.168, 3);
      expect(b.airLeakage.ach50).toBe(3);
      expect(b.airLeakage.nFactor).toBe(20);
    }
    // 1500 ft² = 139.355 m².
    expect(b.thermalMass.mode === 'class' && b.thermalMass.floorAreaM2).toBeCloseTo(139.355, 3);
    put.flush({ version: 5, building: b });
    await t.stable();
    expect(t.field('Conduction UA')?.value).toBe('100');
  });

  it('keeps the saved SI values exactly when the unit system is switched back and forth', async () => {
    const building = aBuilding({
      indoorDesignC: 20.5,
      conduction: { mode: 'ua', uaWPerK: 123.456 },
      airLeakage: { mode: 'ach50', ach50: 2.7, volumeM3: 412.3, nFactor: 17.3 },
      designWind: { source: 'custom', customMs: 5.55 },
      ventilation: { flowLps: 33.3, heatRecoveryEffectiveness: 0.72 },
      internalGainsW: 612.5,
      thermalMass: { mode: 'class', class: 'heavy', floorAreaM2: 187.7 },
    });
    const t = await render({ building });
    expect(t.field('Conduction UA')?.value).toBe('123.456');
    await t.setUnits('IP');
    // 123.456 W/K ≈ 234.03 Btu/(h·°F); 20.5 °C = 68.9 °F.
    expect(Number(t.field('Conduction UA')?.value)).toBeCloseTo(234.03, 1);
    expect(t.field('Indoor design temperature')?.value).toBe('68.9');
    expect(t.field('Heat-recovery effectiveness')?.value).toBe('72');
    await t.setUnits('SI');
    await t.setUnits('IP');
    await t.click('Save building');
    const put = http.expectOne({ method: 'PUT', url: BUILDING_URL });
    expect(put.request.body).toEqual({ version: 4, building });
    put.flush({ version: 5, building });
    await t.stable();
  });

  it('updates the design load text as UA changes, at the 99 % or 99.6 % temperature', async () => {
    const t = await render({ building: aBuilding() });
    // 200 W/K × (21 − (−17.5)) K = 7700 W.
    expect(t.designLoad()).toBe('7.7 kW');
    await t.type('Conduction UA', '400');
    expect(t.designLoad()).toBe('15.4 kW');
    const toggle = Array.from(t.el.querySelectorAll<HTMLButtonElement>('mat-button-toggle button')).find((b) =>
      b.textContent?.includes('99.6 %'),
    );
    toggle!.click();
    await t.stable();
    // 400 W/K × 41 K = 16 400 W.
    expect(t.designLoad()).toBe('16.4 kW');
    await t.setUnits('IP');
    // 16 400 W = 55 959 Btu/h → nearest 100.
    expect(t.designLoad()).toBe('56,000 Btu/h');
    http.expectNone({ method: 'PUT' });
  });

  it('shows the breakdown and the chart with the equipment list’s heat pump and its balance point', async () => {
    const t = await render({ building: aBuilding(), listId: LIST_ID });
    expect(t.el.querySelector('[data-testid="heat-loss-breakdown"]')).not.toBeNull();
    expect(t.el.querySelector('[data-testid="heat-loss-chart"]')).not.toBeNull();
    const figures = Array.from(t.el.querySelectorAll('[data-testid="heat-loss-figures"] > div')).map(
      (row) =>
        `${row.querySelector('dt')?.textContent?.trim() ?? ''}: ${row.querySelector('dd')?.textContent?.trim() ?? ''}`,
    );
    expect(figures).toEqual([
      'Conduction: 7.7 kW',
      'Infiltration: 0 W',
      'Ventilation: 0 W',
      'Duct loss (0 %): 0 W',
      'Total heat loss: 7.7 kW',
      'Design load (sizing margin 0 %): 7.7 kW',
    ]);
    const equipment = t.el.querySelector('[data-testid="equipment-at-design"]')?.textContent?.replace(/\s+/g, ' ');
    // Held at 8000 W below −8.3 °C, the compressor meets 200 W/K × (21 − T) at T = −19 °C.
    expect(equipment).toContain('Cold-climate heat pump 3 t:');
    expect(equipment).toContain('balance point −19.0 °C');
    expect(equipment).toContain('Gas furnace 60k: 16.9 kW output');
    expect(t.text()).toContain('not a room-by-room load calculation');
  });

  it('on a conflicting save keeps the typed values, and puts them back over the reloaded building', async () => {
    const t = await render({ building: aBuilding() });
    await t.type('Conduction UA', '250');
    await t.click('Save building');
    http
      .expectOne({ method: 'PUT', url: BUILDING_URL })
      .flush({ error: { code: 'stale_update', message: STALE_MESSAGE } }, { status: 409, statusText: 'Conflict' });
    await t.stable();
    expect(t.el.querySelector('[data-testid="building-error"]')?.textContent).toContain(STALE_MESSAGE);
    expect(t.field('Conduction UA')?.value).toBe('250');
    expect(t.designLoad()).toBe('9.6 kW');

    await t.click('Reload');
    http.expectOne({ method: 'GET', url: BUILDING_URL }).flush({
      version: 6,
      building: aBuilding({ conduction: { mode: 'ua', uaWPerK: 180 } }),
    });
    await t.stable();
    expect(t.field('Conduction UA')?.value).toBe('180');
    expect(t.el.querySelector('[data-testid="building-kept"]')).not.toBeNull();

    await t.click('Put my values back');
    expect(t.field('Conduction UA')?.value).toBe('250');
    await t.click('Save building');
    const put = http.expectOne({ method: 'PUT', url: BUILDING_URL });
    expect(put.request.body.version).toBe(6);
    expect(put.request.body.building.conduction).toEqual({ mode: 'ua', uaWPerK: 250 });
    put.flush({ version: 7, building: put.request.body.building });
    await t.stable();
    expect(t.el.querySelector('[data-testid="building-error"]')).toBeNull();
  });

  it('lets viewers read the building and its heat loss but not save', async () => {
    const t = await render({ role: 'viewer', building: aBuilding() });
    expect(t.button('Save building')).toBeUndefined();
    expect(t.field('Conduction UA')?.disabled).toBeTrue();
    expect(t.field('Indoor design temperature')?.disabled).toBeTrue();
    expect(t.text()).toContain('Designers and owners in your organisation can change it.');
    expect(t.designLoad()).toBe('7.7 kW');
    t.el.querySelector('form')!.dispatchEvent(new Event('submit'));
    await t.stable();
    http.expectNone({ method: 'PUT' });
  });

  it('puts the server’s field messages under the fields their paths name', async () => {
    const t = await render({
      building: aBuilding({ airLeakage: { mode: 'ach50', ach50: 4, volumeM3: 300, nFactor: 18 } }),
    });
    await t.click('Save building');
    http.expectOne({ method: 'PUT', url: BUILDING_URL }).flush(
      {
        error: {
          code: 'invalid_input',
          message: 'Some fields are not valid',
          details: [
            { path: 'building.airLeakage.ach50', message: 'The ACH50 looks too high for this house' },
            { path: 'building.thermalMass.floorAreaM2', message: 'The floor area does not match the volume' },
            { path: 'version', message: 'The version of the project being changed is required' },
          ],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await t.stable();
    expect(t.errorOf('Air changes at 50 Pa')).toBe('The ACH50 looks too high for this house');
    expect(t.errorOf('Heated floor area')).toBe('The floor area does not match the volume');
    expect(t.el.querySelector('[data-testid="building-error"]')?.textContent).toContain(
      'The version of the project being changed is required',
    );
    // Changing the value clears the server's message.
    await t.type('Air changes at 50 Pa', '3.5');
    expect(t.errorOf('Air changes at 50 Pa')).toBe('');
  });

  it('checks a new building with the shared schema before sending it', async () => {
    const t = await render();
    expect(t.text()).toContain('Fill in the conduction and air-leakage values');
    await t.click('Save building');
    http.expectNone({ method: 'PUT' });
    expect(t.el.querySelector('[data-testid="building-error"]')?.textContent).toContain('Some values need attention');
    expect(t.errorOf('Conduction UA')).toBe('Enter the conduction UA as a number (W/K)');
    expect(t.errorOf('Heated volume')).toBe('Enter the heated volume as a number (m³)');
    await t.type('Heat-recovery effectiveness', '97');
    expect(t.errorOf('Heat-recovery effectiveness')).toBe('The heat-recovery effectiveness must be at most 95 %');
  });

  it('sums the UA of the envelope list live and sends each element with its U or R', async () => {
    const t = await render({ building: aBuilding() });
    await t.radio('envelope');
    expect(t.text()).toContain('No envelope elements yet.');
    await t.click('Add element');
    const rows = () => Array.from(t.el.querySelectorAll('.envelope-row'));
    await t.type('Element', 'Walls', rows()[0]);
    await t.type('Area', '10', rows()[0]);
    await t.type('U-value', '0.5', rows()[0]);
    expect(t.el.querySelector('[data-testid="envelope-ua"]')?.textContent?.trim()).toBe('5.0 W/K');
    await t.click('Add element');
    const kind = rows()[1]!.querySelector<HTMLElement>('mat-select')!;
    kind.click();
    await t.stable();
    const rOption = Array.from(document.querySelectorAll<HTMLElement>('mat-option')).find(
      (o) => o.textContent?.trim() === 'R-value',
    );
    rOption!.click();
    await t.stable();
    await t.type('Element', 'Roof', rows()[1]);
    await t.type('Area', '20', rows()[1]);
    await t.type('R-value', '4', rows()[1]);
    expect(t.el.querySelector('[data-testid="envelope-ua"]')?.textContent?.trim()).toBe('10.0 W/K');
    // 10 W/K × 38.5 K = 385 W.
    expect(t.designLoad()).toBe('385 W');
    await t.click('Save building');
    const put = http.expectOne({ method: 'PUT', url: BUILDING_URL });
    expect(put.request.body.building.conduction).toEqual({
      mode: 'envelope',
      components: [
        { label: 'Walls', areaM2: 10, uValue: 0.5 },
        { label: 'Roof', areaM2: 20, rValue: 4 },
      ],
    });
    put.flush({ version: 5, building: put.request.body.building });
    await t.stable();
  });

  it('asks for an outdoor temperature when the project has no climate site', async () => {
    const t = await render({ building: aBuilding(), siteId: null });
    expect(t.el.querySelector('[data-testid="no-site-note"]')?.textContent).toContain(
      'No climate site is chosen for this project',
    );
    // 200 W/K × (21 − (−20)) K = 8200 W.
    expect(t.designLoad()).toBe('8.2 kW');
    await t.type('Outdoor design temperature', '-9');
    expect(t.designLoad()).toBe('6.0 kW');
  });

  it('takes the n-factor from the table with its source', async () => {
    const t = await render({
      building: aBuilding({ airLeakage: { mode: 'ach50', ach50: 4, volumeM3: 300, nFactor: 20 } }),
    });
    await t.click('Pick the n-factor from the table');
    expect(t.text()).toContain('Sherman (1987)');
    // Zone 2, two storeys, normal shielding: 18.5 × 0.8 × 1.0.
    expect(t.el.querySelector('[data-testid="n-factor-table-value"]')?.textContent?.trim()).toBe('14.8');
    await t.click('Use this n-factor');
    expect(t.field('n-factor')?.value).toBe('14.8');
  });
});
