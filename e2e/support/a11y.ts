import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';

/** The widths every page is checked at: a desk and a phone. */
export const A11Y_WIDTHS = [1280, 390] as const;

/** The rule sets of WCAG 2.1 levels A and AA, as axe-core tags them. */
const WCAG_21_AA_TAGS = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'];

const REPORTS = path.resolve('test-results/a11y');

let axeSource: string | undefined;

/** One failed rule, as axe-core reports it, cut down to what a reader needs to find and fix it. */
export interface A11yViolation {
  rule: string;
  impact: string | null;
  help: string;
  nodes: { target: string; summary: string }[];
}

/**
 * Runs axe-core (WCAG 2.1 A and AA rules) on the page as it is now, at its current width, and answers
 * the violations. axe-core is handed to the page through the DevTools protocol, not as a script tag,
 * so the app's content-security policy stays in force for the app's own scripts.
 */
export async function axeViolations(page: Page): Promise<A11yViolation[]> {
  axeSource ??= readFileSync(path.resolve('node_modules/axe-core/axe.min.js'), 'utf8');
  await settle(page);
  const present = await page.evaluate('typeof window.axe === "object"');
  if (!present) await page.evaluate(axeSource);
  // A string, not a function: the test runner's transpiler would wrap a function's inner helpers.
  const json = await page.evaluate(`(async () => {
    const results = await window.axe.run(document, {
      runOnly: { type: 'tag', values: ${JSON.stringify(WCAG_21_AA_TAGS)} },
      resultTypes: ['violations'],
    });
    return JSON.stringify(results.violations.map((v) => ({
      rule: v.id,
      impact: v.impact ?? null,
      help: v.help,
      nodes: v.nodes.map((n) => ({ target: n.target.join(' '), summary: n.failureSummary ?? '' })),
    })));
  })()`);
  return JSON.parse(String(json)) as A11yViolation[];
}

/**
 * Fails when axe-core finds any WCAG 2.1 A/AA violation on the page at 1280 px or at 390 px. The page is
 * checked at its current width first, then at the other, then given back its size. `name` names the
 * page in the failure and in `test-results/a11y/<name>.json`, which lists what was found.
 *
 * Call it from any browser test once the page shows what it is about: `await checkA11y(page, 'team')`.
 */
export async function checkA11y(page: Page, name: string): Promise<void> {
  const size = page.viewportSize() ?? { width: 1280, height: 900 };
  const widths = [...A11Y_WIDTHS].sort((a, b) => Number(b === size.width) - Number(a === size.width));
  const found: Record<string, A11yViolation[]> = {};
  try {
    for (const width of widths) {
      if (width !== page.viewportSize()?.width) {
        await page.setViewportSize({ width, height: width < 600 ? 844 : 900 });
      }
      // Colours are judged at rest: a snack bar or dialog fading in has not reached its own colours yet
      // (endless animations, such as a progress bar's, are not waited for).
      await page.waitForFunction(
        () =>
          document
            .getAnimations()
            .every((a) => a.playState !== 'running' || a.effect?.getComputedTiming().endTime === Infinity),
        undefined,
        {
          timeout: 10_000,
        },
      );
      const violations = await axeViolations(page);
      if (violations.length) found[String(width)] = violations;
    }
  } finally {
    if (page.viewportSize()?.width !== size.width) await page.setViewportSize(size);
  }
  mkdirSync(REPORTS, { recursive: true });
  writeFileSync(path.join(REPORTS, `${name}.json`), JSON.stringify(found, null, 2) + '\n');
  const widthsWithFindings = Object.keys(found);
  if (widthsWithFindings.length) {
    throw new Error(`WCAG 2.1 A/AA violations on "${name}" (${page.url()}):\n${describeViolations(found)}`);
  }
}

/** The violations in a few readable lines per rule. */
export function describeViolations(found: Record<string, A11yViolation[]>): string {
  const lines: string[] = [];
  for (const [width, violations] of Object.entries(found)) {
    for (const v of violations) {
      lines.push(`  [${width} px] ${v.rule} (${v.impact ?? 'unknown'}): ${v.help}`);
      for (const n of v.nodes.slice(0, 5)) lines.push(`      ${n.target} — ${n.summary.replace(/\s+/g, ' ')}`);
      if (v.nodes.length > 5) lines.push(`      … and ${String(v.nodes.length - 5)} more`);
    }
  }
  return lines.join('\n');
}

/** Lets fonts load, layout follow a resize and Material's entry animations finish before axe looks. */
async function settle(page: Page): Promise<void> {
  await page.evaluate(`(async () => {
    await document.fonts.ready;
    await new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(resolve)));
  })()`);
  await page.waitForTimeout(250);
}
