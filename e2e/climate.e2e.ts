import assert from 'node:assert/strict';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import { DEMO_SITES, generateDemoSeries, seriesToCsv } from '../shared/climate/demo-weather';
import { computeDesignConditions } from '../shared/climate/design-conditions';
import { newOwnerPage } from './support/accounts';
import { checkA11y } from './support/a11y';
import { screenshot, startE2eApp, type E2eApp } from './support/e2e-app';

let e2e: E2eApp;
before(async () => {
  e2e = await startE2eApp();
});
after(async () => {
  await e2e.close();
});

describe('climate sites in a real browser', () => {
  it('uploads a demo record, checks it, stores it, and shows the curve and the values', async () => {
    const site = DEMO_SITES[1];
    assert.ok(site);
    const series = generateDemoSeries(site, { years: 10 });
    const file = path.join(mkdtempSync(path.join(tmpdir(), 'tailroom-e2e-')), `${site.id}.csv`);
    writeFileSync(file, seriesToCsv(series));
    // What the values table must show: the same conventions applied to the file directly
    // (at the stored 32-bit precision).
    const f32 = (c: Float64Array) => Float64Array.from(Float32Array.from(c));
    const expected = computeDesignConditions(
      {
        ...series,
        dryBulbC: f32(series.dryBulbC),
        dewPointC: f32(series.dewPointC),
        windSpeedMs: f32(series.windSpeedMs),
      },
      { elevationM: site.elevationM },
    );
    assert.ok(expected.ok);

    const { context, page, offenders } = await newOwnerPage(e2e, { name: 'Cleo Climate', emailPrefix: 'climate' });

    await page.getByRole('link', { name: 'Climate sites' }).first().click();
    await page.getByText('No climate sites yet').waitFor();
    await checkA11y(page, 'climate-sites-empty');
    await page.getByRole('link', { name: 'New site from hourly data' }).click();
    await checkA11y(page, 'climate-site-new');
    await page.getByLabel(/^Site name/).fill(`${site.name} test upload`);
    await page.locator('[data-field="elevationM"]').fill(String(site.elevationM));
    await page.getByRole('button', { name: 'Create site and upload data' }).click();

    // The upload dialog: choose the file, send it with progress, read the quality report.
    await page.getByRole('heading', { name: 'Upload hourly data' }).waitFor();
    await page.getByTestId('upload-files').setInputFiles(file);
    await page.getByRole('button', { name: 'Upload and check' }).click();
    await page.getByTestId('years-found').waitFor();
    const found = await page.getByTestId('years-found').innerText();
    assert.match(found, /10/);
    await screenshot(page, 'climate-upload-report-1280');
    await checkA11y(page, 'climate-upload-report');
    await page.getByRole('button', { name: 'Store this record' }).click();

    // The site page: the values, the cumulative-frequency curve and the monthly chart.
    await page.getByTestId('design-values').waitFor();
    await page.getByTestId('cdf-chart').locator('canvas').first().waitFor();
    await page.getByTestId('monthly-chart').locator('canvas').first().waitFor();
    const heatingRow = await page.getByTestId('design-values').locator('[data-key="heating-99.6"]').innerText();
    const shown = expected.conditions.heating.db99_6.toFixed(1).replace('-', '−');
    assert.ok(heatingRow.includes(shown), `99.6 % row "${heatingRow}" shows ${shown}`);
    await page.getByTestId('design-caution').waitFor();

    // The site's details can be edited after the upload; the values stay.
    await page.getByRole('button', { name: 'Edit' }).click();
    await page.getByRole('heading', { name: 'Edit site' }).waitFor();
    await checkA11y(page, 'climate-site-edit');
    await page.getByLabel(/^Site name/).fill(`${site.name} test upload`);
    await page.getByLabel(/^Notes/).fill('Checked against the generated file');
    await page.getByRole('button', { name: 'Save changes' }).click();
    await page.getByTestId('design-values').waitFor();
    assert.ok(
      (await page.getByTestId('design-values').locator('[data-key="heating-99.6"]').innerText()).includes(shown),
    );
    await page.waitForTimeout(300); // let the canvas paint
    await screenshot(page, 'climate-site-1280');
    await checkA11y(page, 'climate-site');

    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(300);
    await screenshot(page, 'climate-site-390');

    // In IP units the same value reads in °F.
    await page.getByRole('radio', { name: 'IP units (inch-pound)' }).click();
    const f = ((expected.conditions.heating.db99_6 * 9) / 5 + 32).toFixed(0).replace('-', '−');
    await page
      .getByTestId('design-values')
      .locator('[data-key="heating-99.6"]')
      .filter({ hasText: `${f} °F` })
      .waitFor();

    await page.goto(e2e.baseUrl + '/climate-sites');
    await page.getByRole('link', { name: `${site.name} test upload` }).waitFor();
    await screenshot(page, 'climate-sites-390');
    await checkA11y(page, 'climate-sites');
    assert.deepEqual(offenders, []);
    await context.close();
  });
});
