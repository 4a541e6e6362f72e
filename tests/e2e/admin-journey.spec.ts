/**
 * An admin invites a new colleague: the one-time link shows on the users page, the colleague opens
 * it without an account, sets a name and password, and signs in. A used link then says so, and
 * non-admins cannot open the users page at all.
 */
import { expect, test } from '@playwright/test';
import { journeyScreenshot } from './helpers/journey-screenshot';
import { demoAccount, signIn } from './sign-in';

test('an admin invites a user, the invitation is accepted, and the new user signs in', async ({
  browser
}, testInfo) => {
  const email = `maren.${Date.now().toString(36)}@lanternfish.example`;
  const password = 'brass-lantern-at-dusk';

  const adminContext = await browser.newContext();
  const admin = await adminContext.newPage();
  await signIn(admin, demoAccount('wren@lanternfish.example'), '/admin/users');
  await expect(admin.getByRole('heading', { level: 1, name: 'Users' })).toBeVisible();
  await admin.getByLabel('E-mail', { exact: true }).fill(email);
  await admin.getByLabel('Role', { exact: true }).selectOption('artist');
  await admin.getByRole('button', { name: 'Create invitation link' }).click();
  const linkBlock = admin.locator('[data-invitation-link]');
  await expect(linkBlock).toContainText(`Invitation for ${email} sent by e-mail`);
  const link = (await linkBlock.locator('code').innerText()).trim();
  expect(link).toMatch(/\/invite\/inv_[A-Za-z0-9_-]{43}$/);
  await expect(admin.locator(`[data-invitation="${email}"]`)).toContainText('Pending');
  await journeyScreenshot(admin, testInfo, 1, 'invitation-created');

  // The colleague has no account yet: a fresh browser without a session.
  const guestContext = await browser.newContext();
  const guest = await guestContext.newPage();
  await guest.goto(link);
  await expect(guest.getByRole('heading', { name: 'Join Orientry' })).toBeVisible();
  await expect(guest.getByText(email)).toBeVisible();
  await journeyScreenshot(guest, testInfo, 2, 'invitation-opened');
  await guest.getByLabel('Your name').fill('Maren Tidewell');
  await guest.getByLabel('Password', { exact: true }).fill('too-short');
  await guest.getByLabel('Password again').fill('too-short');
  await guest.getByRole('button', { name: 'Create my account' }).click();
  await expect(guest.getByText('Use at least 10 characters.')).toBeVisible();
  await expect(guest.getByLabel('Your name')).toHaveValue('Maren Tidewell');
  await guest.getByLabel('Password', { exact: true }).fill(password);
  await guest.getByLabel('Password again').fill(password);
  await guest.getByRole('button', { name: 'Create my account' }).click();
  await expect(guest.getByRole('heading', { name: 'Your account is ready' })).toBeVisible();
  await journeyScreenshot(guest, testInfo, 3, 'account-ready');

  await guest.getByRole('link', { name: 'Sign in' }).click();
  await expect(guest).toHaveURL(/\/signin/);
  await guest.getByLabel('E-mail').fill(email);
  await guest.getByLabel('Password').fill(password);
  await guest.getByRole('button', { name: 'Sign in' }).click();
  await expect(guest).not.toHaveURL(/\/signin/);
  await expect(guest.getByRole('button', { name: 'Account menu' })).toContainText('Maren Tidewell');
  await journeyScreenshot(guest, testInfo, 4, 'signed-in');

  // The link is spent now.
  await guest.goto(link);
  await expect(guest.getByRole('heading', { name: 'This invitation was already used' })).toBeVisible();

  // The admin sees the new account and the invitation as accepted.
  await admin.reload();
  await expect(admin.locator(`tr[data-user="${email}"]`)).toContainText('Maren Tidewell');
  await expect(admin.locator(`[data-invitation="${email}"]`)).toContainText('Accepted');
  await journeyScreenshot(admin, testInfo, 5, 'users-after');

  // Disabled, the account loses its session at once; enabled again, it signs in.
  const row = admin.locator(`tr[data-user="${email}"]`);
  await row.getByRole('button', { name: 'Disable Maren Tidewell' }).click();
  await expect(row).toContainText('Disabled');
  await guest.goto('/');
  await expect(guest).toHaveURL(/\/signin/);
  await row.getByRole('button', { name: 'Enable Maren Tidewell' }).click();
  await expect(row).toContainText('Active');
  await row.getByLabel('Site role of Maren Tidewell', { exact: true }).selectOption('lead');
  await row.getByRole('button', { name: 'Change the site role of Maren Tidewell' }).click();
  await expect(admin.getByRole('status').filter({ hasText: 'Maren Tidewell is now a lead.' })).toBeVisible();
  await adminContext.close();
  await guestContext.close();
});

test('a lead cannot open the users page', async ({ page }) => {
  await signIn(page, demoAccount('tomasz@lanternfish.example'));
  const response = await page.goto('/admin/users');
  expect(response?.status()).toBe(403);
  await expect(page.getByText('Only admins manage users and invitations.')).toBeVisible();
});

test('an expired or unknown invitation link explains itself', async ({ page }) => {
  await page.goto('/invite/inv_not-a-real-token-but-the-right-shape-at-all-xyz1');
  await expect(page.getByRole('heading', { name: 'This invitation link does not work' })).toBeVisible();
});
