/**
 * Where a submitted build comes from: commit, branch, label and CI job link. Each is taken from
 * its flag, else from the CI system's variables, else (commit and branch only) from git in the
 * working directory. The server needs a branch to pick the baseline, and the commit keys the
 * build, so both must be known before anything is uploaded.
 */
import { readCiEnvironment } from './ci-environment';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import { readGitRevision, type GitRevision } from './git-revision';

/** The build details sent in the upload's `meta` part. */
export interface BuildDetails {
  commit: string;
  branch: string;
  label: string | null;
  ciJobUrl: string | null;
}

/** The details the command line gave; null ones are looked up. */
export type BuildDetailFlags = { [K in keyof BuildDetails]: string | null };

/** The details and where the looked-up ones came from (`GitHub Actions`, `git`), for one stderr line. */
export interface ResolvedBuildDetails {
  details: BuildDetails;
  sources: string[];
}

/**
 * Fills in the details the flags leave open.
 * @param readGit injected by tests; runs git in `cwd` by default.
 * @throws CliError `build.commit-unknown` or `build.branch-unknown` (exit 2) naming the flag to pass.
 */
export async function resolveBuildDetails(
  flags: BuildDetailFlags,
  env: Readonly<Record<string, string | undefined>>,
  cwd: string,
  readGit: (cwd: string) => Promise<GitRevision> = readGitRevision
): Promise<ResolvedBuildDetails> {
  const ci = readCiEnvironment(env);
  const sources = new Set<string>();
  const pick = (flag: string | null, fromCi: string | null | undefined): string | null => {
    if (flag !== null) return flag;
    if (fromCi) sources.add(ci!.system);
    return fromCi ?? null;
  };
  let commit = pick(flags.commit, ci?.commit);
  let branch = pick(flags.branch, ci?.branch);
  const label = pick(flags.label, ci?.label);
  const ciJobUrl = pick(flags.ciJobUrl, ci?.ciJobUrl);

  if (commit === null || branch === null) {
    const git = await readGit(cwd);
    if (commit === null && git.commit) sources.add('git');
    if (branch === null && git.branch) sources.add('git');
    commit ??= git.commit;
    branch ??= git.branch;
    const why = ci ? `${ci.system} did not say and git could not tell` : 'no CI system said and git could not tell';
    if (commit === null) throw unknown('commit', `--commit <sha>`, `${why}${git.failure ? ` (${git.failure})` : ''}`);
    if (branch === null) {
      const reason = git.commit && !git.branch ? 'git is on a detached HEAD' : why;
      throw unknown('branch', '--branch <name>', reason);
    }
  }
  return { details: { commit, branch, label, ciJobUrl }, sources: [...sources] };
}

function unknown(what: 'commit' | 'branch', flag: string, reason: string): CliError {
  return new CliError(
    `build.${what}-unknown`,
    `the build's ${what} is unknown: pass ${flag} (${reason})`,
    ExitCode.UsageError
  );
}
