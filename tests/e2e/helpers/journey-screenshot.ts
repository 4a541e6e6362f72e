import type { Page, TestInfo } from '@playwright/test';

/**
 * Saves a screenshot of the page as it is now under the test's output folder and attaches it to the
 * report, so every step of a journey can be looked at afterwards. Names are numbered in step order:
 * `01-builds.png`, `02-build-report.png`...
 */
export async function journeyScreenshot(page: Page, testInfo: TestInfo, step: number, name: string): Promise<string> {
  const fileName = `${String(step).padStart(2, '0')}-${name}.png`;
  const path = testInfo.outputPath(fileName);
  await page.screenshot({ path, fullPage: true });
  await testInfo.attach(fileName, { path, contentType: 'image/png' });
  return path;
}
