import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Router, provideRouter } from '@angular/router';
import type { Role } from '@shared/auth/roles';
import type { EnergyPricesAnswer, EquipmentListSummary } from '@shared/equipment/equipment-schemas';
import { AuthStore } from '../../auth/auth-store';
import { settle, signedInSession } from '../../testing/test-sessions';
import { aList, aSummary, listId } from '../testing/equipment-fixtures';
import { EquipmentListsPage } from './equipment-lists-page';
import { nextRequest } from '../../testing/until';

const LISTS_URL = '/api/v1/equipment-lists';
const PRICES_URL = '/api/v1/energy-prices';

const twoLists: EquipmentListSummary[] = [
  aSummary('Gas furnaces 2026', { id: listId(1), optionCount: 4, version: 2 }),
  aSummary('Cold-climate heat pumps', { id: listId(2), optionCount: 1, updatedAt: '2026-01-20T10:00:00.000Z' }),
];

describe('EquipmentListsPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [EquipmentListsPage],
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

  async function render(
    role: Role,
    lists: EquipmentListSummary[],
    prices: EnergyPricesAnswer = { version: 0, prices: null },
  ) {
    TestBed.inject(AuthStore).setSession(signedInSession(role));
    const fixture = TestBed.createComponent(EquipmentListsPage);
    fixture.detectChanges();
    (await nextRequest(http, { method: 'GET', url: LISTS_URL })).flush(lists);
    http.expectOne({ method: 'GET', url: PRICES_URL }).flush(prices);
    await stable(fixture);
    const el = fixture.nativeElement as HTMLElement;
    /** An element by its data-testid (typed as an input: buttons and links are only clicked or read). */
    const byTestId = (id: string) => el.querySelector<HTMLInputElement>(`[data-testid="${id}"]`);
    const type = async (id: string, text: string) => {
      const input = byTestId(id)!;
      input.value = text;
      input.dispatchEvent(new Event('input'));
      await stable(fixture);
    };
    const buttons = () => Array.from(el.querySelectorAll('button'), (b) => b.textContent?.trim() ?? '');
    const rowAction = async (name: string, item: string) => {
      el.querySelector<HTMLButtonElement>(`button[aria-label="Actions for ${name}"]`)!.click();
      await stable(fixture);
      const items = Array.from(document.querySelectorAll<HTMLButtonElement>('.cdk-overlay-container [mat-menu-item]'));
      const found = items.find((b) => b.textContent?.includes(item));
      expect(found).withContext(`menu item ${item}`).toBeDefined();
      found!.click();
      await stable(fixture);
    };
    return { fixture, el, byTestId, type, buttons, rowAction };
  }

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

  it('lists the equipment lists with their option counts, each linking to its page', async () => {
    const { el } = await render('viewer', twoLists);
    expect(el.querySelector('h1')?.textContent).toBe('Equipment');
    const headers = Array.from(el.querySelectorAll('table[data-testid="lists-table"] th'), (th) =>
      th.textContent?.trim(),
    );
    expect(headers).toEqual(['Name', 'Options', 'Updated']);
    const cells = Array.from(el.querySelectorAll('tr.mat-mdc-row')[0]!.querySelectorAll('td'), (td) =>
      td.textContent?.trim(),
    );
    expect(cells).toEqual(['Gas furnaces 2026', '4', 'Feb 3, 2026']);
    expect(el.querySelector('td.name a')?.getAttribute('href')).toBe(`/equipment-lists/${listId(1)}`);
    expect(el.querySelector('[data-testid="safety-note"]')?.textContent).toContain(
      'manufacturer’s data, which governs',
    );
  });

  it('hides creating, renaming, deleting and saving prices from viewers', async () => {
    const { el, buttons, byTestId } = await render('viewer', twoLists);
    expect(buttons().some((t) => t.includes('New equipment list'))).toBeFalse();
    expect(el.querySelectorAll('button[aria-label^="Actions for "]').length).toBe(0);
    expect(byTestId('prices-save')).toBeNull();
    expect(byTestId('prices-electricity')!.disabled).toBeTrue();
  });

  it('creates a list in a dialog and opens it', async () => {
    const { fixture, byTestId } = await render('designer', []);
    expect(byTestId('no-lists')?.textContent).toContain('No equipment lists yet');
    const navigate = spyOn(TestBed.inject(Router), 'navigate').and.resolveTo(true);
    byTestId('new-list')!.click();
    await stable(fixture);
    const d = dialog();
    expect(d.text).toContain('New equipment list');
    expect(d.text).toContain('List name');
    const input = d.container!.querySelector<HTMLInputElement>('[data-testid="list-name"]')!;
    input.value = '  Gas furnaces 2026 ';
    input.dispatchEvent(new Event('input'));
    d.click('Create list');
    await stable(fixture);
    const post = http.expectOne({ method: 'POST', url: LISTS_URL });
    expect(post.request.body).toEqual({ name: 'Gas furnaces 2026' });
    post.flush(aList([], { id: listId(7), name: 'Gas furnaces 2026', version: 1 }), {
      status: 201,
      statusText: 'Created',
    });
    await stable(fixture);
    expect(navigate).toHaveBeenCalledWith(['/equipment-lists', listId(7)]);
  });

  it('renames a list with the version it was listed at', async () => {
    const { fixture, rowAction } = await render('owner', twoLists);
    await rowAction('Gas furnaces 2026', 'Rename');
    const input = dialog().container!.querySelector<HTMLInputElement>('[data-testid="list-name"]')!;
    expect(input.value).toBe('Gas furnaces 2026');
    input.value = 'Gas furnaces 2027';
    input.dispatchEvent(new Event('input'));
    dialog().click('Rename');
    await stable(fixture);
    const patch = http.expectOne({ method: 'PATCH', url: `${LISTS_URL}/${listId(1)}` });
    expect(patch.request.body).toEqual({ version: 2, name: 'Gas furnaces 2027' });
    patch.flush(aList([], { id: listId(1), name: 'Gas furnaces 2027', version: 3 }));
    (await nextRequest(http, { method: 'GET', url: LISTS_URL })).flush(twoLists);
    await stable(fixture);
    expect(dialog().container).toBeNull();
  });

  it('asks before deleting and sends DELETE only after "Delete"', async () => {
    const { fixture, rowAction } = await render('designer', twoLists);
    await rowAction('Cold-climate heat pumps', 'Delete');
    expect(dialog().text).toContain('Delete Cold-climate heat pumps?');
    expect(dialog().text).toContain('its 1 option will be deleted');
    dialog().click('Cancel');
    await stable(fixture);
    http.expectNone({ method: 'DELETE' });

    await rowAction('Cold-climate heat pumps', 'Delete');
    dialog().click('Delete');
    await stable(fixture);
    http
      .expectOne({ method: 'DELETE', url: `${LISTS_URL}/${listId(2)}` })
      .flush(null, { status: 204, statusText: 'No Content' });
    (await nextRequest(http, { method: 'GET', url: LISTS_URL })).flush(twoLists.slice(0, 1));
    await stable(fixture);
    expect((fixture.nativeElement as HTMLElement).textContent).not.toContain('Cold-climate heat pumps');
  });

  it('saves energy prices as decimal text, leaving out fuels without a price', async () => {
    const { fixture, byTestId, type } = await render('designer', twoLists);
    expect(byTestId('no-prices')?.textContent).toContain('No energy prices saved yet');
    await type('prices-electricity', ' 0.1420 ');
    await type('prices-gas', '0.45');
    await type('prices-oil', '1.35');
    byTestId('prices-save')!.click();
    await stable(fixture);
    const put = http.expectOne({ method: 'PUT', url: PRICES_URL });
    expect(put.request.body).toEqual({
      version: 0,
      prices: { currency: 'USD', electricityPerKwh: '0.1420', gas: { unit: 'm3', price: '0.45' }, oilPerLitre: '1.35' },
    });
    const prices = (put.request.body as { prices: Record<string, unknown> }).prices;
    expect(typeof prices['electricityPerKwh']).toBe('string');
    expect(typeof prices['oilPerLitre']).toBe('string');
    put.flush({ version: 1, prices: put.request.body.prices });
    await stable(fixture);
    expect(byTestId('no-prices')).toBeNull();
  });

  it('refuses a price that is not decimal text without sending it', async () => {
    const { fixture, byTestId, type, el } = await render('designer', twoLists);
    await type('prices-electricity', '0,14');
    byTestId('prices-save')!.click();
    await stable(fixture);
    http.expectNone({ method: 'PUT' });
    expect(el.querySelector('mat-error')?.textContent).toContain('Enter a price such as 0.1523');
  });

  it('keeps typed prices when someone saved in between, and saves them over the newer version after Reload', async () => {
    const saved: EnergyPricesAnswer = { version: 3, prices: { currency: 'CAD', electricityPerKwh: '0.1300' } };
    const { fixture, byTestId, type, el } = await render('owner', twoLists, saved);
    expect(byTestId('prices-electricity')!.value).toBe('0.1300');
    await type('prices-electricity', '0.1550');
    byTestId('prices-save')!.click();
    await stable(fixture);
    http
      .expectOne({ method: 'PUT', url: PRICES_URL })
      .flush(
        { error: { code: 'stale_update', message: 'The energy prices changed since you opened them' } },
        { status: 409, statusText: 'Conflict' },
      );
    await stable(fixture);
    expect(byTestId('prices-error')?.textContent).toContain('The energy prices changed since you opened them');
    expect(byTestId('prices-electricity')!.value).toBe('0.1550');

    Array.from(el.querySelectorAll<HTMLButtonElement>('[data-testid="prices-error"] button'))
      .find((b) => b.textContent?.trim() === 'Reload')!
      .click();
    await stable(fixture);
    http
      .expectOne({ method: 'GET', url: PRICES_URL })
      .flush({ version: 4, prices: { currency: 'CAD', electricityPerKwh: '0.1400', oilPerLitre: '1.20' } });
    await stable(fixture);
    expect(byTestId('prices-reloaded')?.textContent).toContain('electricity 0.1400 per kWh');
    expect(byTestId('prices-electricity')!.value).toBe('0.1550');
    byTestId('prices-save')!.click();
    await stable(fixture);
    const put = http.expectOne({ method: 'PUT', url: PRICES_URL });
    expect(put.request.body).toEqual({ version: 4, prices: { currency: 'CAD', electricityPerKwh: '0.1550' } });
    put.flush({ version: 5, prices: put.request.body.prices });
    await stable(fixture);
  });
});
