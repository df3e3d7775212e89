import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/auth/roles';
import type { Scenario, SweepAnswer } from '@shared/scenarios/scenario-schemas';
import { AuthStore } from '../../auth/auth-store';
import { PROJECT_ID } from '../../projects/testing/project-fixtures';
import { signedInSession } from '../../testing/test-sessions';
import { SCENARIO_A, aScenario, aSweepAnswer } from '../testing/scenario-fixtures';
import { TradeoffPage } from './tradeoff-page';
import { nextRequest, until } from '../../testing/until';

const URL = `/api/v1/projects/${PROJECT_ID}/scenarios/${SCENARIO_A}`;

describe('TradeoffPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [TradeoffPage],
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });

  /**
   * Answers the settings panel's own loads (sites, lists, the list's options) with empty lists, as
   * they are sent, until the sites and the lists have both been asked for.
   */
  async function flushSettingsLoads(): Promise<void> {
    const answered = new Set<string>();
    await until(() => {
      for (const req of http.match(
        (r) => r.method === 'GET' && r.url.startsWith('/api/v1/') && !r.url.includes('/scenarios/'),
      )) {
        req.flush(
          req.request.url.includes('/equipment-lists/')
            ? { id: 'x', name: 'x', optionCount: 0, version: 1, updatedAt: '', options: [] }
            : [],
        );
        answered.add(req.request.url);
      }
      return answered.has('/api/v1/climate-sites') && answered.has('/api/v1/equipment-lists');
    }, "the settings panel's loads of sites and equipment lists");
  }

  async function render(role: Role, scenario: Scenario, sweep: SweepAnswer | { status: number; body: object }) {
    TestBed.inject(AuthStore).setSession(signedInSession(role));
    const fixture = TestBed.createComponent(TradeoffPage);
    fixture.componentRef.setInput('id', PROJECT_ID);
    fixture.componentRef.setInput('scenarioId', SCENARIO_A);
    fixture.detectChanges();
    (await nextRequest(http, { method: 'GET', url: URL })).flush(scenario);
    const post = await nextRequest(http, { method: 'POST', url: `${URL}/sweep` });
    if ('status' in sweep) post.flush(sweep.body, { status: sweep.status, statusText: 'Error' });
    else post.flush(sweep);
    await flushSettingsLoads();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const byId = (id: string) =>
      el.querySelector(`[data-testid="${id}"]`)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
    return { fixture, el, byId };
  }

  it('shows the sentence and the figures of the first named value, another when its row is chosen, and saves the choice', async () => {
    const { fixture, el, byId } = await render('designer', aScenario(), aSweepAnswer());
    expect(byId('chosen-unit')).toBe('Furnace 9 kW');
    expect(byId('tradeoff-sentence')).toContain('instead of −32.0 °C (50-year return period)');
    expect(byId('chosen-unmet')).toBe('12');
    // Every figure has its explanation behind a button that the keyboard reaches.
    const infos = el.querySelectorAll<HTMLButtonElement>(
      '[data-testid="chosen-figures"] button[data-testid="term-info"]',
    );
    expect(infos.length).toBe(12);
    expect(infos[0]!.getAttribute('aria-label')).toBe('About Design temperature');
    // Grid rows are hidden until asked for: three named rows.
    const rows = Array.from(
      el.querySelectorAll<HTMLButtonElement>('[data-testid="design-temps-table"] tbody .row-button'),
    );
    expect(rows.length).toBe(3);
    rows[2]!.click();
    fixture.detectChanges();
    await fixture.whenStable();
    expect(byId('chosen-unit')).toBe('Furnace 12 kW');
    expect(byId('chosen-temperature')).toBe('−32.0 °C (50-year return period)');
    expect(byId('tradeoff-sentence')).toContain('the coldest of the design temperatures');
    expect(el.querySelector('[data-testid="tradeoff-cautions"]')).not.toBeNull();
    // The choice is saved with the scenario's version once the user pauses.
    const patch = await nextRequest(http, { method: 'PATCH', url: URL });
    expect(patch.request.body).toEqual({ version: 1, chosenDesignC: -32 });
    patch.flush(aScenario({ chosenDesignC: -32, version: 2 }));
    // The page keeps the newer version; nothing is swept again.
    await until(() => fixture.componentInstance['scenario']()?.version === 2, 'the saved version to be kept');
    await fixture.whenStable();
    expect(http.match({ method: 'POST', url: `${URL}/sweep` }).length).toBe(0);
    http.verify();
  });

  it('opens on the design point saved with the scenario', async () => {
    const { byId } = await render('designer', aScenario({ chosenDesignC: -24 }), aSweepAnswer());
    expect(byId('chosen-temperature')).toBe('−24.0 °C (Mean annual minimum)');
    expect(byId('chosen-unit')).toBe('Furnace 12 kW');
    http.verify();
  });

  it('keeps showing the previous result while a new sweep runs, then replaces it in place', async () => {
    const { fixture, el, byId } = await render('designer', aScenario(), aSweepAnswer());
    expect(byId('chosen-unit')).toBe('Furnace 9 kW');
    const page = fixture.componentInstance as unknown as { settingsSaved(s: Scenario): void };
    page.settingsSaved(aScenario());
    await until(() => byId('sweep-updating') !== '', 'the note that a new sweep runs');
    expect(byId('chosen-unit')).toBe('Furnace 9 kW');
    expect(byId('sweep-updating')).toContain('previous result');
    expect(el.querySelector('[data-testid="chosen-point"]')?.getAttribute('aria-busy')).toBe('true');

    const next = aSweepAnswer();
    next.rows = next.rows.map((r) => ({ ...r, selectedOptionId: '2', capacityAtDesignW: 12000 }));
    (await nextRequest(http, { method: 'POST', url: `${URL}/sweep` })).flush(next);
    await until(() => el.querySelector('[data-testid="sweep-updating"]') === null, 'the new sweep to be shown');
    await fixture.whenStable();
    expect(byId('chosen-unit')).toBe('Furnace 12 kW');
    expect(el.querySelector('[data-testid="sweep-updating"]')).toBeNull();
    expect(el.querySelector('[data-testid="chosen-point"]')?.getAttribute('aria-busy')).toBe('false');
    http.verify();
  });

  it('lists what is missing when the scenario cannot be swept', async () => {
    const { el, byId } = await render('designer', aScenario(), {
      status: 422,
      body: {
        error: {
          code: 'scenario_incomplete',
          message: 'This scenario cannot be swept yet',
          details: [
            { path: 'building', message: 'Describe the building on the project page first' },
            { path: 'equipmentListId', message: 'Choose an equipment list' },
          ],
        },
      },
    });
    expect(byId('sweep-error')).toContain('Describe the building on the project page first');
    expect(byId('sweep-error')).toContain('Choose an equipment list');
    expect(el.querySelector('[data-testid="tradeoff-sentence"]')).toBeNull();
    http.verify();
  });

  it('says a frozen copy is frozen and offers a copy instead of freezing or saving', async () => {
    const { el, byId } = await render(
      'owner',
      aScenario({ frozenAt: '2026-11-30T10:00:00.000Z' }),
      aSweepAnswer({ frozen: true, cached: true }),
    );
    expect(byId('frozen-note')).toContain('no longer change');
    const buttons = Array.from(el.querySelectorAll('button')).map((b) => b.textContent?.trim() ?? '');
    expect(buttons.some((b) => b.includes('Freeze for a bid'))).toBeFalse();
    expect(buttons.some((b) => b.includes('Make an editable copy'))).toBeTrue();
    expect(buttons.some((b) => b.includes('Save and sweep again'))).toBeFalse();
    http.verify();
  });

  it('lets a viewer read and sweep but not freeze', async () => {
    const { el } = await render('viewer', aScenario(), aSweepAnswer());
    const buttons = Array.from(el.querySelectorAll('button')).map((b) => b.textContent?.trim() ?? '');
    expect(buttons.some((b) => b.includes('Freeze for a bid'))).toBeFalse();
    expect(el.querySelector('[data-testid="tradeoff-sentence"]')).not.toBeNull();
    http.verify();
  });
});
