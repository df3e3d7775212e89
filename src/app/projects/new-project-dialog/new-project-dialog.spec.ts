import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MatDialogRef } from '@angular/material/dialog';
import { provideRouter } from '@angular/router';
import { AuthStore } from '../../auth/auth-store';
import { settle, signedInSession } from '../../testing/test-sessions';
import { aProject, someClimateSites } from '../testing/project-fixtures';
import { NewProjectDialog } from './new-project-dialog';
import { nextRequest } from '../../testing/until';

describe('NewProjectDialog', () => {
  let http: HttpTestingController;
  let dialogRef: jasmine.SpyObj<MatDialogRef<NewProjectDialog>>;

  beforeEach(() => {
    dialogRef = jasmine.createSpyObj<MatDialogRef<NewProjectDialog>>('MatDialogRef', ['close']);
    TestBed.configureTestingModule({
      imports: [NewProjectDialog],
      providers: [
        provideHttpClient(),
        provideHttpClientTesting(),
        provideRouter([]),
        { provide: MatDialogRef, useValue: dialogRef },
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
      ],
    });
    http = TestBed.inject(HttpTestingController);
  });
  afterEach(() => http.verify());

  async function render(projectsUsed = 1, role: 'owner' | 'designer' = 'designer') {
    TestBed.inject(AuthStore).setSession(signedInSession(role));
    const fixture = TestBed.createComponent(NewProjectDialog);
    fixture.detectChanges();
    (await nextRequest(http, { method: 'GET', url: '/api/v1/climate-sites' })).flush(someClimateSites());
    http.expectOne({ method: 'GET', url: '/api/v1/billing/usage' }).flush({
      plan: 'starter',
      planName: 'Starter',
      projects: { used: projectsUsed, limit: 3 },
      members: { used: 1, limit: 2 },
    });
    const stable = async () => {
      await settle();
      await fixture.whenStable();
    };
    await stable();
    const el = fixture.nativeElement as HTMLElement;
    const labels = () => Array.from(el.querySelectorAll('mat-label'), (l) => l.textContent?.trim());
    const type = async (label: string, value: string) => {
      const formField = Array.from(el.querySelectorAll('mat-form-field')).find(
        (f) => f.querySelector('mat-label')?.textContent?.trim() === label,
      );
      const input = formField!.querySelector<HTMLInputElement | HTMLTextAreaElement>('input, textarea')!;
      input.value = value;
      input.dispatchEvent(new Event('input'));
      await fixture.whenStable();
    };
    const submit = async () => {
      Array.from(el.querySelectorAll<HTMLButtonElement>('button'))
        .find((b) => b.textContent?.trim() === 'Create project')!
        .click();
      await stable();
    };
    return { el, labels, type, submit, stable };
  }

  it('asks for the name, client, site address, climate site and notes', async () => {
    const { labels } = await render();
    expect(labels()).toEqual(['Project name', 'Client name', 'Site address', 'Climate site', 'Notes']);
  });

  it('does not create a project without a name', async () => {
    const { el, submit } = await render();
    await submit();
    http.expectNone({ method: 'POST' });
    expect(el.textContent).toContain('Enter a project name');
    expect(dialogRef.close).not.toHaveBeenCalled();
  });

  it('sends only the fields filled in and closes with the created project', async () => {
    const { type, submit, stable } = await render();
    await type('Project name', ' Birch Road house ');
    await type('Client name', 'Morgan Lee');
    await submit();
    const post = http.expectOne({ method: 'POST', url: '/api/v1/projects' });
    expect(post.request.body).toEqual({ name: 'Birch Road house', clientName: 'Morgan Lee' });
    const created = aProject('Birch Road house', { clientName: 'Morgan Lee' });
    post.flush(created, { status: 201, statusText: 'Created' });
    await stable();
    expect(dialogRef.close).toHaveBeenCalledWith(created);
  });

  it('shows the server’s message when the project is refused', async () => {
    const { el, type, submit, stable } = await render();
    await type('Project name', 'Birch Road house');
    await submit();
    http.expectOne({ method: 'POST', url: '/api/v1/projects' }).flush(
      {
        error: {
          code: 'validation_failed',
          message: 'Check the highlighted fields',
          details: [{ path: 'clientName', message: 'Use at most 160 characters for the client name' }],
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await stable();
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Check the highlighted fields');
    expect(el.textContent).toContain('Use at most 160 characters for the client name');
    expect(dialogRef.close).not.toHaveBeenCalled();
  });

  it('says when the plan’s project limit is reached, offers owners the upgrade, and does not create', async () => {
    const { el } = await render(3, 'owner');
    expect(el.querySelector('[data-testid="plan-limit"]')?.textContent).toContain(
      'The Starter plan holds 3 active projects',
    );
    expect(el.querySelector('[data-testid="plan-limit"] a')?.getAttribute('href')).toBe('/billing');
    const create = Array.from(el.querySelectorAll<HTMLButtonElement>('button')).find((b) =>
      b.textContent?.includes('Create project'),
    );
    expect(create?.disabled).toBeTrue();
  });

  it('tells a designer at the limit to ask an owner', async () => {
    const { el } = await render(3, 'designer');
    const note = el.querySelector('[data-testid="plan-limit"]');
    expect(note?.textContent).toContain('Ask an owner to upgrade the plan');
    expect(note?.querySelector('a')).toBeNull();
  });
});
