import type { DemoToken } from './seed';

/**
 * Posts the demo's build history (several weeks of Tidewatch builds per project, with fixes,
 * regressions and waivers) through the real ingestion route, `POST /api/v1/projects/{slug}/builds`,
 * once the server is up, so the demo exercises the same path as CI.
 *
 * TODO(ingestion): the builds route does not exist yet; until it does this posts nothing.
 */
export async function seedHistory(serverUrl: string, tokens: readonly DemoToken[]): Promise<void> {
  void serverUrl;
  void tokens;
  console.log('build history: waiting for ingestion');
}
