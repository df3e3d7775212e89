import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import type { Page } from 'playwright-core';
import { buildingSchema } from '../shared/building/building-schemas';
import { heatLoss } from '../shared/building/heat-loss';
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

// Invented equipment for the test (W columns).
const CSV = [
  'kind,label,output_w,input_w,efficiency,fuel,cap_8_3_w,cop_8_3,cap_m8_3_w,cop_m8_3,cap_m15_w,cop_m15,backup_w,installed_price,life_years',
  'heat-pump,Test heat pump 2 t,,,,electricity,7300,3.9,5600,2.5,4700,2.0,5000,11200.00,15',
  'heat-pump,Test heat pump 3 t,,,,electricity,10500,3.7,8200,2.4,6900,1.9,10000,13900.00,15',
  'furnace,Test furnace 60k,17600,,0.96,gas,,,,,,,,5180.00,20',
].join('\n');

// NIST SP 811 (2008), Appendix B: 1 Btu_IT/h = 0.29307107 W; 1 ft³ = 0.028316846592 m³ (exact);
// °F → °C: (t − 32)·5/9 (exact). ΔT of 1 °F = 5/9 K.
const BTUH_W = 0.29307107;
const FT3_M3 = 0.028316846592;

const designLoadBtuh = async (page: Page) => {
  const text = await page.getByTestId('design-load').innerText();
  const m = /([\d,]+)\s*Btu\/h/.exec(text);
  assert.ok(m, `design load "${text}" in Btu/h`);
  return Number(m[1]?.replace(/,/g, ''));
};

describe('a project’s building in a real browser', () => {
  it('is entered in IP units, shows the live heat loss with the heat pumps, and reads the same after a reload', async () => {
    const { context, page, offenders } = await newOwnerPage(e2e, { name: 'Bea Builder', emailPrefix: 'building' });
    await page.getByRole('radio', { name: 'IP units (inch-pound)' }).click();

    // A site with published values (through the API, with the page's session).
    const site = await page.request.post(e2e.baseUrl + '/api/v1/climate-sites', {
      headers: { 'X-Requested-With': 'tailroom' },
      data: {
        name: 'Test site (invented)',
        sourceKind: 'published',
        publishedValues: { source: 'Invented for the test', heating: { db99_6: -20, db99: -17.5 } },
      },
    });
    assert.equal(site.status(), 201);

    // An equipment list imported from CSV.
    await page.getByRole('link', { name: 'Equipment' }).first().click();
    await page.getByRole('button', { name: 'New equipment list' }).waitFor();
    await checkA11y(page, 'equipment-lists');
    await page.getByRole('button', { name: 'New equipment list' }).click();
    await page.getByLabel(/^List name/).fill('Test line');
    await page.getByRole('button', { name: 'Create list' }).click();
    await page.getByTestId('options-table').or(page.getByTestId('csv-import')).first().waitFor();
    await page.getByTestId('csv-import').click();
    await page.getByTestId('csv-text').fill(CSV);
    await page.getByTestId('csv-preview-button').click();
    await page.getByTestId('csv-add').click();
    await page.getByTestId('save').click();
    await page.getByTestId('unsaved').waitFor({ state: 'detached' });
    await checkA11y(page, 'equipment-list');

    // A project using both.
    await page.getByRole('link', { name: 'Projects' }).first().click();
    await page.getByRole('button', { name: 'New project' }).click();
    await page.getByLabel(/^Project name/).fill('Test cottage');
    await checkA11y(page, 'new-project-dialog');
    await page.getByLabel(/^Climate site/).click();
    await page.getByRole('option', { name: /Test site/ }).click();
    await page.getByRole('button', { name: 'Create project' }).click();
    // A new project opens at once.
    await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    await page.getByLabel(/^Equipment list/).click();
    await page.getByRole('option', { name: /Test line/ }).click();
    await page.getByText('Equipment list chosen').waitFor();

    // The building, typed in IP units.
    const section = page.getByTestId('building-section');
    await section.getByLabel(/^Indoor design temperature/).fill('70');
    await section.getByRole('radio', { name: 'UA entered directly' }).check();
    await section.getByLabel(/^Conduction UA/).fill('300');
    await section.getByRole('radio', { name: 'Natural air changes (ACH)' }).check();
    await section.getByRole('spinbutton', { name: /^Natural air changes/ }).fill('0.35');
    await section.getByLabel(/^Heated volume/).fill('14000');
    await section.getByRole('radio', { name: 'Time constant' }).check();
    await section.getByRole('spinbutton', { name: /^Time constant/ }).fill('40');

    // The same inputs through the engine, converted by the published factors.
    const building = buildingSchema.parse({
      indoorDesignC: ((70 - 32) * 5) / 9,
      conduction: { mode: 'ua', uaWPerK: (300 * BTUH_W * 9) / 5 },
      airLeakage: { mode: 'ach', ach: 0.35, volumeM3: 14000 * FT3_M3 },
      thermalMass: { mode: 'hours', timeConstantH: 40 },
    });
    const expectedBtuh = heatLoss(building, -17.5, 6.7).designLoadW / BTUH_W;
    await page.getByTestId('heat-loss-chart').locator('canvas').first().waitFor();
    const live = await designLoadBtuh(page);
    assert.ok(Math.abs(live - expectedBtuh) <= 100, `live ${live} Btu/h vs ${expectedBtuh.toFixed(0)} Btu/h`);
    await page.getByRole('button', { name: 'Save building' }).click();
    await page
      .getByText(/Building saved/i)
      .first()
      .waitFor();
    await page.waitForTimeout(300);
    await screenshot(page, 'building-1280');
    await checkA11y(page, 'project-building');

    // After a reload, and after a round trip through SI, the same numbers.
    await page.reload();
    await page.getByTestId('design-load').waitFor();
    assert.equal(await designLoadBtuh(page), live);
    assert.equal(
      await page
        .getByTestId('building-section')
        .getByLabel(/^Conduction UA/)
        .inputValue(),
      '300',
    );
    await page.getByRole('radio', { name: 'SI units (metric)' }).click();
    await page.getByTestId('design-load').filter({ hasText: /kW/ }).waitFor();
    await page.getByRole('radio', { name: 'IP units (inch-pound)' }).click();
    await page
      .getByTestId('design-load')
      .filter({ hasText: /Btu\/h/ })
      .waitFor();
    assert.equal(await designLoadBtuh(page), live);

    await page.setViewportSize({ width: 390, height: 844 });
    await page.waitForTimeout(300);
    await screenshot(page, 'building-390');
    assert.deepEqual(offenders, []);
    await context.close();
  });
});
