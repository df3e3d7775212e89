import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/auth/roles';
import type { Project } from '@shared/projects/project-schemas';
import type { Scenario } from '@shared/scenarios/scenario-schemas';
import { AuthStore } from '../../auth/auth-store';
import {
  LIST_ID,
  aBuilding,
  aSite,
  anEquipmentList,
  someEquipmentListSummaries,
} from '../../building/testing/building-fixtures';
import { settle, signedInSession } from '../../testing/test-sessions';
import { nextRequest } from '../../testing/until';
import { PROJECT_ID, SITE_ID, aProject, someClimateSites } from '../testing/project-fixtures';
import { SCENARIO_A, SCENARIO_B, aScenario } from '../../scenarios/testing/scenario-fixtures';
import { ProjectPage } from './project-page';

const PROJECT_URL = `/api/v1/projects/${PROJECT_ID}`;
const STALE_MESSAGE =
  'Sam Reed changed this project since you opened it; reload to see their changes, then apply yours again';

function maple(fields: Partial<Project> = {}): Project {
  return aProject('Maple Street duplex', {
    clientName: 'Jordan Hale',
    siteAddress: '14 Maple Street, Brookfield',
    climateSiteId: SITE_ID,
    climateSiteName: 'Lakeview station',
    notes: 'Basement stays unheated.',
    version: 3,
    ...fields,
  });
}

describe('ProjectPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [ProjectPage],
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

  async function render(role: Role, project: Project | { status: number; body: object }, scenarios: Scenario[] = []) {
    TestBed.inject(AuthStore).setSession(signedInSession(role));
    const fixture = TestBed.createComponent(ProjectPage);
    fixture.componentRef.setInput('id', PROJECT_ID);
    fixture.detectChanges();
    const get = await nextRequest(http, { method: 'GET', url: PROJECT_URL });
    if ('status' in project) get.flush(project.body, { status: project.status, statusText: 'Error' });
    else get.flush(project);
    http.expectOne({ method: 'GET', url: '/api/v1/climate-sites' }).flush(someClimateSites());
    const stable = async () => {
      await settle();
      await fixture.whenStable();
    };
    if ('status' in project) await stable();
    else {
      // The equipment select and the building section load their own parts.
      (await nextRequest(http, { method: 'GET', url: '/api/v1/equipment-lists' })).flush(someEquipmentListSummaries());
      (await nextRequest(http, { method: 'GET', url: `${PROJECT_URL}/building` })).flush({
        version: project.version,
        building: aBuilding(),
      });
      if (project.climateSiteId) {
        http
          .expectOne({ method: 'GET', url: `/api/v1/climate-sites/${project.climateSiteId}` })
          .flush(aSite(project.climateSiteId));
      }
      if (project.equipmentListId) {
        http
          .expectOne({ method: 'GET', url: `/api/v1/equipment-lists/${project.equipmentListId}` })
          .flush(anEquipmentList());
      }
      http.expectOne({ method: 'GET', url: `${PROJECT_URL}/scenarios` }).flush(scenarios);
      await stable();
    }
    const el = fixture.nativeElement as HTMLElement;
    const text = () => el.textContent?.replace(/\s+/g, ' ') ?? '';
    /** The input or textarea of the field labelled `label`. */
    const field = (label: string) => {
      const formField = Array.from(el.querySelectorAll('mat-form-field')).find(
        (f) => f.querySelector('mat-label')?.textContent?.trim() === label,
      );
      return formField?.querySelector<HTMLInputElement | HTMLTextAreaElement>('input, textarea') ?? null;
    };
    const type = async (label: string, value: string) => {
      const input = field(label)!;
      input.value = value;
      input.dispatchEvent(new Event('input'));
      await fixture.whenStable();
    };
    const button = (label: string) =>
      Array.from(el.querySelectorAll<HTMLButtonElement>('button')).find((b) => b.textContent?.trim() === label);
    const click = async (label: string) => {
      const b = button(label);
      expect(b).withContext(`button ${label}`).toBeDefined();
      b!.click();
      await stable();
    };
    return { fixture, el, text, field, type, button, click, stable };
  }

  it('shows the project’s name, client, address and climate site in the header', async () => {
    const { el, text } = await render('designer', maple());
    expect(el.querySelector('h1')?.textContent?.trim()).toBe('Maple Street duplex');
    const facts = el.querySelector('[data-testid="project-facts"]')?.textContent ?? '';
    expect(facts).toContain('Jordan Hale');
    expect(facts).toContain('14 Maple Street, Brookfield');
    const siteLink = el.querySelector<HTMLAnchorElement>('[data-testid="project-facts"] a');
    expect(siteLink?.textContent?.trim()).toBe('Lakeview station');
    expect(siteLink?.getAttribute('href')).toBe(`/climate-sites/${SITE_ID}`);
    expect(el.querySelector('.archived-chip')).toBeNull();
    expect(text()).toContain('Heating 99.6 %: −20.0 °C');
  });

  it('marks an archived project', async () => {
    const { el } = await render('viewer', maple({ archived: true }));
    expect(el.querySelector('.archived-chip')?.textContent?.trim()).toBe('Archived');
  });

  it('lists the scenarios, marks a frozen bid copy, and compares only two to five ticked ones', async () => {
    const { el, fixture } = await render('designer', maple(), [
      aScenario({ id: SCENARIO_A, name: 'Gas bid' }),
      aScenario({ id: SCENARIO_B, name: 'Gas bid · bid 2026-11-30', frozenAt: '2026-11-30T10:00:00.000Z' }),
    ]);
    const rows = Array.from(el.querySelectorAll<HTMLElement>('[data-scenario]'));
    expect(rows.map((r) => r.dataset['scenario'])).toEqual(['Gas bid', 'Gas bid · bid 2026-11-30']);
    expect(rows[0]?.querySelector('.frozen')).toBeNull();
    expect(rows[1]?.querySelector('.frozen')?.textContent).toContain('Frozen');
    expect(rows[0]?.querySelector('a.name')?.getAttribute('href')).toBe(
      `/projects/${PROJECT_ID}/scenarios/${SCENARIO_A}`,
    );
    const compare = el.querySelector<HTMLButtonElement>('[data-testid="compare-selected"]')!;
    expect(compare.disabled).toBeTrue();
    const boxes = Array.from(el.querySelectorAll<HTMLInputElement>('[data-scenario] input[type="checkbox"]'));
    boxes[0]!.click();
    fixture.detectChanges();
    expect(compare.disabled).toBeTrue();
    boxes[1]!.click();
    fixture.detectChanges();
    expect(compare.disabled).toBeFalse();
  });

  it('shows the building with its live heat loss at the project’s climate site', async () => {
    const { el } = await render('designer', maple());
    expect(el.querySelector('[data-testid="building-section"]')).not.toBeNull();
    // 200 W/K × (21 − (−17.5)) K.
    expect(el.querySelector('[data-testid="design-load"]')?.textContent?.trim()).toBe('7.7 kW');
  });

  it('chooses the project’s equipment list with the version it was loaded at, and links to it', async () => {
    const { el, stable } = await render('designer', maple());
    expect(el.querySelector('[data-testid="equipment-list-link"]')).toBeNull();
    el.querySelector<HTMLElement>('[data-testid="equipment-list-select"] mat-select')!.click();
    await stable();
    const option = Array.from(document.querySelectorAll<HTMLElement>('mat-option')).find((o) =>
      o.textContent?.includes('Spring price list'),
    );
    expect(option?.textContent?.trim()).toBe('Spring price list (2 options)');
    option!.click();
    await stable();
    const patch = http.expectOne({ method: 'PATCH', url: PROJECT_URL });
    expect(patch.request.body).toEqual({ version: 3, equipmentListId: LIST_ID });
    patch.flush(maple({ equipmentListId: LIST_ID, equipmentListName: 'Spring price list', version: 4 }));
    (await nextRequest(http, { method: 'GET', url: `/api/v1/equipment-lists/${LIST_ID}` })).flush(anEquipmentList());
    await stable();
    expect(el.querySelector('[data-testid="equipment-list-link"]')?.getAttribute('href')).toBe(
      `/equipment-lists/${LIST_ID}`,
    );
    expect(el.querySelector('[data-testid="equipment-at-design"]')?.textContent).toContain('Gas furnace 60k');
  });

  it('saves the building from the version the details were saved at', async () => {
    const { type, click, stable } = await render('designer', maple());
    await type('Client name', 'Hale family');
    await click('Save');
    http.expectOne({ method: 'PATCH', url: PROJECT_URL }).flush(maple({ clientName: 'Hale family', version: 4 }));
    await stable();
    await type('Conduction UA', '250');
    await click('Save building');
    const put = http.expectOne({ method: 'PUT', url: `${PROJECT_URL}/building` });
    expect(put.request.body.version).toBe(4);
    put.flush({ version: 5, building: put.request.body.building });
    await stable();
    await type('Notes', 'Attic insulated in 2024.');
    await click('Save');
    const patch = http.expectOne({ method: 'PATCH', url: PROJECT_URL });
    expect(patch.request.body.version).toBe(5);
    patch.flush(maple({ clientName: 'Hale family', notes: 'Attic insulated in 2024.', version: 6 }));
    await stable();
  });

  it('fills the details form with the stored values', async () => {
    const { field } = await render('designer', maple());
    expect(field('Project name')?.value).toBe('Maple Street duplex');
    expect(field('Client name')?.value).toBe('Jordan Hale');
    expect(field('Site address')?.value).toBe('14 Maple Street, Brookfield');
    expect(field('Notes')?.value).toBe('Basement stays unheated.');
  });

  it('saves the details with the version they were loaded at', async () => {
    const { el, type, click, stable } = await render('designer', maple());
    await type('Client name', '  Hale family ');
    await click('Save');
    const patch = http.expectOne({ method: 'PATCH', url: PROJECT_URL });
    expect(patch.request.body).toEqual({
      version: 3,
      name: 'Maple Street duplex',
      clientName: 'Hale family',
      siteAddress: '14 Maple Street, Brookfield',
      climateSiteId: SITE_ID,
      notes: 'Basement stays unheated.',
    });
    patch.flush(maple({ clientName: 'Hale family', version: 4 }));
    await stable();
    expect(el.querySelector('[data-testid="project-facts"]')?.textContent).toContain('Hale family');
  });

  it('does not send a project without a name', async () => {
    const { type, click, text } = await render('designer', maple());
    await type('Project name', '   ');
    await click('Save');
    http.expectNone({ method: 'PATCH' });
    expect(text()).toContain('Enter a project name');
  });

  it('on a conflicting save shows who saved, keeps the typed values, and lets them be applied to the latest version', async () => {
    const { el, field, type, click, text, button, stable } = await render('designer', maple());
    await type('Client name', 'Hale family');
    await click('Save');
    http
      .expectOne({ method: 'PATCH', url: PROJECT_URL })
      .flush({ error: { code: 'stale_update', message: STALE_MESSAGE } }, { status: 409, statusText: 'Conflict' });
    await stable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain(STALE_MESSAGE);
    expect(field('Client name')?.value).toBe('Hale family');
    expect(button('Reload')).toBeDefined();

    // Reload shows the latest saved version and keeps the typed value aside.
    await click('Reload');
    http
      .expectOne({ method: 'GET', url: PROJECT_URL })
      .flush(maple({ name: 'Maple Street duplex, north unit', updatedByName: 'Sam Reed', version: 5 }));
    await stable();
    expect(el.querySelector('h1')?.textContent?.trim()).toBe('Maple Street duplex, north unit');
    expect(field('Project name')?.value).toBe('Maple Street duplex, north unit');
    expect(field('Client name')?.value).toBe('Jordan Hale');
    expect(text()).toContain('Your changes that were not saved');
    expect(el.querySelector('[data-testid="unsaved-changes"] li')?.textContent?.replace(/\s+/g, ' ').trim()).toBe(
      'Client name: Hale family',
    );
    expect(el.querySelectorAll('[data-testid="unsaved-changes"] li').length).toBe(1);

    // Applied again and saved, the change is made from the latest version.
    await click('Apply my changes again');
    expect(field('Client name')?.value).toBe('Hale family');
    expect(el.querySelector('[data-testid="unsaved-changes"]')).toBeNull();
    await click('Save');
    const patch = http.expectOne({ method: 'PATCH', url: PROJECT_URL });
    expect(patch.request.body).toEqual(
      jasmine.objectContaining({ version: 5, name: 'Maple Street duplex, north unit', clientName: 'Hale family' }),
    );
    patch.flush(maple({ name: 'Maple Street duplex, north unit', clientName: 'Hale family', version: 6 }));
    await stable();
    expect(el.querySelector('[role="alert"]')).toBeNull();
  });

  it('shows the details read-only to viewers, without Save', async () => {
    const { field, button, text } = await render('viewer', maple());
    expect(field('Project name')?.disabled).toBeTrue();
    expect(field('Notes')?.disabled).toBeTrue();
    expect(button('Save')).toBeUndefined();
    expect(text()).toContain('Designers and owners in your organisation can change it.');
  });

  it('says so when the project does not exist', async () => {
    const { el, text } = await render('designer', {
      status: 404,
      body: { error: { code: 'not_found', message: 'That project was not found' } },
    });
    expect(el.querySelector('h1')).toBeNull();
    expect(text()).toContain('This project was not found.');
  });
});
