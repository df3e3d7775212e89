import assert from 'node:assert/strict';
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import { checkA11y } from './support/a11y';
import {
  SCREENSHOTS,
  guardOffline,
  pdfPageScreenshots,
  screenshot,
  seedDemoData,
  signInAsDemo,
  startE2eApp,
  type E2eApp,
} from './support/e2e-app';

/** Words of the designer's screens that must not reach the homeowner. */
const DESIGNER_ONLY = [
  /unmet/i,
  /design (temperature|load|point)/i,
  /set-point/i,
  /\bsag\b/i,
  /ladder/i,
  /\brung/i,
  /life-cycle/i,
  /return period/i,
  /equivalent full-load/i,
  /fall(s)? behind the load/i,
];

let e2e: E2eApp;
before(async () => {
  await seedDemoData();
  e2e = await startE2eApp();
});
after(async () => {
  await e2e.close();
});

describe('a client report in a real browser', () => {
  it('is composed from the trade-off screen, frozen and e-mailed, read by a homeowner in plain words, printed to PDF, and withdrawn', async () => {
    const offenders: string[] = [];
    const context = await e2e.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    guardOffline(page, e2e.baseUrl, offenders);
    await signInAsDemo(page, e2e.baseUrl, 'designer');

    // The heat-pump bid of the second demo project, at its 99 % design temperature.
    await page.getByRole('link', { name: /Old Mill duplex/ }).click();
    await page.getByTestId('scenario-list').getByRole('link', { name: 'Heat pump bid (demo)', exact: true }).click();
    await page.getByTestId('tradeoff-sentence').waitFor({ timeout: 120_000 }); // the first sweep of a record starts a worker and loads it
    await page.getByTestId('design-slider').focus();
    await page.keyboard.press('Home');
    await page.getByTestId('chosen-temperature').filter({ hasText: '(99 % design temperature)' }).waitFor();
    const shown = {
      unit: await page.getByTestId('chosen-unit').innerText(),
      price: await page.getByTestId('chosen-price').innerText(),
    };

    // Compose: the chosen point and the coldest are ticked by default.
    await page.getByRole('button', { name: 'New client report' }).click();
    await page.getByLabel(/^Title/).fill('Heat pump options for the Old Mill duplex');
    await page
      .getByLabel(/^Note to the client/)
      .fill('The smaller unit keeps up on all but the coldest few hours; the backup heater covers them.');
    await page.getByLabel(/^Your phone/).fill('555 0142');
    await checkA11y(page, 'report-composer');
    await page.getByRole('button', { name: 'Create report' }).click();
    await page.waitForURL(/\/reports\//);
    await page.getByTestId('report-document').waitFor();

    // A live report: freeze and send, so the homeowner's copy never changes; the frozen report opens.
    const livePage = page.url();
    const client = `homeowner.${Date.now().toString(36)}@example.test`;
    await page.getByLabel(/^Client's e-mail/).fill(client);
    await page.getByLabel(/^Message/).fill('Here are the two options we talked about.');
    await page.getByTestId('freeze-and-send').click();
    await page.waitForURL((u) => u.href !== livePage && u.pathname.includes('/reports/'));
    await page.getByTestId('report-sends').getByText(client).waitFor();
    assert.match(await page.locator('.facts').innerText(), /frozen: its figures never change/);
    // After a successful send the address field is empty and not marked as an error.
    assert.equal(await page.getByLabel(/^Client's e-mail/).inputValue(), '');
    assert.equal(await page.locator('form[data-testid="send-form"] mat-error').count(), 0);
    await checkA11y(page, 'report-page');
    const reportPage = page.url();
    await page.goto(e2e.baseUrl + '/dev/outbox');
    const link = page.locator('a[href*="/r/"]').first();
    await link.waitFor();
    const href = (await link.getAttribute('href')) ?? '';
    assert.match(href, /\/r\/[\w-]+\.[\w-]+$/);
    // Replying to the e-mail reaches the designer who sent it.
    const mail = page.locator('mat-card.message').filter({ hasText: client }).first();
    assert.match(await mail.innerText(), /replies to .*@/);
    await screenshot(page, 'report-email-outbox-1280');

    // The homeowner: a fresh browser with no session.
    const homeContext = await e2e.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const home = await homeContext.newPage();
    guardOffline(home, e2e.baseUrl, offenders);
    const opened = await home.goto(href);
    assert.equal(opened?.status(), 200);
    const doc = home.getByTestId('report-document');
    await doc.waitFor();
    const option = home.locator('[data-tag="99 %"]');
    assert.equal((await option.locator('.unit').innerText()).trim(), shown.unit);
    assert.equal((await option.locator('[data-figure="installedPrice"] dd').innerText()).trim(), shown.price);
    assert.ok((await home.locator('[data-tag="50-yr"]').count()) === 1, 'the coldest point is presented too');
    const words = await doc.innerText();
    assert.match(words, /licensed heating professional/);
    assert.match(words, /smaller unit keeps up/);
    assert.match(words, /Questions\?/);
    assert.match(words, /555 0142/);
    assert.match(words, /fixed: they will not change/);
    assert.doesNotMatch(words, /Heat pump bid \(demo\)/, 'no internal scenario name');
    // The homeowner reads no designer-only term (the provenance line keeps method versions only).
    const readable = words.split('Figures fixed on')[0] ?? words;
    for (const jargon of DESIGNER_ONLY) assert.doesNotMatch(readable, jargon);
    await home.locator('.report canvas').first().waitFor();
    await screenshot(home, 'report-1280');
    await checkA11y(home, 'public-report');
    await home.setViewportSize({ width: 390, height: 844 });
    await home.reload();
    await home.getByTestId('report-document').waitFor();
    await home.locator('.report canvas').first().waitFor();
    await screenshot(home, 'report-390');

    // The PDF from the link: kept beside the screenshots, and its first page drawn to look at.
    const pdfHref = await home.getByTestId('report-pdf').getAttribute('href');
    const pdf = await home.request.get(e2e.baseUrl + (pdfHref ?? ''));
    assert.equal(pdf.status(), 200);
    const bytes = await pdf.body();
    assert.equal(bytes.subarray(0, 5).toString(), '%PDF-');
    writeFileSync(path.join(SCREENSHOTS, 'report.pdf'), bytes);
    const pages = await pdfPageScreenshots(e2e.browser, bytes, 'report-pdf-page');
    assert.ok(pages >= 1);

    // Withdraw the link: the homeowner now sees a clear page and nothing of the report.
    await page.goto(reportPage);
    await page.getByTestId('report-links').getByRole('button', { name: 'Withdraw' }).first().click();
    await page.getByRole('button', { name: 'Withdraw', exact: true }).last().click();
    await page.getByTestId('report-links').locator('[data-status="revoked"]').first().waitFor();
    const reloaded = await home.reload();
    assert.equal(reloaded?.status(), 410);
    await home.getByTestId('report-gone').waitFor();
    assert.equal(await home.getByTestId('report-document').count(), 0);
    const api = await home.request.get(e2e.baseUrl + '/api/v1/public/reports/' + (href.split('/r/')[1] ?? ''));
    assert.equal(api.status(), 410);
    await screenshot(home, 'report-withdrawn-390');
    await checkA11y(home, 'public-report-withdrawn');

    assert.deepEqual(offenders, []);
    await homeContext.close();
    await context.close();
  });
});
