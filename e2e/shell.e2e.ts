import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import type { Page } from 'playwright-core';
import { createAccountThroughUi } from './support/accounts';
import { checkA11y } from './support/a11y';
import { guardOffline, screenshot, startE2eApp, type E2eApp } from './support/e2e-app';

let e2e: E2eApp;
before(async () => {
  e2e = await startE2eApp();
});
after(async () => {
  await e2e.close();
});

const stamp = Date.now().toString(36);
const ownerEmail = `owner.${stamp}@example.test`;
const designerEmail = `designer.${stamp}@example.test`;
const password = 'a long enough passphrase';
const orgName = `Northgate Heating ${stamp}`;

async function fontFamilyOf(page: Page, selector: string): Promise<string> {
  return page
    .locator(selector)
    .first()
    .evaluate((el) => getComputedStyle(el).fontFamily);
}

async function shippedFontLoaded(page: Page): Promise<boolean> {
  return page.evaluate(async () => {
    await document.fonts.ready;
    return [...document.fonts].some((f) => f.family.replace(/"/g, '') === 'Source Sans 3' && f.status === 'loaded');
  });
}

/** Screenshots of the page at the desktop width it has and at a phone's, named `<name>-<width>`. */
async function screenshotAtWidths(page: Page, name: string): Promise<void> {
  const size = page.viewportSize() ?? { width: 1280, height: 800 };
  await page.evaluate(async () => {
    await document.fonts.ready;
  });
  await screenshot(page, `${name}-${size.width}`);
  await page.setViewportSize({ width: 390, height: 844 });
  await screenshot(page, `${name}-390`);
  await page.setViewportSize(size);
}

/** Signs out through the user menu. */
async function signOut(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Account' }).click();
  await page.getByRole('menuitem', { name: 'Sign out', exact: true }).click();
  await page.waitForURL(/\/sign-in/);
}

describe('the app shell in a real browser', () => {
  it('create account → empty Projects → invite a designer → the designer joins from the Dev outbox link', async () => {
    const offenders: string[] = [];
    const ownerContext = await e2e.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const owner = await ownerContext.newPage();
    guardOffline(owner, e2e.baseUrl, offenders);

    // Signed out, the home page leads to sign-in.
    await owner.goto(e2e.baseUrl + '/');
    await owner.waitForURL(/\/sign-in/);
    await owner.getByRole('button', { name: 'Sign in' }).waitFor();
    assert.ok(await shippedFontLoaded(owner), 'Source Sans 3 is loaded from the app');
    assert.match(await fontFamilyOf(owner, 'body'), /Source Sans 3/);
    await screenshot(owner, 'sign-in-1280');
    await checkA11y(owner, 'sign-in');

    // Create account: the form, the e-mailed link from the Dev outbox, then the password.
    await owner.getByRole('link', { name: 'Create an account' }).click();
    await owner.waitForURL(/\/create-account/);
    await checkA11y(owner, 'create-account');
    const signUpLink = await createAccountThroughUi(
      owner,
      e2e.baseUrl,
      { name: 'Olive Owner', email: ownerEmail, password, organizationName: orgName },
      {
        sent: async () => {
          await screenshotAtWidths(owner, 'sign-up-sent');
          await checkA11y(owner, 'sign-up-sent');
        },
        finishing: async () => {
          await screenshotAtWidths(owner, 'finish-sign-up');
          await checkA11y(owner, 'finish-sign-up');
        },
      },
    );

    // The empty Projects page is home.
    await owner.getByText('No projects yet').waitFor();
    await owner.getByRole('button', { name: `Organisation: ${orgName}` }).waitFor();
    await screenshot(owner, 'projects-1280');
    await checkA11y(owner, 'projects-empty');

    // The e-mailed link works once.
    await owner.goto(signUpLink);
    await owner.getByTestId('sign-up-link-invalid').getByRole('link', { name: 'Start again' }).waitFor();
    await screenshot(owner, 'finish-sign-up-used-1280');
    await checkA11y(owner, 'finish-sign-up-used');
    await owner.goto(e2e.baseUrl + '/projects');
    await owner.getByText('No projects yet').waitFor();

    // Invite a designer.
    await owner.getByRole('link', { name: 'Team' }).first().click();
    await owner.waitForURL(/\/team$/);
    await owner.getByLabel(/^E-mail/).fill(designerEmail);
    await owner.getByRole('button', { name: 'Send invitation' }).click();
    await owner
      .locator('table')
      .filter({ hasText: designerEmail })
      .getByText(/pending/i)
      .first()
      .waitFor();
    await screenshot(owner, 'team-1280');
    await checkA11y(owner, 'team');

    // The invitation link, from the Dev outbox.
    await owner.goto(e2e.baseUrl + '/dev/outbox');
    const link = owner.locator('a[href*="/invitations/"]').first();
    await link.waitFor();
    const href = await link.getAttribute('href');
    assert.ok(href?.startsWith(e2e.baseUrl + '/invitations/'), `invitation link: ${href}`);
    await screenshot(owner, 'dev-outbox-1280');
    await checkA11y(owner, 'dev-outbox');

    // The designer, on a phone, opens it and creates an account.
    const designerContext = await e2e.browser.newContext({ viewport: { width: 390, height: 844 }, isMobile: true });
    const designer = await designerContext.newPage();
    guardOffline(designer, e2e.baseUrl, offenders);
    await designer.goto(href ?? '');
    await designer.getByText(orgName).first().waitFor();
    await checkA11y(designer, 'invitation');
    await designer.getByLabel(/^Name/).fill('Dana Designer');
    await designer.getByLabel(/^Password/).fill(password);
    await designer.getByRole('button', { name: 'Create account and join' }).click();
    await designer.waitForURL(/\/projects$/);
    await designer.getByText('No projects yet').waitFor();

    // Signs out, signs in again, and sees the organisation.
    await signOut(designer);
    await designer.goto(e2e.baseUrl + '/projects');
    await designer.waitForURL(/\/sign-in/);
    await designer.getByRole('button', { name: 'Sign in' }).waitFor();
    await screenshot(designer, 'sign-in-390');
    await designer.getByLabel(/^E-mail/).fill(designerEmail);
    await designer.getByLabel(/^Password/).fill(password);
    await designer.getByRole('button', { name: 'Sign in' }).click();
    await designer.waitForURL(/\/projects/);
    await designer.getByText('No projects yet').waitFor();
    await designer.getByRole('button', { name: `Organisation: ${orgName}` }).waitFor();
    await screenshot(designer, 'projects-390');

    // The owner sees the designer among the members.
    await owner.goto(e2e.baseUrl + '/team');
    await owner
      .locator('table')
      .filter({ hasText: designerEmail })
      .getByText(/designer/i)
      .first()
      .waitFor();

    assert.deepEqual(offenders, [], 'no request leaves the app');
    await ownerContext.close();
    await designerContext.close();
  });
});
