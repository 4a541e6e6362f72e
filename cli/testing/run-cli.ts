/**
 * Builds the bundled CLI and runs it as a user would (`node cli/dist/orientry.js ...`), for the
 * end-to-end tests under tests/integration. The bundle, not the sources, is what ships.
 */
import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const projectRoot = resolve(dirname(fileURLToPath(import.meta.url)), '../..');

/** Absolute path of the bundled CLI. */
export const CLI_PATH = resolve(projectRoot, 'cli/dist/orientry.js');

/** Runs cli/build.js; the bundle is written atomically, so parallel test files may both call it. */
export function buildCli(): void {
  execFileSync(process.execPath, [resolve(projectRoot, 'cli/build.js')], { cwd: projectRoot, stdio: 'pipe' });
}

/** What a run of the CLI left behind. */
export interface CliRun {
  status: number | null;
  stdout: string;
  stderr: string;
}

/** Runs the bundled CLI with `args` in `cwd`, without a terminal (so no colour and no progress). */
export function runCli(args: readonly string[], cwd: string): CliRun {
  const result = spawnSync(process.execPath, [CLI_PATH, ...args], {
    cwd,
    encoding: 'utf8',
    timeout: 60_000,
    env: { ...process.env, NO_COLOR: '1' }
  });
  if (result.error) throw result.error;
  return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

/** Options of {@link runCliAsync}. */
export interface RunCliOptions {
  /** Variables added to a scrubbed copy of the test's environment (see below). */
  env?: Record<string, string>;
  /** Kill the run after this long; default 120 s. */
  timeoutMs?: number;
}

/**
 * Variables `submit` reads that the test machine itself may set (a CI runner's own build details,
 * a developer's token); they are removed so each run sees only what its test gives it.
 */
const SCRUBBED_VARIABLE =
  /^(ORIENTRY_TOKEN|CI|GITHUB_.*|GITLAB_CI|CI_.*|BUILDKITE.*|CIRCLE.*|JENKINS_URL|GIT_.*|BUILD_.*|BRANCH_NAME)$/;

/**
 * Runs the bundled CLI without blocking the test process (so a server in the same process could
 * answer), with an environment scrubbed of CI variables and tokens plus `options.env`.
 */
export async function runCliAsync(args: readonly string[], cwd: string, options: RunCliOptions = {}): Promise<CliRun> {
  const env: Record<string, string> = { NO_COLOR: '1' };
  for (const [name, value] of Object.entries(process.env)) {
    if (value !== undefined && !SCRUBBED_VARIABLE.test(name)) env[name] = value;
  }
  Object.assign(env, options.env);
  const child = spawn(process.execPath, [CLI_PATH, ...args], { cwd, env, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout.setEncoding('utf8').on('data', (text: string) => (stdout += text));
  child.stderr.setEncoding('utf8').on('data', (text: string) => (stderr += text));
  const timer = setTimeout(() => child.kill('SIGKILL'), options.timeoutMs ?? 120_000);
  const status = await new Promise<number | null>((resolve, reject) => {
    child.once('error', reject);
    child.once('close', (code) => resolve(code));
  });
  clearTimeout(timer);
  return { status, stdout, stderr };
}
