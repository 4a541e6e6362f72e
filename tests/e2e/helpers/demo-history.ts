import { expect, type APIRequestContext } from '@playwright/test';
import { DEMO_TIMELINE } from '../../../src/lib/server/demo/assets/demo-timeline';

/** How many builds the demo history posts for a project. */
export function demoBuildCount(projectSlug: string): number {
  return DEMO_TIMELINE.filter((entry) => entry.project === projectSlug).length;
}

/**
 * Waits until the e2e server has posted the whole demo history of a project. The server answers
 * health checks (and so the tests start) while it is still posting builds through the API, so a
 * test that looks for "the latest failing build" first waits for all of them.
 * @param request a request context of a signed-in project member (the build list needs a session).
 */
export async function waitForDemoHistory(request: APIRequestContext, projectSlug: string): Promise<void> {
  const expected = demoBuildCount(projectSlug);
  await expect
    .poll(
      async () => {
        const response = await request.get(`/api/v1/projects/${projectSlug}/builds?pageSize=1`);
        if (!response.ok()) return `HTTP ${response.status()}`;
        return ((await response.json()) as { total: number }).total;
      },
      { message: `the demo history of ${projectSlug} (${expected} builds) is posted`, timeout: 120_000 }
    )
    .toBe(expected);
}
