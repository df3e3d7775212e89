import assert from 'node:assert/strict';
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import { checkA11y } from './support/a11y';
import {
  SCREENSHOTS,
  guardOffline,
  pdfFirstPageScreenshot,
  screenshot,
  seedDemoData,
  signInAsDemo,
  startE2eApp,
  type E2eApp,
} from './support/e2e-app';

let e2e: E2eApp;
before(async () => {
  await seedDemoData();
  e2e = await startE2eApp();
});
after(async () => {
  await e2e.close();
});

const SITE = 'Brackenholt Mill (invented)';
const LABEL = `Hour-by-hour figures estimated from Kettlerun Crossing (invented)'s record, adjusted to ${SITE}'s published values.`;

/** The text of every page of a PDF (pdf.js, as shipped for the screenshots), without white space: line breaks split words at hyphens. */
async function pdfText(bytes: Buffer): Promise<string> {
  const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const doc = await pdfjs.getDocument({ data: new Uint8Array(bytes) }).promise;
  const parts: string[] = [];
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    parts.push(content.items.map((item) => ('str' in item ? item.str : '')).join(''));
  }
  return parts.join('').replace(/\s+/g, '');
}

describe('a site with published values only, estimated from a demo record', () => {
  it('gets an hour-by-hour record, and the trade-off, the report and the PDF give hour-based figures with the estimate label', async () => {
    const offenders: string[] = [];
    const context = await e2e.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    guardOffline(page, e2e.baseUrl, offenders);
    await signInAsDemo(page, e2e.baseUrl, 'designer');

    // A new site from a published table (invented values).
    await page.goto(e2e.baseUrl + '/climate-sites');
    await page.getByRole('link', { name: 'New site from published values' }).click();
    await page.getByLabel(/^Site name/).fill(SITE);
    await page.getByLabel(/^Source of these values/).fill('Invented table for the browser test');
    await page.locator('[data-field="publishedValues.heating.db99_6"]').fill('-27');
    await page.locator('[data-field="publishedValues.heating.db99"]').fill('-24');
    await page.locator('[data-field="publishedValues.hdd18"]').fill('4900');
    await page.getByRole('button', { name: 'Save site' }).click();
    await page.getByTestId('estimate-panel').waitFor();

    // Estimate its hours from the demo record of Kettlerun Crossing.
    await page.getByTestId('estimate-reference').click();
    await page.getByRole('option', { name: /^Kettlerun Crossing \(invented\)/ }).click();
    await page.getByTestId('estimate-button').click();
    await page
      .getByTestId('estimate-panel')
      .getByTestId('estimate-label')
      .filter({ hasText: LABEL })
      .waitFor({ timeout: 120_000 });
    const table = page.getByTestId('recent-years-table');
    await table.waitFor();
    const header = await table.locator('thead').innerText();
    assert.match(header, /Whole record/);
    assert.match(header, /Latest 10 years/);
    assert.match(header, /Latest 15 years/);
    assert.match(await page.getByTestId('trend-sentence').innerText(), /coldest hour of the year has/);
    await page.getByTestId('trend-chart').locator('canvas').first().waitFor();
    // The table's 99.6 % value stays the published one.
    const heatingRow = await page.getByTestId('design-values').locator('[data-key="heating-99.6"]').innerText();
    assert.ok(heatingRow.includes('−27'), heatingRow);
    await page.getByTestId('recent-years-table').scrollIntoViewIfNeeded();
    await page.waitForTimeout(300);
    await screenshot(page, 'climate-basis-site-1280');
    await page.getByTestId('trend-chart').scrollIntoViewIfNeeded();
    await page.waitForTimeout(300);
    await screenshot(page, 'climate-basis-trend-1280');
    await checkA11y(page, 'climate-basis-site');

    // A copy of a demo bid, moved to the new site.
    await page.goto(e2e.baseUrl + '/projects');
    await page.getByRole('link', { name: /Fernbrook Lane/ }).click();
    await page.getByTestId('scenario-list').getByRole('link', { name: 'Gas furnace bid (demo)', exact: true }).click();
    await page.waitForURL(/\/scenarios\//);
    const demoUrl = new URL(page.url()).pathname;
    const copy = await page.request.post(`${e2e.baseUrl}/api/v1${demoUrl}/duplicate`, {
      headers: { 'X-Requested-With': 'tailroom' },
      data: { name: 'Gas bid at Brackenholt' },
    });
    assert.equal(copy.status(), 201);
    const copyId = ((await copy.json()) as { id: string }).id;
    await page.goto(e2e.baseUrl + demoUrl.replace(/[^/]+$/, copyId));
    // The first sweep of a 30-year record loads it into a worker: allow for a busy machine.
    await page.getByTestId('tradeoff-sentence').waitFor({ timeout: 180_000 });
    await page.getByText('Scenario settings').click();
    await page.getByRole('combobox', { name: 'Climate site' }).click();
    await page.getByRole('option', { name: SITE }).click();
    await page.getByRole('button', { name: 'Save and sweep again' }).click();

    // The trade-off: hour-based figures, the basis and the estimate label.
    const label = page.getByTestId('estimate-label').filter({ hasText: LABEL });
    await label.waitFor({ timeout: 180_000 });
    assert.match(await page.getByTestId('climate-basis').innerText(), /Whole record \(1995–2024, 30 years\)/);
    await page
      .getByTestId('tradeoff-sentence')
      .filter({ hasText: /average year/ })
      .waitFor({ timeout: 60_000 });
    await page.getByTestId('tradeoff-chart').locator('canvas').first().waitFor();
    await page.getByTestId('load-duration-chart').locator('canvas').first().waitFor();
    await page.waitForTimeout(300);
    await screenshot(page, 'climate-basis-tradeoff-1280');
    await checkA11y(page, 'climate-basis-tradeoff');

    // The report and its PDF say the same.
    await page.getByRole('button', { name: 'New client report' }).click();
    await page.getByLabel(/^Title/).fill('Heating options for Brackenholt Mill');
    await page.getByRole('button', { name: 'Create report' }).click();
    await page.waitForURL(/\/reports\//);
    const doc = page.getByTestId('report-document');
    await doc.waitFor();
    const reportText = await doc.innerText();
    assert.ok(reportText.includes(LABEL), 'the report names the estimate');
    assert.match(reportText, /hours/);
    await page.locator('.report canvas').first().waitFor();
    await page.getByText(LABEL).scrollIntoViewIfNeeded();
    await screenshot(page, 'climate-basis-report-1280');
    await checkA11y(page, 'climate-basis-report');

    const [, projectId, reportId] = /\/projects\/([^/]+)\/reports\/([^/?#]+)/.exec(new URL(page.url()).pathname) ?? [];
    const pdf = await page.request.get(
      `${e2e.baseUrl}/api/v1/projects/${projectId ?? ''}/reports/${reportId ?? ''}/pdf`,
    );
    assert.equal(pdf.status(), 200);
    const bytes = await pdf.body();
    writeFileSync(path.join(SCREENSHOTS, 'climate-basis-report.pdf'), bytes);
    assert.ok((await pdfText(bytes)).includes(LABEL.replace(/\s+/g, '')), 'the PDF names the estimate');
    await pdfFirstPageScreenshot(e2e.browser, bytes, 'climate-basis-report-pdf-page-1');

    // One click compares it with the latest 15 years.
    await page.goBack();
    await page.getByTestId('compare-basis').click();
    await page.waitForURL(/\/compare\?ids=/);
    const compare = page.getByTestId('compare-table');
    await compare.waitFor({ timeout: 180_000 });
    assert.match(await compare.locator('thead').innerText(), /latest 15 years/);
    await page.getByTestId('compare-chart').locator('canvas').first().waitFor();
    await screenshot(page, 'climate-basis-compare-1280');
    await checkA11y(page, 'climate-basis-compare');

    assert.deepEqual(offenders, []);
    await context.close();
  });
});
