/**
 * What the common CI systems say about the running build in their environment variables: the
 * commit, the branch, a build number for the label and a link back to the job. `submit` uses
 * these when the command line does not name them, so a CI job needs no extra flags.
 *
 * The variable names are each system's documented build variables (common practice); a system is
 * recognised by the marker variable it always sets.
 */

/** Build details read from a CI system's environment; any of them may be missing. */
export interface CiBuildDetails {
  /** The CI system, for messages (`GitHub Actions`). */
  system: string;
  /** Lower-case hex commit id, or null when the variable is missing or not a commit id. */
  commit: string | null;
  branch: string | null;
  /** `#<run number>`, the same for every retry of the run so the idempotency key holds. */
  label: string | null;
  ciJobUrl: string | null;
}

type Environment = Readonly<Record<string, string | undefined>>;

/** How one CI system names its build details. */
export interface CiSystem {
  name: string;
  /** Variable the system always sets; its presence selects the row. */
  marker: string;
  commit(env: Environment): string | undefined;
  branch(env: Environment): string | undefined;
  /** The run number, without `#`. */
  runNumber(env: Environment): string | undefined;
  ciJobUrl(env: Environment): string | undefined;
}

/** The CI systems `submit` recognises, checked in this order. */
export const CI_SYSTEMS: readonly CiSystem[] = [
  {
    name: 'GitHub Actions',
    marker: 'GITHUB_ACTIONS',
    commit: (env) => env.GITHUB_SHA,
    // On pull requests GITHUB_REF_NAME is "<number>/merge"; GITHUB_HEAD_REF names the real branch.
    branch: (env) => firstSet(env.GITHUB_HEAD_REF, env.GITHUB_REF_NAME),
    runNumber: (env) => env.GITHUB_RUN_NUMBER,
    ciJobUrl: (env) =>
      allSet(env.GITHUB_SERVER_URL, env.GITHUB_REPOSITORY, env.GITHUB_RUN_ID)
        ? `${env.GITHUB_SERVER_URL}/${env.GITHUB_REPOSITORY}/actions/runs/${env.GITHUB_RUN_ID}`
        : undefined
  },
  {
    name: 'GitLab CI',
    marker: 'GITLAB_CI',
    commit: (env) => env.CI_COMMIT_SHA,
    branch: (env) => firstSet(env.CI_MERGE_REQUEST_SOURCE_BRANCH_NAME, env.CI_COMMIT_REF_NAME),
    runNumber: (env) => env.CI_PIPELINE_IID,
    ciJobUrl: (env) => env.CI_JOB_URL
  },
  {
    name: 'Buildkite',
    marker: 'BUILDKITE',
    commit: (env) => env.BUILDKITE_COMMIT,
    branch: (env) => env.BUILDKITE_BRANCH,
    runNumber: (env) => env.BUILDKITE_BUILD_NUMBER,
    // The build page shows every job; the fragment scrolls to this one.
    ciJobUrl: (env) =>
      env.BUILDKITE_BUILD_URL && env.BUILDKITE_JOB_ID
        ? `${env.BUILDKITE_BUILD_URL}#${env.BUILDKITE_JOB_ID}`
        : env.BUILDKITE_BUILD_URL
  },
  {
    name: 'CircleCI',
    marker: 'CIRCLECI',
    commit: (env) => env.CIRCLE_SHA1,
    branch: (env) => env.CIRCLE_BRANCH,
    runNumber: (env) => env.CIRCLE_BUILD_NUM,
    ciJobUrl: (env) => env.CIRCLE_BUILD_URL
  },
  {
    name: 'Jenkins',
    marker: 'JENKINS_URL',
    commit: (env) => env.GIT_COMMIT,
    // Multibranch pipelines set BRANCH_NAME; the git plugin's GIT_BRANCH carries the remote ("origin/main").
    branch: (env) => firstSet(env.BRANCH_NAME, env.GIT_BRANCH?.replace(/^(refs\/remotes\/)?origin\//, '')),
    runNumber: (env) => env.BUILD_NUMBER,
    ciJobUrl: (env) => env.BUILD_URL
  }
];

/**
 * The build details of the CI system the process runs in, or null outside a recognised one.
 * Values that cannot be what they claim are dropped: a commit that is not 7 to 64 hex digits
 * (Buildkite may say `HEAD`), a job URL that is not http(s).
 * @example readCiEnvironment({ CIRCLECI: 'true', CIRCLE_SHA1: 'A1B2C3D4', CIRCLE_BRANCH: 'main', CIRCLE_BUILD_NUM: '12' })
 *   // → { system: 'CircleCI', commit: 'a1b2c3d4', branch: 'main', label: '#12', ciJobUrl: null }
 */
export function readCiEnvironment(env: Environment): CiBuildDetails | null {
  const system = CI_SYSTEMS.find((candidate) => isSet(env[candidate.marker]));
  if (!system) return null;
  const commit = clean(system.commit(env));
  const branch = clean(system.branch(env))?.replace(/^refs\/heads\//, '');
  const runNumber = clean(system.runNumber(env));
  const ciJobUrl = clean(system.ciJobUrl(env));
  return {
    system: system.name,
    commit: commit && /^[0-9a-f]{7,64}$/i.test(commit) ? commit.toLowerCase() : null,
    branch: branch || null,
    label: runNumber ? `#${runNumber}` : null,
    ciJobUrl: ciJobUrl && /^https?:\/\//i.test(ciJobUrl) ? ciJobUrl : null
  };
}

function isSet(value: string | undefined): value is string {
  return value !== undefined && value.trim() !== '';
}

function firstSet(...values: (string | undefined)[]): string | undefined {
  return values.find(isSet);
}

function allSet(...values: (string | undefined)[]): boolean {
  return values.every(isSet);
}

function clean(value: string | undefined): string | null {
  return isSet(value) ? value.trim() : null;
}
