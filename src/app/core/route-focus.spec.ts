import { LiveAnnouncer } from '@angular/cdk/a11y';
import { Component } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { provideRouter, Router, RouterOutlet } from '@angular/router';
import { pagePath, RouteFocus } from './route-focus';

@Component({ template: '<p><button type="button">Before</button></p><h1>Page A</h1>' })
class PageA {}

@Component({ template: '<h1>Page B</h1><button type="button" id="b-button">Filter</button>' })
class PageB {}

@Component({ template: '<p>Loading…</p>' })
class PageWithoutHeading {}

@Component({
  imports: [RouterOutlet],
  template: '<nav><a href="/a" id="nav-link">A</a></nav><main id="main" tabindex="-1"><router-outlet /></main>',
})
class Shell {}

/** Waits (up to 6 s) until `ready` holds. */
async function until(ready: () => boolean): Promise<void> {
  const deadline = Date.now() + 6000;
  while (!ready()) {
    if (Date.now() > deadline) throw new Error('timed out');
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
}

describe('RouteFocus', () => {
  let fixture: ComponentFixture<Shell>;
  let router: Router;
  let announce: jasmine.Spy;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'a', title: 'Page A · Tailroom', component: PageA },
          { path: 'b', title: 'Page B · Tailroom', component: PageB },
          { path: 'empty', title: 'Empty · Tailroom', component: PageWithoutHeading },
        ]),
      ],
    });
    announce = spyOn(TestBed.inject(LiveAnnouncer), 'announce').and.resolveTo();
    fixture = TestBed.createComponent(Shell);
    document.body.appendChild(fixture.nativeElement as HTMLElement);
    router = TestBed.inject(Router);
    TestBed.inject(RouteFocus).start();
    await router.navigateByUrl('/a');
    await fixture.whenStable();
  });

  afterEach(() => {
    (fixture.nativeElement as HTMLElement).remove();
  });

  const active = () => document.activeElement as HTMLElement | null;

  it('leaves the first page of a visit alone, so the skip link is the first stop', () => {
    expect(active()).toBe(document.body);
    expect(announce).not.toHaveBeenCalled();
  });

  it('moves the focus to the new page’s heading and announces its title', async () => {
    (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>('#nav-link')?.focus();
    await router.navigateByUrl('/b');
    await fixture.whenStable();
    await until(() => active()?.tagName === 'H1');
    expect(active()?.textContent).toBe('Page B');
    expect(active()?.getAttribute('tabindex')).toBe('-1');
    await until(() => announce.calls.count() > 0);
    expect(announce).toHaveBeenCalledWith('Page B · Tailroom', 'polite');
  });

  it('keeps the focus where it is when only the query changes', async () => {
    await router.navigateByUrl('/b');
    await fixture.whenStable();
    await until(() => active()?.tagName === 'H1');
    const button = (fixture.nativeElement as HTMLElement).querySelector<HTMLElement>('#b-button');
    button?.focus();
    announce.calls.reset();
    await router.navigateByUrl('/b?sort=name');
    await fixture.whenStable();
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(active()).toBe(button);
    expect(announce).not.toHaveBeenCalled();
  });

  it('falls back to the main region when the page shows no heading in time', async () => {
    await router.navigateByUrl('/empty');
    await fixture.whenStable();
    await until(() => active()?.id === 'main');
    expect(announce).toHaveBeenCalledWith('Empty · Tailroom', 'polite');
  }, 8000);

  it('sends the skip link to the main region', () => {
    TestBed.inject(RouteFocus).focusMain();
    expect(active()?.id).toBe('main');
  });

  it('tells a page from its query and fragment', () => {
    expect(pagePath('/projects/1?tab=2#x')).toBe('/projects/1');
    expect(pagePath('/compare')).toBe('/compare');
  });
});
