import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
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

describe('plans and billing in a real browser', () => {
  it('an owner at the free plan’s limit upgrades through the provider’s checkout and can then add the project', async () => {
    const { context, page, offenders } = await newOwnerPage(e2e, { name: 'Olive Owner', emailPrefix: 'billing' });
    for (const name of ['First house', 'Second house', 'Third house']) {
      const res = await page.request.post(e2e.baseUrl + '/api/v1/projects', {
        data: { name },
        headers: { 'X-Requested-With': 'tailroom' },
      });
      assert.equal(res.status(), 201);
    }
    await page.reload();

    // The fourth: the dialog says the plan is full before anything is sent.
    await page.getByRole('button', { name: 'New project' }).click();
    const limit = page.getByTestId('plan-limit');
    await limit.waitFor();
    assert.match(await limit.innerText(), /Starter plan holds 3 active projects/);
    assert.equal(await page.getByRole('button', { name: 'Create project' }).isDisabled(), true);
    await checkA11y(page, 'new-project-at-limit');
    const refused = await page.request.post(e2e.baseUrl + '/api/v1/projects', {
      data: { name: 'Fourth house' },
      headers: { 'X-Requested-With': 'tailroom' },
    });
    assert.equal(refused.status(), 402);
    await limit.getByRole('link', { name: /Upgrade/ }).click();
    await page.waitForURL(/\/billing$/);
    await page.getByTestId('current-plan').getByText('Starter plan').waitFor();
    await screenshot(page, 'billing-starter-1280');
    await checkA11y(page, 'billing-starter');

    // Checkout on the provider's (fake's) page with the documented success card.
    await page.locator('[data-plan="crew"]').getByRole('button', { name: 'Choose Crew' }).click();
    await page.waitForURL(new RegExp('^' + e2e.payments.url.replace(/[.]/g, '\\.') + '/pay/'));
    await page.getByLabel('Card number').fill('4242 4242 4242 4242');
    await page.getByLabel('Expiry').fill('12 / 34');
    await page.getByRole('button', { name: 'Pay and subscribe' }).click();
    await page.waitForURL(/\/billing\?checkout=success$/);
    await page.getByTestId('current-plan').getByText('Crew plan').waitFor({ timeout: 20_000 });
    assert.match(await page.getByTestId('current-plan').innerText(), /Active projects: 3 of 25/);
    const events = page.getByTestId('billing-events');
    await events.waitFor();
    assert.equal(await events.locator('li').count(), e2e.payments.deliveries().length);
    assert.match(await events.innerText(), /applied: crew active/);
    await screenshot(page, 'billing-crew-1280');
    await checkA11y(page, 'billing-crew');

    // Now the fourth project goes through.
    await page.getByRole('link', { name: 'Projects' }).first().click();
    await page.getByRole('button', { name: 'New project' }).click();
    await page.getByLabel(/^Project name/).fill('Fourth house');
    assert.equal(await page.getByTestId('plan-limit').count(), 0);
    await page.getByRole('button', { name: 'Create project' }).click();
    // A new project opens at once.
    await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    await page.getByRole('heading', { name: 'Fourth house' }).first().waitFor();

    // The only other host the browser spoke to is the provider's checkout page.
    assert.deepEqual(
      offenders.filter((u) => !u.startsWith(e2e.payments.url)),
      [],
    );
    await context.close();
  });
});
