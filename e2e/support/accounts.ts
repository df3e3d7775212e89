import type { BrowserContext, Page } from 'playwright-core';
import { E2E_OUTBOX_TOKEN, guardOffline, type E2eApp } from './e2e-app';

export interface NewAccount {
  name: string;
  email: string;
  password: string;
  organizationName?: string;
}

export interface CreateAccountSteps {
  /** Runs on the check-your-e-mail state, before the link is fetched. */
  sent?: () => Promise<void>;
  /** Runs on the page behind the e-mailed link, before the password is typed. */
  finishing?: () => Promise<void>;
}

/**
 * Creates an account through the UI as a new user does: the create-account form, the e-mail's link
 * (read from the Dev outbox in the same page), then the password on the finishing page. Ends signed
 * in on Projects. Opens /create-account unless the page is already there. Answers the e-mailed link.
 */
export async function createAccountThroughUi(
  page: Page,
  baseUrl: string,
  account: NewAccount,
  steps: CreateAccountSteps = {},
): Promise<string> {
  if (!page.url().startsWith(baseUrl + '/create-account')) await page.goto(baseUrl + '/create-account');
  await page.getByLabel(/^Name/).fill(account.name);
  await page.getByLabel(/^E-mail/).fill(account.email);
  if (account.organizationName) await page.getByLabel(/^Organisation name/).fill(account.organizationName);
  await page.getByRole('button', { name: 'Continue' }).click();
  await page.getByTestId('sign-up-sent').filter({ hasText: account.email }).waitFor();
  await steps.sent?.();

  const link = await newestSignUpLink(page, baseUrl, account.email);
  await page.goto(link);
  await page.getByTestId('pending-sign-up').filter({ hasText: account.email }).waitFor();
  await steps.finishing?.();
  await page.getByLabel(/^Password/).fill(account.password);
  await page.getByLabel(/^Confirm password/).fill(account.password);
  await page.getByRole('button', { name: 'Create account' }).click();
  await page.waitForURL(/\/projects$/);
  return link;
}

/**
 * The link of the newest sign-up e-mail to `email` in the Dev outbox. The server may send the
 * e-mail after it has answered, so the outbox is read again until the link is there (up to 20 s).
 */
async function newestSignUpLink(page: Page, baseUrl: string, email: string): Promise<string> {
  const link = page.locator('mat-card').filter({ hasText: email }).locator('a[href*="/finish-sign-up/"]').first();
  const deadline = Date.now() + 20_000;
  await page.goto(`${baseUrl}/dev/outbox?token=${E2E_OUTBOX_TOKEN}`);
  for (;;) {
    try {
      await link.waitFor({ timeout: 2_000 });
      break;
    } catch (err) {
      if (Date.now() > deadline) throw new Error(`no sign-up link for ${email} in the Dev outbox`, { cause: err });
      await page.reload();
    }
  }
  const href = await link.getAttribute('href');
  if (!href?.startsWith(baseUrl + '/finish-sign-up/')) throw new Error(`unexpected sign-up link: ${String(href)}`);
  return href;
}

/**
 * A fresh browser context (1280 × 900) watched for requests off the machine and CSP violations, with a
 * new owner account made through the UI (`<prefix>.<stamp>@example.test`): the start of most browser tests.
 */
export async function newOwnerPage(
  e2e: Pick<E2eApp, 'browser' | 'baseUrl'>,
  owner: { name: string; emailPrefix: string },
): Promise<{ context: BrowserContext; page: Page; offenders: string[]; email: string }> {
  const offenders: string[] = [];
  const context = await e2e.browser.newContext({ viewport: { width: 1280, height: 900 } });
  const page = await context.newPage();
  guardOffline(page, e2e.baseUrl, offenders);
  const email = `${owner.emailPrefix}.${Date.now().toString(36)}@example.test`;
  await createAccountThroughUi(page, e2e.baseUrl, { name: owner.name, email, password: 'a long enough passphrase' });
  return { context, page, offenders, email };
}
