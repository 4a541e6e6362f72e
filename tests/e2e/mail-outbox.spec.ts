/**
 * An admin reads the e-mail a regressing build sent, on the mail outbox screen: the e2e server has
 * no SMTP_URL, so its local mail catcher keeps every message. The build goes through the real API
 * with a project token the admin creates; the e-mail's link leads to the build report.
 */
import { expect, test } from '@playwright/test';
import { diverGlb } from '../integration/api-fixtures';
import { waitForDemoHistory } from './helpers/demo-history';
import { journeyScreenshot } from './helpers/journey-screenshot';
import { demoAccount, signIn } from './sign-in';

const PROJECT = 'tidewatch-props';
const NODE_NAME = '<script>alert(1)</script>';

test('an admin opens the e-mail of a regressing build in the mail outbox and follows it to the build report', async ({
  page,
  baseURL
}, testInfo) => {
  await signIn(page, demoAccount('wren@lanternfish.example'), '/');
  await waitForDemoHistory(page.request, PROJECT);

  const tokenResponse = await page.request.post(`/api/v1/projects/${PROJECT}/tokens`, {
    data: { name: 'Mail outbox check' }
  });
  expect(tokenResponse.status()).toBe(201);
  const { token } = (await tokenResponse.json()) as { token: { secret: string } };

  const label = `mail-${Date.now()}`;
  const upload = await page.request.post(`/api/v1/projects/${PROJECT}/builds`, {
    headers: { authorization: `Bearer ${token.secret}`, origin: baseURL!, accept: 'application/json' },
    multipart: {
      meta: JSON.stringify({ branch: 'feature/mail-check', label }),
      file: {
        name: 'diver.glb',
        mimeType: 'model/gltf-binary',
        buffer: Buffer.from(await diverGlb({ defect: 'zero-key', jointName: NODE_NAME }))
      }
    }
  });
  expect(upload.status()).toBe(201);
  const { build } = (await upload.json()) as { build: { id: number; verdict: string } };
  expect(build.verdict).toBe('fail');

  await page.goto('/admin/outbox');
  await expect(page.getByRole('heading', { level: 1, name: 'Mail outbox' })).toBeVisible();
  const outboxRow = page.locator('tr[data-outbox-id]').filter({ hasText: label });
  // The worker sends within a poll or two; reload until the caught copy is listed.
  await expect(async () => {
    await page.reload();
    await expect(outboxRow.locator('[data-status="sent"]')).toBeVisible({ timeout: 1_000 });
    await expect(page.locator('tr[data-caught-id]').filter({ hasText: label })).toBeVisible({ timeout: 1_000 });
  }).toPass({ timeout: 30_000 });
  await expect(outboxRow).toContainText(`[Tidewatch Props] feature/mail-check · build ${label} failed: 1 new finding`);
  await expect(outboxRow).toContainText('priya@lanternfish.example');
  await journeyScreenshot(page, testInfo, 1, 'mail-outbox');

  await page.locator('tr[data-caught-id]').filter({ hasText: label }).getByRole('link').click();
  await expect(page).toHaveURL(/\/admin\/outbox\/caught\/\d+$/);
  const frame = page.frameLocator('iframe[data-mail-html]');
  await expect(page.locator('iframe[data-mail-html]')).toHaveAttribute('sandbox', '');
  // The node name arrives as text, not as markup.
  await expect(frame.getByText(`/Diver/${NODE_NAME} · Swim · 1.0 s`, { exact: true })).toBeVisible();
  await journeyScreenshot(page, testInfo, 2, 'caught-mail');

  const reportLink = frame.getByRole('link', { name: 'Open the build report' });
  const href = await reportLink.getAttribute('href');
  expect(href).toBe(`${baseURL}/projects/${PROJECT}/builds/${build.id}`);
  await page.getByRole('tab', { name: /Headers/ }).click();
  await expect(page.getByRole('row', { name: /List-Unsubscribe-Post/ })).toContainText('List-Unsubscribe=One-Click');

  // The preview lists the message's links outside the sandbox, where they can be followed.
  await page.locator('[data-mail-links]').getByRole('link', { name: href!, exact: true }).click();
  await expect(page).toHaveURL(href!);
  await expect(page.locator('[data-verdict="fail"]').first()).toBeVisible();
  await journeyScreenshot(page, testInfo, 3, 'build-report');
});

test('people who are not admins cannot open the mail outbox', async ({ page }) => {
  await signIn(page, demoAccount('priya@lanternfish.example'), '/');
  const response = await page.goto('/admin/outbox');
  expect(response?.status()).toBe(403);
  await page.getByRole('button', { name: 'Account menu' }).click();
  await expect(page.getByRole('link', { name: 'Profile' })).toBeVisible();
  await expect(page.getByRole('link', { name: 'Mail outbox' })).toHaveCount(0);
});
