import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import { checkA11y } from './support/a11y';
import { guardOffline, screenshot, seedDemoData, signInAsDemo, startE2eApp, type E2eApp } from './support/e2e-app';

let e2e: E2eApp;
before(async () => {
  await seedDemoData();
  e2e = await startE2eApp();
});
after(async () => {
  await e2e.close();
});

interface Row {
  label: string;
  compressorAtDesignW: number | null;
  backupHoursPerYear: number | null;
  backupEnergyKWh: number | null;
  lowestIndoorC: number | null;
  lifeCycleCost: string | null;
}

describe('a heat-pump scenario in a real browser', () => {
  it('shows the compressor, backup hours and energy, the study period and the lowest indoor temperature, on screen and in the report', async () => {
    const offenders: string[] = [];
    const context = await e2e.browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    guardOffline(page, e2e.baseUrl, offenders);
    await signInAsDemo(page, e2e.baseUrl, 'designer');

    await page.getByRole('link', { name: /Fernbrook Lane/ }).click();
    await page.getByTestId('scenario-list').getByRole('link', { name: 'Heat pump bid (demo)', exact: true }).click();
    await page.waitForURL(/\/scenarios\//);
    await page.getByTestId('tradeoff-sentence').waitFor();
    await page.getByTestId('design-slider').focus();
    await page.keyboard.press('Home');
    await page.getByTestId('chosen-temperature').filter({ hasText: '(99 % design temperature)' }).waitFor();

    // The rule in force is stated, and the figures are the API's for the 99 % design temperature.
    assert.match(await page.getByTestId('sweep-rules').innerText(), /sized on the compressor alone/);
    assert.match(await page.getByTestId('sweep-rules').innerText(), /20-year study period/);
    const scenarioUrl = new URL(page.url()).pathname;
    const api = await page.request.post(`${e2e.baseUrl}/api/v1${scenarioUrl}/sweep`, {
      headers: { 'X-Requested-With': 'tailroom' },
    });
    const body = (await api.json()) as { heatPumpSizing: string; studyPeriodYears: number; rows: Row[] };
    assert.equal(body.heatPumpSizing, 'compressor');
    const r99 = body.rows.find((r) => r.label === '99 %');
    assert.ok(
      r99?.compressorAtDesignW &&
        r99.backupHoursPerYear !== null &&
        r99.backupEnergyKWh !== null &&
        r99.lowestIndoorC !== null,
    );

    const compressor = await page.getByTestId('chosen-compressor').innerText();
    assert.equal(compressor, `${(r99.compressorAtDesignW / 1000).toFixed(1)} kW`);
    const backupHours = await page.getByTestId('chosen-backup-hours').innerText();
    // Shown to 0.1 h below 10 h and to the hour above.
    const shownHours = Number(backupHours.replace(/,/g, ''));
    assert.ok(
      Math.abs(shownHours - r99.backupHoursPerYear) <= (r99.backupHoursPerYear < 10 ? 0.05 : 0.5) + 1e-9,
      `backup hours shown ${backupHours}, API ${String(r99.backupHoursPerYear)}`,
    );
    assert.equal(
      await page.getByTestId('chosen-backup-energy').innerText(),
      // Written like hours: one decimal below 10 kWh, "< 0.1 kWh" for a little that would round to none.
      r99.backupEnergyKWh > 0 && r99.backupEnergyKWh < 0.05
        ? '< 0.1 kWh'
        : r99.backupEnergyKWh > 0 && r99.backupEnergyKWh < 10
          ? `${r99.backupEnergyKWh.toFixed(1)} kWh`
          : `${Math.round(r99.backupEnergyKWh).toLocaleString('en-US')} kWh`,
    );
    assert.match(
      await page.getByTestId('chosen-lcc').innerText(),
      /over a 20-year study period \(unit life 15 years\)/,
    );
    assert.match(
      await page.getByTestId('chosen-lowest-indoor').innerText(),
      new RegExp(`^${r99.lowestIndoorC.toFixed(1).replace('-', '−')} °C`),
    );
    await page.getByTestId('design-temps-table').getByText('Backup kWh / yr').waitFor();
    await page.getByTestId('tradeoff-chart').locator('canvas').first().waitFor();
    await screenshot(page, 'heat-pump-tradeoff-1280');
    await checkA11y(page, 'heat-pump-tradeoff');

    // The client report presents the same figures in plain words.
    await page.getByRole('button', { name: 'New client report' }).click();
    await page.getByLabel(/^Title/).fill('Heat pump options for Fernbrook Lane');
    await page.getByRole('button', { name: 'Create report' }).click();
    await page.waitForURL(/\/reports\//);
    const doc = page.getByTestId('report-document');
    await doc.waitFor();
    const point = page.locator('[data-tag="99 %"]');
    assert.equal((await point.locator('[data-figure="compressor"] dd').innerText()).trim(), compressor);
    assert.match((await point.locator('[data-figure="backupHours"] dd').innerText()).trim(), /^(about [\d.,]+|none)$/);
    assert.equal(
      (await point.locator('[data-figure="backupEnergy"] dd').innerText()).trim(),
      Math.round(r99.backupEnergyKWh) === 0
        ? 'none'
        : `about ${Math.round(r99.backupEnergyKWh).toLocaleString('en-US')} kWh`,
    );
    assert.match((await point.locator('[data-figure="lifeCycleCost"] dd').innerText()).trim(), /over 20 years$/);
    assert.match((await point.locator('[data-figure="lowestIndoor"] dd').innerText()).trim(), /°C$/);
    assert.match(await doc.innerText(), /backup heat/);
    await screenshot(page, 'heat-pump-report-1280');
    await checkA11y(page, 'heat-pump-report');
    assert.deepEqual(offenders, []);
    await context.close();
  });
});
