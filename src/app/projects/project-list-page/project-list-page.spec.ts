import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Role } from '@shared/auth/roles';
import type { Project } from '@shared/projects/project-schemas';
import { AuthStore } from '../../auth/auth-store';
import { settle, signedInSession } from '../../testing/test-sessions';
import { ProjectListPage } from './project-list-page';

function aProject(name: string): Project {
  return {
    id: '0b6f1c3e-9d2a-4e5b-8c7d-6e5f4a3b2c1d',
    name,
    clientName: '',
    siteAddress: '',
    climateSiteId: null,
    climateSiteName: null,
    notes: '',
    archived: false,
    version: 1,
    createdByName: 'Dana Frost',
    updatedByName: 'Dana Frost',
    createdAt: '2026-01-12T09:30:15.000Z',
    updatedAt: '2026-01-12T09:30:15.000Z',
  };
}

describe('ProjectListPage', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      imports: [ProjectListPage],
      providers: [provideRouter([]), provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(role: Role, projects: Project[]) {
    TestBed.inject(AuthStore).setSession(signedInSession(role));
    const fixture = TestBed.createComponent(ProjectListPage);
    fixture.detectChanges();
    await settle(1);
    http.expectOne({ method: 'GET', url: '/api/v1/projects' }).flush(projects);
    await settle();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const buttons = Array.from(el.querySelectorAll('button'), (b) => b.textContent?.trim() ?? '');
    return { fixture, el, buttons };
  }

  it('explains what a project holds when there are none', async () => {
    const { el } = await render('designer', []);
    expect(el.querySelector('h1')?.textContent).toBe('Projects');
    expect(el.textContent).toContain('No projects yet');
    expect(el.textContent).toContain('the local climate');
    expect(el.querySelector('table')).toBeNull();
  });

  it('lists projects with who created them', async () => {
    const { el } = await render('viewer', [aProject('Maple Street duplex')]);
    const cells = Array.from(el.querySelectorAll('td'), (td) => td.textContent?.trim());
    expect(cells).toEqual(['Maple Street duplex', 'Dana Frost', 'Jan 12, 2026']);
    expect(el.textContent).not.toContain('No projects yet');
  });

  it('offers "New project" to designers', async () => {
    const { buttons } = await render('designer', []);
    expect(buttons.some((t) => t.includes('New project'))).toBeTrue();
  });

  it('hides "New project" from viewers', async () => {
    const { buttons, el } = await render('viewer', []);
    expect(buttons.some((t) => t.includes('New project'))).toBeFalse();
    expect(el.textContent).toContain('No projects yet');
  });
});
