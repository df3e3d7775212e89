import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { UnitSystem } from '@shared/units/units';
import type { Role } from '@shared/auth/roles';
import type { EquipmentList, EnergyPricesAnswer } from '@shared/equipment/equipment-schemas';
import { AuthStore } from '../../auth/auth-store';
import { LIST_ID, aFurnace, aHeatPump, aList, sessionIn } from '../testing/equipment-fixtures';
import { EquipmentListPage } from './equipment-list-page';
import { settle } from '../../testing/test-sessions';
import { nextRequest, until } from '../../testing/until';

const LIST_URL = `/api/v1/equipment-lists/${LIST_ID}`;
const PRICES_URL = '/api/v1/energy-prices';
/** 1 Btu/h = 1055.05585262 J / 3600 s (International Table Btu; NIST SP 811, Appendix B). */
const W_PER_BTUH = 1055.05585262 / 3600;

const NO_PRICES: EnergyPricesAnswer = { version: 0, prices: null };

describe('EquipmentListPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [EquipmentListPage],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function stable(fixture: ComponentFixture<unknown>): Promise<void> {
    await settle();
    await fixture.whenStable();
  }

  async function render(role: Role, list: EquipmentList, units: UnitSystem = 'SI', prices = NO_PRICES) {
    TestBed.inject(AuthStore).setSession(sessionIn(role, units));
    const fixture = TestBed.createComponent(EquipmentListPage);
    fixture.componentRef.setInput('id', LIST_ID);
    fixture.detectChanges();
    (await nextRequest(http, { method: 'GET', url: LIST_URL })).flush(list);
    http.expectOne({ method: 'GET', url: PRICES_URL }).flush(prices);
    await stable(fixture);
    const el = fixture.nativeElement as HTMLElement;
    /** An element by its data-testid (typed as an input: buttons and links are only clicked or read). */
    const byTestId = (id: string) => el.querySelector<HTMLInputElement>(`[data-testid="${id}"]`);
    const type = async (id: string, text: string) => {
      const input = byTestId(id);
      expect(input).withContext(`input ${id}`).not.toBeNull();
      input!.value = text;
      input!.dispatchEvent(new Event('input'));
      await stable(fixture);
    };
    /** Clicks the button reading `label` (after its icon, if it has one). */
    const click = async (label: string) => {
      const button = Array.from(el.querySelectorAll<HTMLButtonElement>('button')).find((b) => {
        const icon = b.querySelector('mat-icon')?.textContent ?? '';
        return b.textContent?.replace(icon, '').trim() === label;
      });
      expect(button).withContext(`button ${label}`).toBeDefined();
      button!.click();
      await stable(fixture);
    };
    const cellError = (id: string) =>
      byTestId(id)?.closest('mat-form-field')?.querySelector('mat-error')?.textContent?.trim() ?? '';
    const bodyRows = () =>
      el.querySelectorAll('table[data-testid="options-table"] tr.mat-mdc-row:not(.no-rows)').length;
    return { fixture, el, byTestId, type, click, cellError, bodyRows };
  }

  /** The open dialog, and a click on one of its buttons. */
  function dialog() {
    const container = document.querySelector<HTMLElement>('mat-dialog-container');
    const click = (label: string) => {
      const button = Array.from(container?.querySelectorAll<HTMLButtonElement>('button') ?? []).find(
        (b) => b.textContent?.trim() === label,
      );
      expect(button).withContext(`dialog button ${label}`).toBeDefined();
      button!.click();
    };
    return { container, text: container?.textContent?.replace(/\s+/g, ' ') ?? '', click };
  }

  it('shows capacities typed in Btu/h and saves the whole list in W with its version', async () => {
    const { fixture, byTestId, type, click } = await render('designer', aList([aFurnace(), aHeatPump()]), 'IP');
    // 23447 W and 10550 W shown in Btu/h, rounded to whole units.
    expect(byTestId('option-0-outputW')!.value).toBe(String(Math.round(23447 / W_PER_BTUH)));
    expect(byTestId('option-1-capacity8_3W')!.value).toBe(String(Math.round(10550 / W_PER_BTUH)));
    // Efficiency in % as AFUE is quoted; the heat-pump rating points as spec sheets print them in IP (47 / 17 / 5 °F).
    expect(byTestId('option-0-efficiency')!.value).toBe('96');
    const headers = fixture.nativeElement.textContent as string;
    expect(headers).toContain('Efficiency (AFUE, %)');
    expect(headers).toContain('Capacity at 47 °F');
    expect(headers).toContain('COP at 17 °F');
    expect(headers).not.toMatch(/8\.3 °C|−15 °C/);
    expect(byTestId('save')!.hasAttribute('disabled')).toBeTrue();

    await type('option-0-outputW', '60,000');
    await type('option-0-label', 'Condensing gas furnace 60k');
    await type('option-1-installedPrice', '13,950.50');
    expect(byTestId('unsaved')?.textContent).toContain('Unsaved changes');
    await click('Save changes');

    const put = http.expectOne({ method: 'PUT', url: `${LIST_URL}/options` });
    const body = put.request.body as { version: number; options: Record<string, unknown>[] };
    expect(body.version).toBe(3);
    expect(body.options.length).toBe(2);
    const furnace = body.options[0]!;
    expect(furnace['kind']).toBe('furnace');
    expect(furnace['label']).toBe('Condensing gas furnace 60k');
    // 60 000 Btu/h × 0.29307107 W per Btu/h = 17 584.26 W.
    expect(Math.abs((furnace['outputW'] as number) - 60_000 * W_PER_BTUH)).toBeLessThan(1);
    expect(Math.abs((furnace['outputW'] as number) - 17_584)).toBeLessThan(1);
    expect(furnace['efficiency']).toBe(0.96);
    expect(furnace['fuel']).toBe('gas');
    expect(furnace['installedPrice']).toBe('8450.00');
    const heatPump = body.options[1]!;
    // Powers left as shown keep their stored watts exactly, with no rounding through Btu/h.
    expect(heatPump['capacity8_3W']).toBe(10550);
    expect(heatPump['capacityM8_3W']).toBe(7030);
    expect(heatPump['backupW']).toBe(5000);
    expect(heatPump['installedPrice']).toBe('13950.50');
    // Settings not edited in the table stay as they were.
    expect(heatPump['defrostBand']).toBeTrue();
    expect(heatPump['cutoutC']).toBe(-25);

    put.flush(
      aList([aFurnace({ label: 'Condensing gas furnace 60k', outputW: 17584.26 }), aHeatPump()], { version: 4 }),
    );
    await stable(fixture);
    expect(byTestId('unsaved')).toBeNull();
    expect(byTestId('option-0-outputW')!.value).toBe('60000');
  });

  it('puts a field error from the server under its cell', async () => {
    const { byTestId, type, click, cellError, el } = await render('owner', aList([aFurnace(), aHeatPump()]));
    await type('option-1-cop8_3', '3.7');
    await click('Save changes');
    http.expectOne({ method: 'PUT', url: `${LIST_URL}/options` }).flush(
      {
        error: {
          code: 'validation_failed',
          message: 'Some values are not valid',
          details: [{ path: 'options.1.cop8_3', message: 'The COP at 8.3 °C is not plausible for this unit' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await until(() => cellError('option-1-cop8_3') !== '', 'the error under the COP cell');
    expect(cellError('option-1-cop8_3')).toBe('The COP at 8.3 °C is not plausible for this unit');
    expect(cellError('option-1-copM8_3')).toBe('');
    expect(cellError('option-0-outputW')).toBe('');
    expect(byTestId('list-error')?.textContent).toContain('Some values are not valid');
    expect(el.querySelector('[data-testid="option-1-cop8_3"]')!.getAttribute('aria-invalid')).toBe('true');
  });

  it('checks the rows before sending and sends nothing while a cell is wrong', async () => {
    const { byTestId, click, cellError, bodyRows } = await render('designer', aList([aFurnace()]));
    await click('Add row');
    expect(bodyRows()).toBe(2);
    await click('Save changes');
    http.expectNone({ method: 'PUT' });
    expect(cellError('option-1-label')).toBe('Name the equipment option');
    expect(cellError('option-1-lifeYears')).toBe('Enter the expected life as a whole number of years');
    expect(cellError('option-0-label')).toBe('');
    expect(byTestId('list-error')?.textContent).toContain('1 row needs attention');
  });

  it('puts the table back as saved with "Discard changes"', async () => {
    const { byTestId, type, click, bodyRows } = await render('designer', aList([aFurnace(), aHeatPump()]));
    await type('option-0-label', 'Something else');
    await click('Add row');
    byTestId('option-1-remove')!.click();
    await click('Discard changes');
    expect(bodyRows()).toBe(2);
    expect(byTestId('option-0-label')!.value).toBe('Condensing gas furnace 80k');
    expect(byTestId('option-1-label')!.value).toBe('Cold-climate heat pump 3 ton');
    expect(byTestId('unsaved')).toBeNull();
  });

  it('shows a viewer the options as text, prices in the organisation currency, and no edit controls', async () => {
    const prices: EnergyPricesAnswer = { version: 2, prices: { currency: 'EUR', electricityPerKwh: '0.30' } };
    const { el, byTestId } = await render('viewer', aList([aFurnace(), aHeatPump()]), 'SI', prices);
    const table = el.querySelector('table[data-testid="options-table"]')!;
    expect(table.querySelectorAll('input, mat-select, textarea').length).toBe(0);
    expect(el.querySelector('.editor')).toBeNull();
    const buttons = Array.from(el.querySelectorAll('button'), (b) => b.textContent?.trim());
    for (const label of ['Save changes', 'Add row', 'Import CSV', 'Discard changes']) {
      expect(buttons).not.toContain(label);
    }
    const firstRow = Array.from(table.querySelectorAll('tr.mat-mdc-row')[0]!.querySelectorAll('td'), (td) =>
      td.textContent?.trim(),
    );
    expect(firstRow.slice(0, 4)).toEqual(['Furnace', 'Condensing gas furnace 80k', 'Natural gas', '23,447']);
    expect(table.textContent).toContain('€8,450.00');
    expect(table.textContent).toContain('€14,200.00');
    expect(el.textContent).toContain('Installed price (EUR)');
    expect(byTestId('csv-export')!.getAttribute('href')).toBe(`${LIST_URL}/csv`);
    expect(byTestId('safety-note')?.textContent).toContain(
      'Combustion equipment must be installed and vented by qualified people',
    );
  });

  it('lists every bad line of a refused CSV and imports nothing', async () => {
    const { fixture, click, bodyRows, byTestId } = await render('designer', aList([aFurnace()]));
    await click('Import CSV');
    const textarea = dialog().container!.querySelector<HTMLTextAreaElement>('[data-testid="csv-text"]')!;
    const csv = 'kind,label,output_w,efficiency,fuel,installed_price,life_years\nfurnace,A,20000,1.5,gas,5000,20\n';
    textarea.value = csv;
    textarea.dispatchEvent(new Event('input'));
    dialog().click('Preview');
    await stable(fixture);
    const preview = http.expectOne({ method: 'POST', url: `${LIST_URL}/csv-preview` });
    expect(preview.request.body).toEqual({ csv });
    preview.flush(
      {
        error: {
          code: 'invalid_file',
          message: 'The file has 2 bad lines',
          details: [
            { path: 'line 2', message: 'efficiency: The efficiency must be at most 1 (enter 95 % as 0.95)' },
            { path: 'line 4', message: 'kind: The kind must be furnace, boiler, heat-pump or electric' },
          ],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await stable(fixture);
    const d = dialog();
    expect(d.text).toContain('Nothing was imported.');
    expect(d.text).toContain('Line 2: efficiency: The efficiency must be at most 1');
    expect(d.text).toContain('Line 4: kind: The kind must be furnace');
    expect(d.container!.querySelector('[data-testid="csv-add"]')).toBeNull();
    expect(d.container!.querySelector('[data-testid="csv-replace"]')).toBeNull();
    d.click('Cancel');
    await stable(fixture);
    expect(dialog().container).toBeNull();
    expect(bodyRows()).toBe(1);
    expect(byTestId('unsaved')).toBeNull();
    http.expectNone({ method: 'PUT' });
  });

  it('adds the options of a checked CSV to the table, to be saved with the list', async () => {
    const { fixture, click, bodyRows, byTestId } = await render('designer', aList([aFurnace()]), 'IP');
    await click('Import CSV');
    const textarea = dialog().container!.querySelector<HTMLTextAreaElement>('[data-testid="csv-text"]')!;
    textarea.value = 'kind,label\n';
    textarea.dispatchEvent(new Event('input'));
    dialog().click('Preview');
    await stable(fixture);
    const imported = [
      aHeatPump({ label: 'Ducted heat pump 2 ton' }),
      aFurnace({ label: 'Oil furnace', fuel: 'oil', efficiency: 0.85 }),
    ];
    http.expectOne({ method: 'POST', url: `${LIST_URL}/csv-preview` }).flush({ options: imported });
    await stable(fixture);
    const d = dialog();
    expect(d.text).toContain('The file holds 2 options');
    expect(d.container!.querySelectorAll('table[data-testid="csv-preview"] tr.mat-mdc-row').length).toBe(2);
    expect(d.text).toContain('Ducted heat pump 2 ton');
    d.click('Add these 2 options');
    await stable(fixture);
    expect(bodyRows()).toBe(3);
    expect(byTestId('option-1-label')!.value).toBe('Ducted heat pump 2 ton');
    expect(byTestId('unsaved')).not.toBeNull();

    await click('Save changes');
    const put = http.expectOne({ method: 'PUT', url: `${LIST_URL}/options` });
    const body = put.request.body as { version: number; options: Record<string, unknown>[] };
    expect(body.options.map((o) => o['label'])).toEqual([
      'Condensing gas furnace 80k',
      'Ducted heat pump 2 ton',
      'Oil furnace',
    ]);
    expect(body.options[1]!['capacity8_3W']).toBe(10550);
    expect(body.options[2]!['fuel']).toBe('oil');
    put.flush(aList([aFurnace(), ...imported], { version: 4 }));
    await stable(fixture);
  });

  it('keeps the edits when someone saved in between, and saves them over the newer version on request', async () => {
    const { fixture, byTestId, type, click } = await render('designer', aList([aFurnace()]));
    await type('option-0-lifeYears', '22');
    await click('Save changes');
    const message = 'Sam Reed changed this list since you opened it';
    http
      .expectOne({ method: 'PUT', url: `${LIST_URL}/options` })
      .flush({ error: { code: 'stale_update', message } }, { status: 409, statusText: 'Conflict' });
    await stable(fixture);
    expect(byTestId('list-error')?.textContent).toContain(message);
    expect(byTestId('option-0-lifeYears')!.value).toBe('22');

    await click('Keep my changes');
    http.expectOne({ method: 'GET', url: LIST_URL }).flush(aList([aFurnace(), aHeatPump()], { version: 5 }));
    await stable(fixture);
    expect(byTestId('keeping-changes')).not.toBeNull();
    expect(byTestId('option-0-lifeYears')!.value).toBe('22');
    await click('Save changes');
    const put = http.expectOne({ method: 'PUT', url: `${LIST_URL}/options` });
    const body = put.request.body as { version: number; options: Record<string, unknown>[] };
    expect(body.version).toBe(5);
    expect(body.options.length).toBe(1);
    expect(body.options[0]!['lifeYears']).toBe(22);
    put.flush(aList([aFurnace({ lifeYears: 22 })], { version: 6 }));
    await stable(fixture);
  });
});
