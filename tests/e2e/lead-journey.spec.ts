/**
 * A lead's journeys: an artist proposes a waiver for the blocking finding of a failing build from
 * its report, the lead approves it on the waivers page, and the next build CI posts with the same
 * assets passes. Also the lead's other screens: trends, settings (a policy saved as a new revision,
 * a token shown once) and the in-browser check of a meshopt-compressed file against the production build.
 */
import { expect, test } from '@playwright/test';
import { journeyScreenshot } from './helpers/journey-screenshot';
import { createProjectToken, meshoptDiverGlb, postDiverBuild, waitForDemoBuilds } from './helpers/project-builds';
import { demoAccount, signIn } from './sign-in';

// Cinematics: no other journey counts its builds or depends on its policy, so the builds and the
// policy revision made here change nothing for them.
const PROJECT = 'tidewatch-cinematics';

test('a waiver an artist proposes and a lead approves lets the next build with the same assets pass', async ({
  browser,
  baseURL
}, testInfo) => {
  const stamp = Date.now().toString(36);
  const branch = `e2e/waiver-${stamp}`;
  const assetPath = `cameras/e2e/kelp-diver-${stamp}.glb`;

  const artistContext = await browser.newContext();
  const artist = await artistContext.newPage();
  await signIn(artist, demoAccount('lesedi@lanternfish.example'), `/projects/${PROJECT}`);
  await waitForDemoBuilds(artist.request, PROJECT);

  const leadContext = await browser.newContext();
  const lead = await leadContext.newPage();
  await signIn(lead, demoAccount('priya@lanternfish.example'), `/projects/${PROJECT}`);
  const secret = await createProjectToken(lead.request, PROJECT, `E2E waiver journey ${stamp}`);

  // CI posts a build whose diver has a zero-length key: a new error against the base branch.
  const failing = await postDiverBuild(baseURL!, PROJECT, secret, {
    assetPath,
    branch,
    label: `e2e ${stamp} #1`,
    defect: 'zero-key'
  });
  expect(failing.verdict).toBe('fail');

  // The artist opens the failing build and proposes a waiver for its blocking finding.
  await artist.goto(`/projects/${PROJECT}/builds/${failing.id}`);
  const blocking = artist
    .locator('tr[data-finding-id]')
    .filter({ has: artist.locator('[data-severity="error"]') })
    .first();
  await expect(blocking).toBeVisible();
  await journeyScreenshot(artist, testInfo, 1, 'failing-build');
  await blocking.getByRole('link', { name: 'Propose waiver' }).click();
  await expect(artist).toHaveURL(/\/waivers\?.*fingerprint=[0-9a-f]{16}/);
  const fingerprint = new URL(artist.url()).searchParams.get('fingerprint')!;
  await expect(artist.locator('[data-waiver-finding]')).toContainText(assetPath);
  await expect(artist.getByRole('textbox', { name: 'Fingerprint' })).toHaveValue(fingerprint);
  await artist.getByRole('button', { name: 'Propose waiver' }).click();
  await expect(artist.getByText('Say why this finding is acceptable.')).toBeVisible();
  await artist
    .getByLabel('Reason')
    .fill('The diver holds a zero key on purpose while the rig is swapped; fixed in the next export.');
  await artist.getByRole('button', { name: 'Propose waiver' }).click();
  await expect(artist.getByRole('status').filter({ hasText: /proposed; a lead/ })).toBeVisible();
  const proposal = artist.locator('[data-waiver-group="proposed"] article').filter({ hasText: fingerprint });
  await expect(proposal).toBeVisible();
  // Artists cannot decide: no approve button for them.
  await expect(proposal.getByRole('button', { name: 'Approve' })).toHaveCount(0);
  await journeyScreenshot(artist, testInfo, 2, 'waiver-proposed');

  // Until a lead approves, the next build still fails.
  const stillFailing = await postDiverBuild(baseURL!, PROJECT, secret, {
    assetPath,
    branch,
    label: `e2e ${stamp} #2`,
    defect: 'zero-key'
  });
  expect(stillFailing.verdict).toBe('fail');

  // The lead approves it on the waivers page, with a note.
  await lead.goto(`/projects/${PROJECT}/waivers`);
  const waiting = lead.locator('[data-waiver-group="proposed"] article').filter({ hasText: fingerprint });
  await waiting.getByPlaceholder('Note for the history (optional)').fill('Agreed until the rig swap lands.');
  await journeyScreenshot(lead, testInfo, 3, 'waiver-waiting');
  await waiting.getByRole('button', { name: 'Approve' }).click();
  const approved = lead.locator('[data-waiver-group="approved"] article').filter({ hasText: fingerprint });
  await expect(approved).toBeVisible();
  await expect(approved.locator('[data-waiver-state="approved"]')).toHaveText(/In force/);
  await expect(lead.locator('tr[data-waiver-event="approved"]').first()).toContainText(
    'Agreed until the rig swap lands.'
  );
  await journeyScreenshot(lead, testInfo, 4, 'waiver-approved');

  // CI posts the same assets again: the waiver applies and the build passes.
  const passing = await postDiverBuild(baseURL!, PROJECT, secret, {
    assetPath,
    branch,
    label: `e2e ${stamp} #3`,
    defect: 'zero-key'
  });
  expect(passing.verdict).toBe('pass');
  expect(passing.counts.waived).toBeGreaterThanOrEqual(1);
  await lead.goto(`/projects/${PROJECT}/builds/${passing.id}`);
  await expect(lead.locator('[data-verdict="pass"]').first()).toBeVisible();
  await journeyScreenshot(lead, testInfo, 5, 'next-build-passes');

  // The waivers page now counts the build it was applied in.
  await lead.goto(`/projects/${PROJECT}/waivers`);
  await expect(lead.locator('[data-waiver-group="approved"] article').filter({ hasText: fingerprint })).toContainText(
    /Applied in\s*1 build/
  );
  await artistContext.close();
  await leadContext.close();
});

test('a lead reads the trends, saves a policy revision and creates a token shown once', async ({ page }, testInfo) => {
  await signIn(page, demoAccount('priya@lanternfish.example'), `/projects/${PROJECT}/trends`);
  await waitForDemoBuilds(page.request, PROJECT);
  await page.goto(`/projects/${PROJECT}/trends?from=2000-01-01`);
  await expect(page.getByRole('heading', { level: 1, name: 'Trends' })).toBeVisible();
  await expect(page.locator('[data-trend-chart]')).toHaveCount(3);
  await expect(page.locator('[data-time-to-fix]')).toBeVisible();
  await journeyScreenshot(page, testInfo, 1, 'trends');
  // Every chart has its numbers as a table one click away.
  const severityPanel = page.locator('[data-chart-panel]').first();
  await severityPanel.getByRole('button', { name: 'Table' }).click();
  await expect(severityPanel.getByRole('table')).toBeVisible();
  // The 7-day preset changes the URL and reloads in place.
  await page.getByRole('button', { name: '7 days' }).click();
  await expect(page).toHaveURL(/from=\d{4}-\d{2}-\d{2}/);

  await page.goto(`/projects/${PROJECT}/settings`);
  const revisionLine = page.locator('[data-policy-revision]');
  const before = Number(await revisionLine.getAttribute('data-policy-revision'));
  await page.getByLabel('Wide arc above').fill('wide');
  await expect(page.locator('[data-field-error="wideArcDegrees"]')).toHaveText(/is not a number/);
  await page.getByLabel('Wide arc above').fill('200');
  // policySchema: wideArcDegrees is at most 180.
  await expect(page.locator('[data-field-error="wideArcDegrees"]')).toHaveText('Must be at most 180.');
  await journeyScreenshot(page, testInfo, 2, 'policy-inline-error');
  await Promise.all([
    page.waitForResponse((response) => response.url().includes('?/savePolicy')),
    page.getByRole('button', { name: /^Save as revision/ }).click()
  ]);
  // The server refuses it too and keeps the typed value.
  await expect(page.getByLabel('Wide arc above')).toHaveValue('200');
  await expect(revisionLine).toHaveAttribute('data-policy-revision', String(before));
  await page.getByLabel('Wide arc above').fill(String(150 + (before % 10) + 1));
  await page.getByRole('button', { name: /^Save as revision/ }).click();
  await expect(page.getByRole('status').filter({ hasText: `Saved revision ${before + 1}` })).toBeVisible();
  await expect(revisionLine).toHaveAttribute('data-policy-revision', String(before + 1));
  await expect(revisionLine).toContainText('Priya Castellane');

  await page.getByLabel('New token name').fill('E2E token shown once');
  await page.getByRole('button', { name: 'Create token' }).click();
  const created = page.locator('[data-created-token]');
  await expect(created).toContainText('not shown again');
  await expect(created.locator('pre code')).toHaveText(/^ort_[A-Za-z0-9_-]{43}$/);
  await journeyScreenshot(page, testInfo, 3, 'token-created');
  await page.reload();
  await expect(page.locator('[data-created-token]')).toHaveCount(0);
  const tokenRow = page.locator('tr[data-token-id]').filter({ hasText: 'E2E token shown once' });
  await expect(tokenRow).toContainText('Active');
  page.once('dialog', (dialog) => void dialog.accept());
  await tokenRow.getByRole('button', { name: 'Revoke E2E token shown once' }).click();
  await expect(tokenRow).toContainText('Revoked');

  // Members: add an existing account, change its role, remove it again.
  await page.getByLabel('Add by e-mail').fill('juno@lanternfish.example');
  await page.getByLabel('Role', { exact: true }).selectOption('viewer');
  await page.getByRole('button', { name: 'Add member' }).click();
  const member = page.locator('tr[data-member="juno@lanternfish.example"]');
  await expect(member.getByLabel('Role of Juno Abara', { exact: true })).toHaveValue('viewer');
  await page.getByLabel('Add by e-mail').fill('nobody@lanternfish.example');
  await page.getByRole('button', { name: 'Add member' }).click();
  await expect(page.getByText(/No account uses nobody@lanternfish\.example/)).toBeVisible();
  await member.getByLabel('Role of Juno Abara', { exact: true }).selectOption('artist');
  await member.getByRole('button', { name: 'Change the role of Juno Abara' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Role changed.' })).toBeVisible();
  await expect(member.getByLabel('Role of Juno Abara', { exact: true })).toHaveValue('artist');
  await journeyScreenshot(page, testInfo, 4, 'members');
  page.once('dialog', (dialog) => void dialog.accept());
  await member.getByRole('button', { name: 'Remove Juno Abara' }).click();
  await expect(member).toHaveCount(0);
});

test('a lead checks a meshopt-compressed file in the browser, nothing uploaded, and downloads SARIF', async ({
  page
}, testInfo) => {
  await signIn(page, demoAccount('priya@lanternfish.example'), '/check');
  await page.waitForLoadState('networkidle');
  const uploads: string[] = [];
  page.on('request', (request) => {
    if (request.method() !== 'GET') uploads.push(`${request.method()} ${request.url()}`);
  });
  await page.locator('[data-file-input]').setInputFiles({
    name: 'kelp-diver-meshopt.glb',
    mimeType: 'model/gltf-binary',
    buffer: Buffer.from(await meshoptDiverGlb())
  });
  const result = page.locator('[data-check-result]');
  await expect(result).toBeVisible();
  await expect(page.locator('tr[data-asset="kelp-diver-meshopt.glb"]')).not.toContainText('unreadable');
  await expect(page.locator('tr[data-finding-rule="hemisphere-jump"]')).toHaveCount(1);
  await journeyScreenshot(page, testInfo, 1, 'check-result');
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: 'SARIF' }).click()
  ]);
  expect(download.suggestedFilename()).toBe('orientry-check.sarif');
  expect(uploads).toEqual([]);
});
