import { describe, expect, it } from 'vitest';
import { resolveBuildDetails, type BuildDetailFlags, type ResolvedBuildDetails } from './build-details';
import { CliError } from './cli-error';
import { ExitCode } from './exit-codes';
import type { GitRevision } from './git-revision';

const NO_FLAGS: BuildDetailFlags = { commit: null, branch: null, label: null, ciJobUrl: null };
const GIT_SHA = '1111111111111111111111111111111111111111';
const CI_SHA = '2222222222222222222222222222222222222222';

const checkout: GitRevision = { commit: GIT_SHA, branch: 'art/buoy', failure: null };
const detached: GitRevision = { commit: GIT_SHA, branch: null, failure: null };
const noGit: GitRevision = { commit: null, branch: null, failure: 'git rev-parse HEAD: fatal: not a git repository' };

/** A git reader that answers `revision` and counts its calls. */
function fakeGit(revision: GitRevision) {
  const reader = async () => {
    reader.calls++;
    return revision;
  };
  reader.calls = 0;
  return reader;
}

const GITLAB = {
  GITLAB_CI: 'true',
  CI_COMMIT_SHA: CI_SHA,
  CI_COMMIT_REF_NAME: 'main',
  CI_PIPELINE_IID: '311',
  CI_JOB_URL: 'https://gitlab.example/jobs/77'
};

const cases: {
  name: string;
  flags: Partial<BuildDetailFlags>;
  env: Record<string, string>;
  git: GitRevision;
  expected: ResolvedBuildDetails;
  gitCalls: number;
}[] = [
  {
    name: 'flags alone, without asking git',
    flags: { commit: 'abcdef1', branch: 'main', label: '#9', ciJobUrl: 'https://ci.example/9' },
    env: GITLAB,
    git: noGit,
    expected: {
      details: { commit: 'abcdef1', branch: 'main', label: '#9', ciJobUrl: 'https://ci.example/9' },
      sources: []
    },
    gitCalls: 0
  },
  {
    name: 'the CI variables where no flag is given',
    flags: { branch: 'feature/tide-rig' },
    env: GITLAB,
    git: noGit,
    expected: {
      details: {
        commit: CI_SHA,
        branch: 'feature/tide-rig',
        label: '#311',
        ciJobUrl: 'https://gitlab.example/jobs/77'
      },
      sources: ['GitLab CI']
    },
    gitCalls: 0
  },
  {
    name: 'git for commit and branch outside CI, with no label or link',
    flags: {},
    env: {},
    git: checkout,
    expected: { details: { commit: GIT_SHA, branch: 'art/buoy', label: null, ciJobUrl: null }, sources: ['git'] },
    gitCalls: 1
  },
  {
    name: 'git for the branch a CI system leaves out, CI for the rest',
    flags: {},
    env: { CIRCLECI: 'true', CIRCLE_SHA1: CI_SHA, CIRCLE_BUILD_NUM: '5' },
    git: checkout,
    expected: {
      details: { commit: CI_SHA, branch: 'art/buoy', label: '#5', ciJobUrl: null },
      sources: ['CircleCI', 'git']
    },
    gitCalls: 1
  }
];

describe('resolveBuildDetails', () => {
  for (const { name, flags, env, git, expected, gitCalls } of cases) {
    it(`takes ${name}`, async () => {
      const reader = fakeGit(git);
      expect(await resolveBuildDetails({ ...NO_FLAGS, ...flags }, env, '/work', reader)).toEqual(expected);
      expect(reader.calls).toBe(gitCalls);
    });
  }

  const failures: {
    name: string;
    flags: Partial<BuildDetailFlags>;
    git: GitRevision;
    code: string;
    mentions: string[];
  }[] = [
    {
      name: 'no commit anywhere',
      flags: { branch: 'main' },
      git: noGit,
      code: 'build.commit-unknown',
      mentions: ['--commit', 'not a git repository']
    },
    {
      name: 'no branch anywhere',
      flags: { commit: 'abcdef1' },
      git: noGit,
      code: 'build.branch-unknown',
      mentions: ['--branch']
    },
    {
      name: 'a detached HEAD outside CI',
      flags: {},
      git: detached,
      code: 'build.branch-unknown',
      mentions: ['--branch', 'detached HEAD']
    }
  ];
  for (const { name, flags, git, code, mentions } of failures) {
    it(`asks for the missing flag (exit 2) with ${name}`, async () => {
      const failure = await resolveBuildDetails({ ...NO_FLAGS, ...flags }, {}, '/work', fakeGit(git)).catch(
        (error: unknown) => error
      );
      expect(failure).toBeInstanceOf(CliError);
      expect((failure as CliError).code).toBe(code);
      expect((failure as CliError).exitCode).toBe(ExitCode.UsageError);
      for (const text of mentions) expect((failure as CliError).message).toContain(text);
      expect((failure as CliError).message).not.toContain('\n');
    });
  }
});
