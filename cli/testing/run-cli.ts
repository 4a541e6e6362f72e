/**
 * Builds the bundled CLI and runs it as a user would (`node cli/dist/orientry.js ...`), for the
 * end-to-end tests under tests/integration. The bundle, not the sources, is what ships.
 */
import { execFileSync, spawnSync } from 'node:child_process';
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
