/**
 * A technical artist's way from a failing build to the fix, against the demo history the e2e server
 * posts through the real API: builds table, build report, the worst plottable finding's channel plot
 * with its marker, the fix preview and the fixed-asset download. A viewer sees the same plots but
 * cannot download, and the server refuses the download route to them.
 */
import { expect, test, type Page } from '@playwright/test';
import { waitForDemoHistory } from './helpers/demo-history';
import { journeyScreenshot } from './helpers/journey-screenshot';
import { demoAccount, signIn } from './sign-in';

const PROJECT = 'tidewatch-characters';

/** Opens the project's newest failed build from the builds table and returns its report URL. */
async function openLatestFailingBuild(page: Page): Promise<string> {
  await page.getByLabel('Verdict').selectOption('fail');
  await expect(page).toHaveURL(/[?&]verdict=fail/);
  const firstRow = page.locator('tbody tr[data-row]').first();
  await expect(firstRow.locator('[data-verdict="fail"]')).toBeVisible();
  await firstRow.focus();
  await page.keyboard.press('Enter');
  await expect(page).toHaveURL(/\/builds\/\d+$/);
  return page.url();
}

test('an artist follows the worst finding of the latest failing build to its channel plot and the fixed asset', async ({
  page
}, testInfo) => {
  await signIn(page, demoAccount('juno@lanternfish.example'), `/projects/${PROJECT}`);
  await waitForDemoHistory(page.request, PROJECT);
  await page.reload();
  await expect(page.getByRole('heading', { level: 1, name: 'Tidewatch Characters' })).toBeVisible();
  await expect(page.locator('tbody tr[data-row]').first()).toBeVisible();
  await journeyScreenshot(page, testInfo, 1, 'builds');

  await openLatestFailingBuild(page);
  await expect(page.getByRole('heading', { level: 2, name: 'Verdict' })).toBeVisible();
  await expect(page.locator('[data-verdict="fail"]').first()).toBeVisible();
  const findingRows = page.locator('tr[data-finding-id]');
  await expect(findingRows.first()).toBeVisible();
  // Findings come worst first: the first one is an error, since the build failed the gate.
  await expect(findingRows.first().locator('[data-severity="error"]')).toBeVisible();
  await journeyScreenshot(page, testInfo, 2, 'build-report');

  // Filters read the findings API in place and keep the URL in step.
  const total = await findingRows.count();
  await page.getByLabel('Standing', { exact: true }).selectOption('unchanged');
  await expect(page).toHaveURL(/[?&]status=unchanged/);
  await expect(page.locator('tr[data-finding-id] [data-standing]:not([data-standing="unchanged"])')).toHaveCount(0);
  await page.getByRole('button', { name: 'Clear' }).click();
  await expect(page).not.toHaveURL(/status=/);
  await expect(findingRows).toHaveCount(total);

  const worstPlottable = findingRows.filter({ has: page.getByRole('link', { name: 'Plot channel' }) }).first();
  const findingId = await worstPlottable.getAttribute('data-finding-id');
  const rule = (await worstPlottable.locator('code').first().innerText()).trim();
  await worstPlottable.getByRole('link', { name: 'Plot channel' }).click();
  await expect(page).toHaveURL(new RegExp(`/assets/\\d+\\?finding=${findingId}$`));

  const componentsChart = page.getByRole('img', { name: /^Quaternion components of / });
  await expect(componentsChart.locator('canvas')).toBeAttached();
  await expect(page.getByRole('img', { name: /^Quaternion length of / }).locator('canvas')).toBeAttached();
  await expect(page.getByRole('img', { name: /^Angular speed of / }).locator('canvas')).toBeAttached();
  // The marker of the chosen finding, in the accessible list that mirrors the plots' markers.
  const markers = page.getByRole('table', { name: 'Findings marked on this channel' });
  const marker = markers.locator(`tr[data-marker-finding="${findingId}"]`);
  await expect(marker).toContainText(rule);
  await expect(marker.getByRole('button', { name: 'Shown' })).toHaveAttribute('aria-pressed', 'true');
  await expect(componentsChart).toHaveAttribute('aria-label', /[1-9]\d* findings? marked/);
  await expect(page.getByRole('table', { name: new RegExp(`^Keys around ${rule} at key \\d+`) })).toBeVisible();
  await journeyScreenshot(page, testInfo, 3, 'channel-plot');

  await page.getByLabel('Show after fix').check();
  await expect(page.getByRole('status').filter({ hasText: /automatic (key )?fixes/ })).toBeVisible();
  await expect(page.getByRole('table', { name: /after fix \(preview\)$/ })).toBeVisible();
  await journeyScreenshot(page, testInfo, 4, 'after-fix');

  const downloadLink = page.getByRole('link', { name: 'Download fixed asset' });
  await expect(downloadLink).toBeVisible();
  const [download] = await Promise.all([page.waitForEvent('download'), downloadLink.click()]);
  expect(download.suggestedFilename()).toMatch(/\.fixed\.glb$/);
  const saved = testInfo.outputPath(download.suggestedFilename());
  await download.saveAs(saved);
  await testInfo.attach('fixed-asset', { path: saved, contentType: 'model/gltf-binary' });
});

test('a viewer sees the channel plot without a download, and the fixed-asset route answers 403', async ({
  page
}, testInfo) => {
  await signIn(page, demoAccount('odile@lanternfish.example'), `/projects/${PROJECT}`);
  await waitForDemoHistory(page.request, PROJECT);
  await page.reload();
  await openLatestFailingBuild(page);
  await expect(page.locator('tr[data-finding-id]').first()).toBeVisible();
  await expect(page.getByRole('link', { name: 'Propose waiver' })).toHaveCount(0);
  await page.getByRole('link', { name: 'Plot channel' }).first().click();
  await expect(page.getByRole('img', { name: /^Quaternion components of / }).locator('canvas')).toBeAttached();
  await expect(page.getByRole('link', { name: 'Download fixed asset' })).toHaveCount(0);
  await journeyScreenshot(page, testInfo, 1, 'viewer-channel-plot');

  // Another channel from the node tree replaces the plots in place.
  const tree = page.getByRole('navigation', { name: 'Animated nodes and their rotation channels' });
  const otherHref = await tree.locator('a:not([aria-current])').first().getAttribute('href');
  const other = tree.locator(`a[href="${otherHref}"]`);
  await other.click();
  await expect(page).toHaveURL(/[?&]channel=\d+:\d+/);
  await expect(other).toHaveAttribute('aria-current', 'true');
  await expect(page.getByRole('img', { name: /^Quaternion components of / }).locator('canvas')).toBeAttached();

  const fixedPath = new URL(page.url()).pathname + '/fixed';
  const response = await page.request.get(fixedPath);
  expect(response.status()).toBe(403);
  expect(response.headers()['content-type']).not.toContain('gltf');
});
