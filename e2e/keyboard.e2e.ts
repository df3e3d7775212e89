import assert from 'node:assert/strict';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import type { Page } from 'playwright-core';
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../server/seed/demo-seed';
import { checkA11y } from './support/a11y';
import { SCREENSHOTS, guardOffline, seedDemoData, startE2eApp, type E2eApp } from './support/e2e-app';

let e2e: E2eApp;
before(async () => {
  await seedDemoData();
  e2e = await startE2eApp();
});
after(async () => {
  await e2e.close();
});

/** What has the keyboard focus, and what shows it. */
interface FocusStop {
  tag: string;
  role: string;
  name: string;
  /** How the focus is drawn: `outline …`, `ring …` (Material's indicator), `field` (a focused text field), or '' for nothing. */
  indicator: string;
  /** A short signature of the kind of element, to take one screenshot per kind and page. */
  kind: string;
  /** The ring's or outline's contrast against the nearest background behind the element. */
  contrast: number | null;
  box: { x: number; y: number; width: number; height: number } | null;
}

// A string, not a function: the test runner's transpiler would wrap a function's inner helpers.
const READ_FOCUS = `(() => {
  const el = document.activeElement;
  if (!el || el === document.body) return { tag: 'body', role: '', name: '', indicator: '', kind: 'body', box: null };
  const text = (s) => (s || '').replace(/\\s+/g, ' ').trim().slice(0, 80);
  const labelled = el.getAttribute('aria-labelledby');
  const byLabel = labelled ? text(labelled.split(' ').map((id) => document.getElementById(id)?.textContent ?? '').join(' ')) : '';
  const fieldLabel = el.closest('.mat-mdc-form-field')?.querySelector('mat-label')?.textContent;
  const ownLabel = el.labels?.[0]?.textContent;
  const name = text(el.getAttribute('aria-label')) || byLabel || text(fieldLabel) || text(ownLabel) || text(el.textContent);
  const wide = (w) => parseFloat(w) >= 2;
  let indicator = '';
  const cs = getComputedStyle(el);
  if (cs.outlineStyle !== 'none' && wide(cs.outlineWidth)) indicator = 'outline ' + cs.outlineColor;
  if (!indicator) {
    const host = el.closest('.mat-mdc-checkbox, .mat-mdc-radio-button, .mat-mdc-slide-toggle, .mat-button-toggle, .mat-mdc-slider') ?? el;
    const candidates = [el, ...host.querySelectorAll('.mat-focus-indicator')];
    for (const c of candidates) {
      const before = getComputedStyle(c, '::before');
      if (before.content !== 'none' && before.display !== 'none' && wide(before.borderTopWidth) && before.borderTopStyle !== 'none') {
        indicator = 'ring ' + before.borderTopColor;
        break;
      }
    }
  }
  if (!indicator && el.closest('.mat-mdc-form-field.mat-focused')) indicator = 'field';
  // An outline or ring must stand out at 3:1 against what surrounds the element (WCAG 1.4.11).
  const rgb = (c) => (c.match(/[\d.]+/g) || []).map(Number);
  const lum = ([r, g, b]) => {
    const f = (v) => ((v /= 255) <= 0.03928 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4);
    return 0.2126 * f(r) + 0.7152 * f(g) + 0.0722 * f(b);
  };
  let contrast = null;
  const drawn = /^(outline|ring) (.*)$/.exec(indicator);
  if (drawn) {
    let bg = el.parentElement;
    // The nearest opaque background (a translucent tint is passed over).
    const translucent = (node) => {
      const alpha = rgb(getComputedStyle(node).backgroundColor)[3];
      return alpha !== undefined && alpha < 1;
    };
    while (bg && translucent(bg)) bg = bg.parentElement;
    const back = rgb(bg ? getComputedStyle(bg).backgroundColor : 'rgb(255, 255, 255)');
    const l1 = lum(rgb(drawn[2]));
    const l2 = lum(back);
    contrast = (Math.max(l1, l2) + 0.05) / (Math.min(l1, l2) + 0.05);
    if (contrast < 3) indicator = '';
  }
  const r = el.getBoundingClientRect();
  const kind = el.tagName.toLowerCase() + '.' + [...el.classList].filter((c) => !/ng-|cdk-|active|focused|checked|selected/.test(c)).slice(0, 2).join('.');
  return {
    contrast,
    tag: el.tagName.toLowerCase(),
    role: el.getAttribute('role') ?? '',
    name,
    indicator,
    kind,
    box: r.width > 0 ? { x: r.x, y: r.y, width: r.width, height: r.height } : null,
  };
})()`;

/**
 * Waits until the expression holds in the page (up to `timeoutMs`). Read through the DevTools protocol:
 * the app's content-security policy forbids the string evaluation `page.waitForFunction` would need.
 */
async function waitUntil(page: Page, expression: string, timeoutMs = 10_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await page.evaluate<boolean>(`!!(${expression})`))) {
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${expression}`);
    await page.waitForTimeout(50);
  }
}

async function readFocus(page: Page): Promise<FocusStop> {
  return page.evaluate<FocusStop>(READ_FOCUS);
}

let shots = 0;
/** A close-up of the focused element with its surroundings, to look at the focus indicator. */
async function focusScreenshot(page: Page, stop: FocusStop, label: string): Promise<void> {
  if (!stop.box) return;
  const size = page.viewportSize() ?? { width: 1280, height: 900 };
  const pad = 20;
  const x = Math.max(0, stop.box.x - pad);
  const y = Math.max(0, stop.box.y - pad);
  const clip = {
    x,
    y,
    width: Math.min(size.width - x, stop.box.width + 2 * pad),
    height: Math.min(size.height - y, stop.box.height + 2 * pad),
  };
  if (clip.width <= 0 || clip.height <= 0) return;
  shots += 1;
  const file = `focus-${String(shots).padStart(2, '0')}-${label}`.replace(/[^\w-]+/g, '-').slice(0, 80);
  await page.screenshot({ path: path.join(SCREENSHOTS, `${file}.png`), clip });
}

/**
 * Presses Tab until the focused element matches `target`, checking at every stop that the focus is
 * drawn (an outline or ring of at least 2 px, or Material's focused text field). One close-up per
 * kind of element and page goes to the screenshots. Fails after `maxStops` presses.
 */
async function tabTo(
  page: Page,
  pageName: string,
  target: (s: FocusStop) => boolean,
  maxStops = 200,
): Promise<FocusStop> {
  const seen = new Set<string>();
  for (let i = 0; i < maxStops; i++) {
    await page.keyboard.press('Tab');
    let stop = await readFocus(page);
    // A focus ring that fades in (Material's switch) is judged once drawn, within half a second.
    for (let tries = 0; !stop.indicator && stop.tag !== 'body' && tries < 10; tries++) {
      await page.waitForTimeout(50);
      stop = await readFocus(page);
    }
    assert.notEqual(stop.tag, 'body', `${pageName}: Tab stop ${String(i + 1)} left the page (focus on <body>)`);
    assert.ok(
      stop.indicator,
      `${pageName}: no visible focus on ${stop.kind} "${stop.name}" (stop ${String(i + 1)}, contrast ${String(stop.contrast)})`,
    );
    const hit = target(stop);
    if (hit || !seen.has(stop.kind)) {
      seen.add(stop.kind);
      await focusScreenshot(page, stop, `${pageName}-${stop.name || stop.kind}`);
    }
    if (hit) return stop;
  }
  throw new Error(`${pageName}: the target was not reached in ${String(maxStops)} Tab presses`);
}

const named = (pattern: RegExp) => (s: FocusStop) => pattern.test(s.name);

/**
 * After a route change: the focus is on the new page's main heading, the document title names the
 * page, and the title was handed to screen readers through the live region.
 */
async function expectLanded(page: Page, heading: RegExp, title: RegExp): Promise<void> {
  await waitUntil(page, `document.activeElement?.tagName === 'H1' && !!document.activeElement.closest('main')`);
  const stop = await readFocus(page);
  assert.match(stop.name, heading);
  assert.match(await page.title(), title);
  await waitUntil(
    page,
    `[...document.querySelectorAll('.cdk-live-announcer-element')].some((e) => e.textContent.trim() === document.title)`,
    5_000,
  );
}

describe('the journey by keyboard alone', () => {
  it('signs in, opens a scenario, composes a client report and sends it with no mouse', async () => {
    const offenders: string[] = [];
    const context = await e2e.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    guardOffline(page, e2e.baseUrl, offenders);
    const designer = DEMO_ACCOUNTS.find((a) => a.role === 'designer');
    assert.ok(designer);

    // Sign in. The first stop is the skip link; it takes the focus to the page's content.
    await page.goto(e2e.baseUrl + '/sign-in');
    await page.getByRole('button', { name: 'Sign in' }).waitFor();
    await page.evaluate('document.fonts.ready');
    await page.keyboard.press('Tab');
    const skip = await readFocus(page);
    assert.equal(skip.tag, 'a');
    assert.match(skip.name, /Skip to main content/);
    assert.ok(skip.indicator, 'the skip link shows its focus');
    await focusScreenshot(page, skip, 'sign-in-skip-link');
    await page.keyboard.press('Enter');
    await waitUntil(page, `document.activeElement?.id === 'main'`);
    await tabTo(page, 'sign-in', named(/^E-mail/));
    await page.keyboard.type(designer.email);
    await tabTo(page, 'sign-in', named(/^Password/));
    await page.keyboard.type(DEMO_PASSWORD);
    await tabTo(page, 'sign-in', (s) => s.tag === 'button' && /^Sign in$/.test(s.name));
    await page.keyboard.press('Enter');

    // Projects: focus on the heading, then on to the demo project.
    await page.waitForURL(/\/projects$/);
    await expectLanded(page, /^Projects$/, /^Projects · Tailroom$/);
    await tabTo(page, 'projects', (s) => s.tag === 'a' && s.name.includes('Old Mill duplex'));
    await page.keyboard.press('Enter');

    // The project: on to its heat-pump scenario.
    await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    await expectLanded(page, /Old Mill duplex/, /· Tailroom$/);
    await tabTo(page, 'project', (s) => s.tag === 'a' && /^Heat pump bid \(demo\)$/.test(s.name));
    await page.keyboard.press('Enter');

    // The trade-off screen: the slider by keys, then a new client report.
    await page.waitForURL(/\/scenarios\//);
    await expectLanded(page, /^Heat pump bid \(demo\)$/, /Trade-off · Tailroom$/);
    // The first sweep of a record loads it into a worker: allow for a busy machine.
    await page.getByTestId('tradeoff-sentence').waitFor({ timeout: 180_000 });
    await tabTo(page, 'tradeoff', (s) => s.tag === 'input' && /^Design temperature$/.test(s.name));
    await page.keyboard.press('Home');
    await page.getByTestId('chosen-temperature').filter({ hasText: '(99 % design temperature)' }).waitFor();
    const valueText = await page.getByTestId('design-slider').getAttribute('aria-valuetext');
    assert.equal(
      valueText,
      await page.getByTestId('chosen-temperature').innerText(),
      'the slider reads out the design point as shown',
    );
    await page.keyboard.press('End');
    await page.getByTestId('chosen-temperature').filter({ hasText: '(50-year return period)' }).waitFor();
    assert.equal(
      await page.getByTestId('design-slider').getAttribute('aria-valuetext'),
      await page.getByTestId('chosen-temperature').innerText(),
    );
    await page.keyboard.press('Home');
    await page.getByTestId('chosen-temperature').filter({ hasText: '(99 % design temperature)' }).waitFor();
    await tabTo(page, 'tradeoff', (s) => s.tag === 'button' && s.name.includes('New client report'));
    await page.keyboard.press('Enter');

    // The composer dialog takes the focus; every stop in it shows its focus.
    await page.getByRole('dialog').waitFor();
    await waitUntil(page, `document.activeElement?.closest('mat-dialog-container')`);
    const first = await readFocus(page);
    if (!first.name.startsWith('Title')) await tabTo(page, 'composer', named(/^Title/));
    await page.keyboard.press('ControlOrMeta+A');
    await page.keyboard.type('Heat pump options, sent by keyboard');
    await tabTo(page, 'composer', named(/^Note to the client/));
    await page.keyboard.type('Both options are in the table; the smaller one is our advice.');
    await tabTo(page, 'composer', (s) => s.tag === 'button' && /^Create report$/.test(s.name));
    await page.keyboard.press('Enter');

    // The report page: send it.
    await page.waitForURL(/\/reports\//);
    await expectLanded(page, /^Heat pump options, sent by keyboard$/, /^Client report · Tailroom$/);
    const client = `keyboard.${Date.now().toString(36)}@example.test`;
    await tabTo(page, 'report', named(/^Client's e-mail/));
    await page.keyboard.type(client);
    await tabTo(page, 'report', named(/^Message/));
    await page.keyboard.type('Here is the report we talked about.');
    // The report is live, so the first send button freezes the scenario, sends a frozen copy and
    // opens it; the focus lands on the new page's heading, as on any page change.
    const liveUrl = page.url();
    await tabTo(page, 'report', (s) => s.tag === 'button' && s.name.endsWith('Freeze and send'));
    await page.keyboard.press('Enter');
    await page.waitForURL((u) => u.href !== liveUrl && u.pathname.includes('/reports/'));
    await page.getByTestId('report-sends').getByText(client).waitFor();
    await expectLanded(page, /^Heat pump options, sent by keyboard$/, /^Client report · Tailroom$/);
    assert.match(await page.getByTestId('send-form').innerText(), /\bSend\b/);
    assert.doesNotMatch(await page.getByTestId('send-form').innerText(), /Freeze and send/);
    await checkA11y(page, 'report-sent');

    // At a phone's width and in IP units, the toolbar's stops show their focus on the ink too.
    await page.setViewportSize({ width: 390, height: 844 });
    await page.goto(e2e.baseUrl + '/projects');
    await page.getByRole('heading', { name: 'Projects' }).waitFor();
    await tabTo(page, 'toolbar-390', named(/^Navigation menu$/));
    await tabTo(page, 'toolbar-390', named(/^SI units/));
    await page.keyboard.press('ArrowRight');
    await page.getByRole('radio', { name: 'IP units (inch-pound)', checked: true }).waitFor();
    const ip = await readFocus(page);
    assert.match(ip.name, /^IP units/);
    assert.ok(ip.indicator, 'the IP toggle shows its focus');
    await focusScreenshot(page, ip, 'toolbar-390-IP-units-selected');
    await tabTo(page, 'toolbar-390', named(/^Account$/));
    await tabTo(page, 'projects-390-ip', (s) => s.tag === 'a' && s.name.includes('Old Mill duplex'));
    await checkA11y(page, 'projects-ip');
    // Back to SI for the other browser tests that sign in as this account.
    await page.getByRole('radio', { name: 'SI units (metric)' }).focus();
    await page.keyboard.press('Space');
    await page.getByRole('radio', { name: 'SI units (metric)', checked: true }).waitFor();

    assert.deepEqual(offenders, []);
    await context.close();
  });
});
