import { expect, test } from '@playwright/test';
import { DEMO_PROJECTS } from '../../src/lib/server/demo/demo-accounts';
import { demoAccount, signIn } from './sign-in';

test('an admin signs in and the home page lists every seeded project', async ({ page }, testInfo) => {
  await signIn(page, demoAccount('wren@lanternfish.example'));
  await expect(page).toHaveURL(/\/$/);
  for (const project of DEMO_PROJECTS) {
    await expect(page.getByText(project.name, { exact: true }).first()).toBeVisible();
  }
  const screenshot = testInfo.outputPath('home.png');
  await page.screenshot({ path: screenshot, fullPage: true });
  await testInfo.attach('home', { path: screenshot, contentType: 'image/png' });
});

test('an artist sees only the projects they are a member of', async ({ page }) => {
  await signIn(page, demoAccount('juno@lanternfish.example'));
  await expect(page.getByText('Tidewatch Characters', { exact: true }).first()).toBeVisible();
  await expect(page.getByText('Tidewatch Props', { exact: true })).toHaveCount(0);
  await expect(page.getByText('Tidewatch Cinematics', { exact: true })).toHaveCount(0);
});
