import { expect, type Page } from '@playwright/test';
import { DEMO_ACCOUNTS, type DemoAccount } from '../../src/lib/server/demo/demo-accounts';

/** The demo account with this e-mail (the e2e server seeds the demo scenario). */
export function demoAccount(email: string): DemoAccount {
  const account = DEMO_ACCOUNTS.find((candidate) => candidate.email === email);
  if (!account) throw new Error(`${email} is not a demo account`);
  return account;
}

/** Signs in through the sign-in form and waits until the browser has left /signin. */
export async function signIn(page: Page, account: DemoAccount, path = '/'): Promise<void> {
  await page.goto(path);
  await expect(page).toHaveURL(/\/signin/);
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).not.toHaveURL(/\/signin/);
}
