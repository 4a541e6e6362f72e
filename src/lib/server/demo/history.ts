import { closeDatabase, getDatabase } from '../db/instance';
import { listDemoBuilds, type DemoBuildPlan } from './assets';
import { seedDemoWaivers } from './demo-waivers';
import type { DemoToken } from './seed';

/** What posting the history did, for the demo's printout and for tests. */
export interface DemoHistoryResult {
  posted: number;
  failedGate: number;
  waivers: number;
}

/**
 * Posts the demo's build history (a month of Tidewatch builds per project, with regressions
 * and their fixes) through the real ingestion route, `POST /api/v1/projects/{slug}/builds`,
 * once the server is up, so the demo exercises exactly the path a CI job takes: upload, lint,
 * baseline comparison, gate. Each build carries its planned time as `builtAt`, so trends
 * spread over the month instead of the minute the demo took to start. Halfway through, the
 * team's waivers are proposed and decided, so later builds show waived findings.
 * @throws Error naming the build and the server's answer when a post is refused.
 */
export async function seedHistory(
  serverUrl: string,
  tokens: readonly DemoToken[],
  baseDate: Date = new Date()
): Promise<DemoHistoryResult> {
  const builds = listDemoBuilds(baseDate);
  const result: DemoHistoryResult = { posted: 0, failedGate: 0, waivers: 0 };
  const waiversAfter = Math.floor(builds.length / 2);
  for (const build of builds) {
    if (result.posted === waiversAfter) {
      // The demo process writes the waivers itself (its own connection; the seed closed the
      // first one); SQLite in WAL mode lets it share the file with the running server.
      getDatabase();
      result.waivers = await seedDemoWaivers();
      await closeDatabase();
    }
    const token = tokens.find((entry) => entry.projectSlug === build.project);
    if (!token) throw new Error(`The demo seed made no token for ${build.project}.`);
    const verdict = await postBuild(serverUrl, token.secret, build);
    result.posted++;
    if (verdict === 'fail') result.failedGate++;
  }
  console.log(
    `build history: ${result.posted} builds posted, ${result.failedGate} failed the gate, ${result.waivers} waivers proposed`
  );
  return result;
}

async function postBuild(serverUrl: string, secret: string, build: DemoBuildPlan): Promise<string> {
  const form = new FormData();
  form.append(
    'meta',
    JSON.stringify({
      commit: build.commitSha,
      branch: build.branch,
      label: build.label,
      ciJobUrl: build.ciJobUrl,
      idempotencyKey: `demo:${build.project}:${build.label}`,
      builtAt: build.createdAt
    })
  );
  for (const file of await build.assets()) {
    form.append('file', new Blob([file.bytes as Uint8Array<ArrayBuffer>]), file.path);
  }
  const response = await fetch(`${serverUrl}/api/v1/projects/${build.project}/builds`, {
    method: 'POST',
    // SvelteKit refuses cross-site form posts; a CI client names the server it talks to.
    headers: { authorization: `Bearer ${secret}`, origin: new URL(serverUrl).origin, accept: 'application/json' },
    body: form
  });
  const body = (await response.json()) as { build?: { verdict: string }; error?: { code: string; message: string } };
  if (!response.ok || !body.build) {
    const reason = body.error ? `${body.error.code}: ${body.error.message}` : `HTTP ${response.status}`;
    throw new Error(`The demo build ${build.project} ${build.label} was refused (${reason}).`);
  }
  return body.build.verdict;
}
