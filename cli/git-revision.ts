/**
 * The commit and branch of the git checkout a command runs in, for `submit` outside a CI system
 * that names them. git runs directly (no shell), so nothing in the folder name is interpreted.
 */
import { execFile } from 'node:child_process';
import { promisify } from 'node:util';

const run = promisify(execFile);

/** What git says about the checkout; null where it cannot say. */
export interface GitRevision {
  commit: string | null;
  /** null on a detached HEAD, where git has no branch name to give. */
  branch: string | null;
  /** Why git could not answer (git missing, not a repository), for --debug; null when it did. */
  failure: string | null;
}

/** A git that does not answer in this time is treated as absent. */
const GIT_TIMEOUT_MS = 10_000;

/**
 * `git rev-parse HEAD` and `git rev-parse --abbrev-ref HEAD` in `cwd`.
 * Never throws: without git, outside a repository or before the first commit both are null,
 * and the caller asks for --commit or --branch instead.
 */
export async function readGitRevision(cwd: string): Promise<GitRevision> {
  const [commit, branch] = await Promise.all([
    revParse(cwd, ['rev-parse', 'HEAD']),
    revParse(cwd, ['rev-parse', '--abbrev-ref', 'HEAD'])
  ]);
  return {
    commit: commit.text && /^[0-9a-f]{7,64}$/i.test(commit.text) ? commit.text.toLowerCase() : null,
    branch: branch.text && branch.text !== 'HEAD' ? branch.text : null,
    failure: commit.failure ?? branch.failure
  };
}

async function revParse(cwd: string, args: string[]): Promise<{ text: string | null; failure: string | null }> {
  try {
    const { stdout } = await run('git', args, { cwd, timeout: GIT_TIMEOUT_MS, windowsHide: true });
    return { text: stdout.trim() || null, failure: null };
  } catch (error) {
    // Expected outside a checkout: git is the last of three sources, and its silence only means
    // the caller asks for a flag. The reason travels on for --debug.
    const failure = error as { code?: unknown; stderr?: string; message?: string };
    const reason =
      failure.code === 'ENOENT' ? 'git is not installed' : failure.stderr?.trim().split('\n')[0] || failure.message;
    return { text: null, failure: `git ${args.join(' ')}: ${reason ?? String(error)}` };
  }
}
