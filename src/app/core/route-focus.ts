import { LiveAnnouncer } from '@angular/cdk/a11y';
import { DestroyRef, Injectable, inject, DOCUMENT } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { NavigationEnd, Router } from '@angular/router';
import { filter } from 'rxjs';

/** How long a page may take to show its heading (it may wait for its data) before the main region gets the focus. */
const HEADING_WAIT_MS = 4000;

/** The path of a URL, without its query and fragment: a change of query alone stays on the same page. */
export function pagePath(url: string): string {
  return url.split(/[?#]/)[0] ?? url;
}

/**
 * Keyboard and screen-reader users learn of a new page: after each route change to another page, the
 * focus moves to the page's main heading (or, without one, to the main region) and the page's title is
 * announced. The first page of a visit keeps the browser's own start, so the skip link comes first.
 * A page that has already put the focus inside its content (a dialog, a field) keeps it there.
 */
@Injectable({ providedIn: 'root' })
export class RouteFocus {
  // services
  private readonly router = inject(Router);
  private readonly announcer = inject(LiveAnnouncer);
  private readonly document = inject(DOCUMENT);
  private readonly destroyRef = inject(DestroyRef);

  private lastPath: string | null = null;
  private attempt = 0;

  /** Starts following the router. */
  start(): void {
    this.router.events
      .pipe(
        filter((e): e is NavigationEnd => e instanceof NavigationEnd),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((e) => {
        const path = pagePath(e.urlAfterRedirects);
        const first = this.lastPath === null;
        const samePage = path === this.lastPath;
        this.lastPath = path;
        if (!first && !samePage) void this.focusPage();
      });
  }

  /** Moves the focus to the main region (the skip link's target): the next Tab goes to the page's first control. */
  focusMain(): void {
    const main = this.main();
    if (main) this.focus(main);
  }

  private async focusPage(): Promise<void> {
    const attempt = ++this.attempt;
    const heading = await this.waitForHeading();
    // A later navigation has taken over.
    if (attempt !== this.attempt) return;
    const active = this.document.activeElement;
    const main = this.main();
    const keptByPage =
      active instanceof HTMLElement &&
      active !== this.document.body &&
      (!!main?.contains(active) ||
        (!!active.closest('.cdk-overlay-container') && !active.closest('.mdc-dialog--closing')));
    if (!keptByPage) {
      const target = heading ?? main;
      if (target) this.focus(target);
    }
    void this.announcer.announce(this.document.title, 'polite');
  }

  private focus(target: HTMLElement): void {
    if (!target.hasAttribute('tabindex')) target.setAttribute('tabindex', '-1');
    target.focus();
  }

  private main(): HTMLElement | null {
    return this.document.getElementById('main');
  }

  /** The new page's main heading once it is in the document, or null after HEADING_WAIT_MS. */
  private waitForHeading(): Promise<HTMLElement | null> {
    const find = () => this.main()?.querySelector<HTMLElement>('h1') ?? null;
    const now = find();
    if (now) return Promise.resolve(now);
    return new Promise((resolve) => {
      const main = this.main();
      if (!main) {
        resolve(null);
        return;
      }
      const done = (found: HTMLElement | null) => {
        observer.disconnect();
        clearTimeout(timer);
        resolve(found);
      };
      const observer = new MutationObserver(() => {
        const found = find();
        if (found) done(found);
      });
      observer.observe(main, { childList: true, subtree: true });
      const timer = setTimeout(() => {
        done(null);
      }, HEADING_WAIT_MS);
    });
  }
}
