/**
 * A viewer reads a project but cannot reach its settings: the page answers 403 with a message that
 * says why, the tab is not offered, and the policy and token API refuse the same session with 403.
 * Waivers are readable, but the proposal form is not offered and the server refuses a proposal.
 */
import { expect, test } from '@playwright/test';
import { journeyScreenshot } from './helpers/journey-screenshot';
import { demoAccount, signIn } from './sign-in';

const PROJECT = 'tidewatch-characters';

test('a viewer gets 403 from the settings page and from the policy and token API', async ({ page }, testInfo) => {
  await signIn(page, demoAccount('odile@lanternfish.example'), `/projects/${PROJECT}`);
  await expect(page.getByRole('navigation', { name: /sections/ }).getByRole('link', { name: 'Settings' })).toHaveCount(
    0
  );
  // The top bar does not offer the Quick check page, which needs the artist role somewhere.
  await expect(page.getByRole('link', { name: 'Projects' }).first()).toBeVisible();
  await expect(page.getByRole('link', { name: 'Quick check' })).toHaveCount(0);
  expect((await page.request.get('/check')).status()).toBe(403);

  const response = await page.goto(`/projects/${PROJECT}/settings`);
  expect(response?.status()).toBe(403);
  await expect(page.getByText(/needs the lead role/)).toBeVisible();
  await journeyScreenshot(page, testInfo, 1, 'settings-forbidden');

  for (const path of ['policy', 'tokens']) {
    const answer = await page.request.get(`/api/v1/projects/${PROJECT}/${path}`);
    expect(answer.status(), path).toBe(403);
    expect(((await answer.json()) as { error: { code: string } }).error.code).toBe('project.role-required');
  }
  const put = await page.request.put(`/api/v1/projects/${PROJECT}/policy`, {
    data: { policy: { wideArcDegrees: 170 } }
  });
  expect(put.status()).toBe(403);
  const create = await page.request.post(`/api/v1/projects/${PROJECT}/tokens`, { data: { name: 'sneaky' } });
  expect(create.status()).toBe(403);
});

test('a viewer reads the waivers and trends but cannot propose a waiver', async ({ page }, testInfo) => {
  await signIn(page, demoAccount('odile@lanternfish.example'), `/projects/${PROJECT}/waivers`);
  await expect(page.getByRole('heading', { level: 1, name: 'Waivers' })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Propose waiver' })).toHaveCount(0);
  await expect(page.getByText('Viewers can read waivers but not propose them.')).toBeVisible();
  await journeyScreenshot(page, testInfo, 1, 'waivers-read-only');

  const proposal = await page.request.post(`/api/v1/projects/${PROJECT}/waivers`, {
    data: { scope: 'fingerprint', fingerprint: '0123456789abcdef', reason: 'Looks fine.' }
  });
  expect(proposal.status()).toBe(403);

  const trends = await page.goto(`/projects/${PROJECT}/trends`);
  expect(trends?.status()).toBe(200);
  await expect(page.getByRole('heading', { level: 1, name: 'Trends' })).toBeVisible();
});
