/**
 * Names chosen by an upload are shown as text on every screen and in the e-mail, never run as
 * HTML. A build goes through the real API whose node, root and animation names, asset path,
 * branch and label are HTML and script that set `window.__xss`; a waiver carries one in its
 * reason. The builds list, build report, asset view, trends and waivers pages, and the build
 * e-mail in the admin mail outbox, must leave `window.__xss` undefined, open no dialog, and show
 * the text literally. The e-mail's HTML body must hold the names escaped (`&lt;script&gt;`).
 *
 * Uses Tidewatch Cinematics, whose builds no other browser test counts.
 */
import { expect, test, type Page } from '@playwright/test';
import { WebIO } from '@gltf-transform/core';
import { diverDocument } from '../integration/api-fixtures';
import { demoAccount, signIn } from './sign-in';

const PROJECT = 'tidewatch-cinematics';
const IMG = '<img src=x onerror=window.__xss=1>';
const SCRIPT = '<script>window.__xss=1</script>';
const ATTRIBUTE = '"><svg onload=window.__xss=1>';
const stamp = Date.now().toString(36);
const BRANCH = `${SCRIPT}${stamp}`;
const LABEL = `${ATTRIBUTE}${stamp}`;
const ASSET_PATH = `chars/${IMG}${stamp}.glb`;
const JOINT = IMG;
const ROOT = ATTRIBUTE;
const ANIMATION = SCRIPT;

/** The diver with a zero key (not-a-rotation, an error), its names replaced by the payloads. */
async function hostileGlb(): Promise<Uint8Array> {
  const document = diverDocument({ defect: 'zero-key', jointName: JOINT });
  document
    .getRoot()
    .listNodes()
    .find((node) => node.getName() === 'Diver')!
    .setName(ROOT);
  document.getRoot().listAnimations()[0].setName(ANIMATION);
  return new WebIO().writeBinary(document);
}

/** Fails the test on any dialog a payload might open. */
function refuseDialogs(page: Page): void {
  page.on('dialog', (dialog) => {
    throw new Error(`A dialog opened on ${page.url()}: ${dialog.message()}`);
  });
}

/** Opens `path`, lets images fail and scripts run, and checks no payload ran. */
async function openAndCheck(page: Page, path: string): Promise<void> {
  const response = await page.goto(path);
  expect(response?.status(), path).toBe(200);
  await page.waitForLoadState('networkidle');
  expect(await page.evaluate(() => (window as unknown as { __xss?: unknown }).__xss), path).toBeUndefined();
  // A payload parsed as HTML would leave its element in the page, even where it did not run.
  expect(await page.locator('img[src="x"], svg[onload]').count(), path).toBe(0);
}

/** Checks `text` is on the page as visible text. */
async function expectLiteral(page: Page, text: string): Promise<void> {
  const visible = page.getByText(text, { exact: false }).filter({ visible: true });
  await expect(visible.first(), `"${text}" on ${page.url()}`).toBeVisible();
}

test('names made of HTML and script show as text on every screen and in the e-mail', async ({ page, baseURL }) => {
  test.setTimeout(180_000);
  refuseDialogs(page);
  await signIn(page, demoAccount('wren@lanternfish.example'), `/projects/${PROJECT}`);

  const tokenResponse = await page.request.post(`/api/v1/projects/${PROJECT}/tokens`, {
    data: { name: `Escaping check ${stamp}` }
  });
  expect(tokenResponse.status()).toBe(201);
  const { token } = (await tokenResponse.json()) as { token: { secret: string } };

  const form = new FormData();
  form.append('meta', JSON.stringify({ branch: BRANCH, label: LABEL }));
  form.append('file', new Blob([(await hostileGlb()) as BlobPart]), ASSET_PATH);
  const upload = await fetch(`${baseURL}/api/v1/projects/${PROJECT}/builds`, {
    method: 'POST',
    body: form,
    headers: { authorization: `Bearer ${token.secret}`, origin: baseURL!, accept: 'application/json' }
  });
  expect(upload.status, await upload.clone().text()).toBe(201);
  const { build } = (await upload.json()) as { build: { id: number; verdict: string } };
  expect(build.verdict).toBe('fail');

  const detail = await page.request.get(`/api/v1/projects/${PROJECT}/builds/${build.id}`);
  const { assets } = (await detail.json()) as { assets: { id: number; path: string }[] };
  const asset = assets.find((candidate) => candidate.path === ASSET_PATH)!;
  expect(asset).toBeDefined();

  const findings = await page.request.get(`/api/v1/projects/${PROJECT}/builds/${build.id}/findings?severity=error`);
  const [blocking] = ((await findings.json()) as { findings: { fingerprint: string; node: string | null }[] }).findings;
  expect(blocking.node).toContain(JOINT);
  for (const data of [
    { scope: 'fingerprint', fingerprint: blocking.fingerprint, reason: `Held on purpose ${IMG}` },
    { scope: 'rule-asset', rule: 'not-a-rotation', assetPath: ASSET_PATH, reason: `Rig swap ${SCRIPT}` }
  ]) {
    const waiver = await page.request.post(`/api/v1/projects/${PROJECT}/waivers`, { data });
    expect(waiver.status(), await waiver.text()).toBe(201);
  }

  // Builds list: branch, label and (through the branch filter) the build itself.
  await openAndCheck(page, `/projects/${PROJECT}`);
  await expectLiteral(page, LABEL);
  await expectLiteral(page, BRANCH);

  // Build report: branch, label, asset path, node path and animation of the finding.
  await openAndCheck(page, `/projects/${PROJECT}/builds/${build.id}`);
  for (const text of [BRANCH, LABEL, ASSET_PATH, JOINT, ANIMATION]) await expectLiteral(page, text);

  // Asset view: the node tree, the channel list and the findings on the nodes.
  await openAndCheck(page, `/projects/${PROJECT}/builds/${build.id}/assets/${asset.id}`);
  for (const text of [ASSET_PATH, JOINT, ROOT, ANIMATION]) await expectLiteral(page, text);

  // Trends of the hostile branch: the branch and the regressing asset.
  await openAndCheck(page, `/projects/${PROJECT}/trends?${new URLSearchParams({ branch: BRANCH })}`);
  await expectLiteral(page, ASSET_PATH);

  // Waivers: the asset path, the finding's node and both reasons.
  await openAndCheck(page, `/projects/${PROJECT}/waivers`);
  for (const text of [ASSET_PATH, `Held on purpose ${IMG}`, `Rig swap ${SCRIPT}`]) await expectLiteral(page, text);

  // The build e-mail to the project's lead, in the admin mail outbox.
  await openAndCheck(page, '/admin/outbox');
  const row = page.locator('tr[data-outbox-id]').filter({ hasText: LABEL }).first();
  await expect(row).toBeVisible({ timeout: 30_000 });
  await expect(row).toContainText(BRANCH);
  const outboxId = await row.getAttribute('data-outbox-id');
  await openAndCheck(page, `/admin/outbox/messages/${outboxId}`);
  await expectLiteral(page, LABEL);
  const html = await page.locator('iframe').first().getAttribute('srcdoc');
  expect(html).not.toBeNull();
  for (const raw of [IMG, SCRIPT, '<svg onload', '<script>']) expect(html).not.toContain(raw);
  for (const escaped of ['&lt;script&gt;window.__xss=1&lt;/script&gt;', '&lt;img src=x onerror=window.__xss=1&gt;']) {
    expect(html).toContain(escaped);
  }
  expect(await page.evaluate(() => (window as unknown as { __xss?: unknown }).__xss)).toBeUndefined();
});
