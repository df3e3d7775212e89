import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/auth/roles';
import type { Project } from '@shared/projects/project-schemas';
import { AuthStore } from '../../auth/auth-store';
import { settle, signedInSession } from '../../testing/test-sessions';
import { aProject, projectId } from '../testing/project-fixtures';
import { ProjectListPage } from './project-list-page';
import { nextRequest } from '../../testing/until';

const LIST_URL = '/api/v1/projects';

const threeProjects: Project[] = [
  aProject('Maple Street duplex', {
    id: projectId(1),
    clientName: 'Jordan Hale',
    siteAddress: '14 Maple Street, Brookfield',
    climateSiteName: 'Lakeview station',
    climateSiteId: '5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c41',
    updatedByName: 'Sam Reed',
    updatedAt: '2026-02-03T10:00:00.000Z',
    version: 4,
  }),
  aProject('Alder Court school', {
    id: projectId(2),
    clientName: 'Brookfield schools',
    siteAddress: '2 Alder Court',
    updatedAt: '2026-01-20T10:00:00.000Z',
  }),
  aProject('Cedar Lane bungalow', {
    id: projectId(3),
    clientName: 'Priya Anand',
    siteAddress: '9 Cedar Lane, Harbour Point',
    updatedAt: '2026-01-25T10:00:00.000Z',
  }),
];

describe('ProjectListPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [ProjectListPage],
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

  async function render(role: Role, projects: Project[]) {
    TestBed.inject(AuthStore).setSession(signedInSession(role));
    const fixture = TestBed.createComponent(ProjectListPage);
    fixture.detectChanges();
    (await nextRequest(http, { method: 'GET', url: LIST_URL })).flush(projects);
    await stable(fixture);
    const el = fixture.nativeElement as HTMLElement;
    const buttons = () => Array.from(el.querySelectorAll('button'), (b) => b.textContent?.trim() ?? '');
    const rowNames = () => Array.from(el.querySelectorAll('tr.mat-mdc-row .name a'), (a) => a.textContent?.trim());
    const header = (label: string) =>
      Array.from(el.querySelectorAll<HTMLElement>('th')).find((th) => th.textContent?.trim() === label)!;
    const typeFilter = async (text: string) => {
      const input = el.querySelector<HTMLInputElement>('input[type="search"]')!;
      input.value = text;
      input.dispatchEvent(new Event('input'));
      await fixture.whenStable();
    };
    /** Opens the row menu of `name` and clicks `item` in it. */
    const rowAction = async (name: string, item: string) => {
      el.querySelector<HTMLButtonElement>(`button[aria-label="Actions for ${name}"]`)!.click();
      await stable(fixture);
      const items = Array.from(document.querySelectorAll<HTMLButtonElement>('.cdk-overlay-container [mat-menu-item]'));
      const found = items.find((b) => b.textContent?.includes(item));
      expect(found).withContext(`menu item ${item}`).toBeDefined();
      found!.click();
      await stable(fixture);
    };
    return { fixture, el, buttons, rowNames, header, typeFilter, rowAction };
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

  it('explains what a project holds when there are none', async () => {
    const { el } = await render('designer', []);
    expect(el.querySelector('h1')?.textContent).toBe('Projects');
    expect(el.textContent).toContain('No projects yet');
    expect(el.textContent).toContain('the local climate');
    expect(el.querySelector('table')).toBeNull();
  });

  it('lists projects with client, climate site and who changed them last, each name linking to its page', async () => {
    const { el } = await render('viewer', [threeProjects[0]!]);
    const headers = Array.from(el.querySelectorAll('th'), (th) => th.textContent?.trim());
    expect(headers).toEqual(['Name', 'Client', 'Climate site', 'Updated by', 'Updated']);
    const cells = Array.from(el.querySelectorAll('td'), (td) => td.textContent?.trim());
    expect(cells).toEqual(['Maple Street duplex', 'Jordan Hale', 'Lakeview station', 'Sam Reed', 'Feb 3, 2026']);
    expect(el.querySelector('td.name a')?.getAttribute('href')).toBe(`/projects/${projectId(1)}`);
    expect(el.textContent).not.toContain('No projects yet');
  });

  it('narrows the rows by name, client or address with the filter box', async () => {
    const { el, rowNames, typeFilter } = await render('viewer', threeProjects);
    expect(rowNames()).toEqual(['Maple Street duplex', 'Alder Court school', 'Cedar Lane bungalow']);

    await typeFilter('alder');
    expect(rowNames()).toEqual(['Alder Court school']);

    await typeFilter('priya');
    expect(rowNames()).toEqual(['Cedar Lane bungalow']);

    await typeFilter('brookfield');
    expect(rowNames()).toEqual(['Maple Street duplex', 'Alder Court school']);

    await typeFilter('nowhere at all');
    expect(rowNames()).toEqual([]);
    expect(el.textContent).toContain('No project matches “nowhere at all”');
  });

  it('sorts by a column header, ascending then descending', async () => {
    const { fixture, rowNames, header } = await render('viewer', threeProjects);
    header('Name').click();
    await fixture.whenStable();
    expect(rowNames()).toEqual(['Alder Court school', 'Cedar Lane bungalow', 'Maple Street duplex']);
    header('Name').click();
    await fixture.whenStable();
    expect(rowNames()).toEqual(['Maple Street duplex', 'Cedar Lane bungalow', 'Alder Court school']);

    header('Updated').click();
    await fixture.whenStable();
    expect(rowNames()).toEqual(['Alder Court school', 'Cedar Lane bungalow', 'Maple Street duplex']);

    header('Client').click();
    await fixture.whenStable();
    expect(rowNames()).toEqual(['Alder Court school', 'Maple Street duplex', 'Cedar Lane bungalow']);
  });

  it('shows ten projects a page', async () => {
    const many = Array.from({ length: 12 }, (_, i) =>
      aProject(`Project ${String(i + 1).padStart(2, '0')}`, { id: projectId(i + 10) }),
    );
    const { rowNames } = await render('viewer', many);
    expect(rowNames().length).toBe(10);
    expect(rowNames()[0]).toBe('Project 01');
  });

  it('switches to the archived projects with the "Show archived" toggle', async () => {
    const { fixture, el } = await render('designer', threeProjects);
    const toggle = el.querySelector<HTMLButtonElement>('mat-slide-toggle button')!;
    expect(toggle.closest('mat-slide-toggle')?.textContent).toContain('Show archived');
    toggle.click();
    (await nextRequest(http, { method: 'GET', url: `${LIST_URL}?archived=true` })).flush([]);
    await stable(fixture);
    expect(el.textContent).toContain('No archived projects');
    expect(el.textContent).not.toContain('No projects yet');
    expect(el.querySelector('table')).toBeNull();

    toggle.click();
    (await nextRequest(http, { method: 'GET', url: LIST_URL })).flush([]);
    await stable(fixture);
    expect(el.textContent).toContain('No projects yet');
  });

  it('offers "Restore" instead of "Archive" for an archived project', async () => {
    const { fixture, el, rowAction } = await render('designer', []);
    el.querySelector<HTMLButtonElement>('mat-slide-toggle button')!.click();
    (await nextRequest(http, `${LIST_URL}?archived=true`)).flush([
      aProject('Old barn', { id: projectId(7), archived: true, version: 5 }),
    ]);
    await stable(fixture);
    await rowAction('Old barn', 'Restore');
    const patch = http.expectOne({ method: 'PATCH', url: `${LIST_URL}/${projectId(7)}` });
    expect(patch.request.body).toEqual({ version: 5, archived: false });
    patch.flush(aProject('Old barn', { id: projectId(7), version: 6 }));
    (await nextRequest(http, `${LIST_URL}?archived=true`)).flush([]);
    await stable(fixture);
    expect(el.textContent).toContain('No archived projects');
  });

  it('offers "New project" and the row actions to designers', async () => {
    const { buttons, el } = await render('designer', threeProjects);
    expect(buttons().some((t) => t.includes('New project'))).toBeTrue();
    expect(el.querySelectorAll('button[aria-label^="Actions for "]').length).toBe(3);
    expect(el.querySelector('button[aria-label="Actions for Alder Court school"]')).not.toBeNull();
  });

  it('hides "New project" and the row actions from viewers', async () => {
    const { buttons, el } = await render('viewer', threeProjects);
    expect(buttons().some((t) => t.includes('New project'))).toBeFalse();
    expect(el.querySelectorAll('button[aria-label^="Actions for "]').length).toBe(0);
    expect(el.querySelectorAll('th').length).toBe(5);
  });

  it('hides "New project" from viewers when there are no projects', async () => {
    const { buttons, el } = await render('viewer', []);
    expect(buttons().some((t) => t.includes('New project'))).toBeFalse();
    expect(el.textContent).toContain('Designers and owners in your organisation can create projects.');
  });

  it('asks before deleting and sends DELETE only after "Delete"', async () => {
    const { fixture, rowNames, rowAction } = await render('designer', threeProjects);

    await rowAction('Cedar Lane bungalow', 'Delete');
    let d = dialog();
    expect(d.text).toContain('Delete Cedar Lane bungalow?');
    expect(d.text).toContain('This cannot be undone.');
    d.click('Cancel');
    await stable(fixture);
    http.expectNone({ method: 'DELETE' });
    expect(dialog().container).toBeNull();

    await rowAction('Cedar Lane bungalow', 'Delete');
    d = dialog();
    d.click('Delete');
    await stable(fixture);
    http
      .expectOne({ method: 'DELETE', url: `${LIST_URL}/${projectId(3)}` })
      .flush(null, { status: 204, statusText: 'No Content' });
    (await nextRequest(http, { method: 'GET', url: LIST_URL })).flush(threeProjects.slice(0, 2));
    await stable(fixture);
    expect(rowNames()).toEqual(['Maple Street duplex', 'Alder Court school']);
  });

  it('duplicates a project and lists the copy', async () => {
    const { fixture, rowNames, rowAction } = await render('designer', [threeProjects[1]!]);
    await rowAction('Alder Court school', 'Duplicate');
    http
      .expectOne({ method: 'POST', url: `${LIST_URL}/${projectId(2)}/duplicate` })
      .flush(aProject('Alder Court school (copy)', { id: projectId(4) }), { status: 201, statusText: 'Created' });
    (await nextRequest(http, { method: 'GET', url: LIST_URL })).flush([
      aProject('Alder Court school (copy)', { id: projectId(4) }),
      threeProjects[1]!,
    ]);
    await stable(fixture);
    expect(rowNames()).toEqual(['Alder Court school (copy)', 'Alder Court school']);
  });

  it('archives a project with the version it was listed at', async () => {
    const { fixture, rowAction } = await render('designer', [threeProjects[0]!]);
    await rowAction('Maple Street duplex', 'Archive');
    const patch = http.expectOne({ method: 'PATCH', url: `${LIST_URL}/${projectId(1)}` });
    expect(patch.request.body).toEqual({ version: 4, archived: true });
    patch.flush({ ...threeProjects[0]!, archived: true, version: 5 });
    (await nextRequest(http, { method: 'GET', url: LIST_URL })).flush([]);
    await stable(fixture);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('No projects yet');
  });

  it('renames a project in a small dialog', async () => {
    const { fixture, rowAction } = await render('designer', [threeProjects[0]!]);
    await rowAction('Maple Street duplex', 'Rename');
    const d = dialog();
    expect(d.text).toContain('Rename project');
    const input = d.container!.querySelector<HTMLInputElement>('input')!;
    expect(input.value).toBe('Maple Street duplex');
    input.value = '  Maple Street triplex ';
    input.dispatchEvent(new Event('input'));
    d.click('Rename');
    await stable(fixture);
    const patch = http.expectOne({ method: 'PATCH', url: `${LIST_URL}/${projectId(1)}` });
    expect(patch.request.body).toEqual({ version: 4, name: 'Maple Street triplex' });
    patch.flush({ ...threeProjects[0]!, name: 'Maple Street triplex', version: 5 });
    (await nextRequest(http, { method: 'GET', url: LIST_URL })).flush([
      { ...threeProjects[0]!, name: 'Maple Street triplex' },
    ]);
    await stable(fixture);
    expect(dialog().container).toBeNull();
  });

  it('keeps the rename dialog open with the message when someone saved in between', async () => {
    const { fixture, rowAction } = await render('designer', [threeProjects[0]!]);
    await rowAction('Maple Street duplex', 'Rename');
    const input = dialog().container!.querySelector<HTMLInputElement>('input')!;
    input.value = 'Maple Street triplex';
    input.dispatchEvent(new Event('input'));
    dialog().click('Rename');
    await stable(fixture);
    const message =
      'Sam Reed changed this project since you opened it; reload to see their changes, then apply yours again';
    http
      .expectOne({ method: 'PATCH', url: `${LIST_URL}/${projectId(1)}` })
      .flush({ error: { code: 'stale_update', message } }, { status: 409, statusText: 'Conflict' });
    await stable(fixture);
    expect(dialog().text).toContain(message);
    expect(input.value).toBe('Maple Street triplex');

    dialog().click('Reload');
    await stable(fixture);
    http
      .expectOne({ method: 'GET', url: `${LIST_URL}/${projectId(1)}` })
      .flush({ ...threeProjects[0]!, clientName: 'Hale family', version: 6 });
    await stable(fixture);
    expect(input.value).toBe('Maple Street triplex');
    dialog().click('Rename');
    await stable(fixture);
    const patch = http.expectOne({ method: 'PATCH', url: `${LIST_URL}/${projectId(1)}` });
    expect(patch.request.body).toEqual({ version: 6, name: 'Maple Street triplex' });
    patch.flush({ ...threeProjects[0]!, name: 'Maple Street triplex', version: 7 });
    (await nextRequest(http, { method: 'GET', url: LIST_URL })).flush([]);
    await stable(fixture);
    expect(dialog().container).toBeNull();
  });
});
