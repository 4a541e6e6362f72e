import { describe, expect, it } from 'vitest';
import { CI_SYSTEMS, readCiEnvironment, type CiBuildDetails } from './ci-environment';

// Variable names and value shapes follow each system's documentation of its predefined build
// variables: GitHub "Variables reference", GitLab "Predefined CI/CD variables", Buildkite
// "Environment variables", CircleCI "Project values and variables", Jenkins "env-vars.html" plus
// its git plugin (GIT_COMMIT, GIT_BRANCH as "origin/<branch>").
const SHA = '3f2a9c1d0e5b7a8c9d0e1f2a3b4c5d6e7f8a9b0c';

const cases: { name: string; env: Record<string, string>; expected: CiBuildDetails | null }[] = [
  { name: 'no CI system at all', env: { HOME: '/home/lanternfish', GIT_COMMIT: SHA }, expected: null },
  {
    name: 'GitHub Actions on a push',
    env: {
      GITHUB_ACTIONS: 'true',
      GITHUB_SHA: SHA,
      GITHUB_REF_NAME: 'main',
      GITHUB_RUN_NUMBER: '1482',
      GITHUB_SERVER_URL: 'https://github.example',
      GITHUB_REPOSITORY: 'lanternfish/tidewatch',
      GITHUB_RUN_ID: '9001'
    },
    expected: {
      system: 'GitHub Actions',
      commit: SHA,
      branch: 'main',
      label: '#1482',
      ciJobUrl: 'https://github.example/lanternfish/tidewatch/actions/runs/9001'
    }
  },
  {
    name: 'GitHub Actions on a pull request, which names the head branch, not "<n>/merge"',
    env: {
      GITHUB_ACTIONS: 'true',
      GITHUB_SHA: SHA,
      GITHUB_REF_NAME: '57/merge',
      GITHUB_HEAD_REF: 'feature/lantern-arm',
      GITHUB_RUN_NUMBER: '1483'
    },
    expected: { system: 'GitHub Actions', commit: SHA, branch: 'feature/lantern-arm', label: '#1483', ciJobUrl: null }
  },
  {
    name: 'GitHub Actions on a push, where GITHUB_HEAD_REF is set but empty',
    env: { GITHUB_ACTIONS: 'true', GITHUB_SHA: SHA, GITHUB_HEAD_REF: '', GITHUB_REF_NAME: 'main' },
    expected: { system: 'GitHub Actions', commit: SHA, branch: 'main', label: null, ciJobUrl: null }
  },
  {
    name: 'GitLab CI in a branch pipeline',
    env: {
      GITLAB_CI: 'true',
      CI_COMMIT_SHA: SHA,
      CI_COMMIT_REF_NAME: 'release/1.2',
      CI_PIPELINE_IID: '311',
      CI_JOB_URL: 'https://gitlab.example/lanternfish/tidewatch/-/jobs/77'
    },
    expected: {
      system: 'GitLab CI',
      commit: SHA,
      branch: 'release/1.2',
      label: '#311',
      ciJobUrl: 'https://gitlab.example/lanternfish/tidewatch/-/jobs/77'
    }
  },
  {
    name: 'GitLab CI in a merge request pipeline',
    env: {
      GITLAB_CI: 'true',
      CI_COMMIT_SHA: SHA,
      CI_COMMIT_REF_NAME: 'refs/merge-requests/8/head',
      CI_MERGE_REQUEST_SOURCE_BRANCH_NAME: 'feature/tide-rig'
    },
    expected: { system: 'GitLab CI', commit: SHA, branch: 'feature/tide-rig', label: null, ciJobUrl: null }
  },
  {
    name: 'Buildkite, with the job id as a fragment of the build URL',
    env: {
      BUILDKITE: 'true',
      BUILDKITE_COMMIT: SHA,
      BUILDKITE_BRANCH: 'main',
      BUILDKITE_BUILD_NUMBER: '42',
      BUILDKITE_BUILD_URL: 'https://buildkite.example/lanternfish/tidewatch/builds/42',
      BUILDKITE_JOB_ID: 'a1b2'
    },
    expected: {
      system: 'Buildkite',
      commit: SHA,
      branch: 'main',
      label: '#42',
      ciJobUrl: 'https://buildkite.example/lanternfish/tidewatch/builds/42#a1b2'
    }
  },
  {
    name: 'Buildkite before the agent resolved the commit ("HEAD" is no commit id)',
    env: { BUILDKITE: 'true', BUILDKITE_COMMIT: 'HEAD', BUILDKITE_BRANCH: 'main' },
    expected: { system: 'Buildkite', commit: null, branch: 'main', label: null, ciJobUrl: null }
  },
  {
    name: 'CircleCI, with an upper-case commit lowered',
    env: {
      CIRCLECI: 'true',
      CIRCLE_SHA1: SHA.toUpperCase(),
      CIRCLE_BRANCH: 'main',
      CIRCLE_BUILD_NUM: '77',
      CIRCLE_BUILD_URL: 'https://circleci.example/gh/lanternfish/tidewatch/77'
    },
    expected: {
      system: 'CircleCI',
      commit: SHA,
      branch: 'main',
      label: '#77',
      ciJobUrl: 'https://circleci.example/gh/lanternfish/tidewatch/77'
    }
  },
  {
    name: 'Jenkins with the git plugin, whose GIT_BRANCH carries the remote',
    env: {
      JENKINS_URL: 'https://jenkins.example/',
      GIT_COMMIT: SHA,
      GIT_BRANCH: 'origin/feature/buoy',
      BUILD_NUMBER: '5',
      BUILD_URL: 'https://jenkins.example/job/tidewatch/5/'
    },
    expected: {
      system: 'Jenkins',
      commit: SHA,
      branch: 'feature/buoy',
      label: '#5',
      ciJobUrl: 'https://jenkins.example/job/tidewatch/5/'
    }
  },
  {
    name: 'a Jenkins multibranch pipeline, whose BRANCH_NAME wins',
    env: { JENKINS_URL: 'https://jenkins.example/', GIT_COMMIT: SHA, BRANCH_NAME: 'main', GIT_BRANCH: 'origin/x' },
    expected: { system: 'Jenkins', commit: SHA, branch: 'main', label: null, ciJobUrl: null }
  },
  {
    name: 'a branch given as a full ref, and a job URL that is not http(s)',
    env: { CIRCLECI: 'true', CIRCLE_BRANCH: 'refs/heads/main', CIRCLE_BUILD_URL: 'javascript:alert(1)' },
    expected: { system: 'CircleCI', commit: null, branch: 'main', label: null, ciJobUrl: null }
  },
  {
    name: 'a commit id too short to be one (6 hex digits)',
    env: { GITLAB_CI: 'true', CI_COMMIT_SHA: '3f2a9c' },
    expected: { system: 'GitLab CI', commit: null, branch: null, label: null, ciJobUrl: null }
  },
  {
    name: 'the first system in table order when two markers are set',
    env: {
      GITHUB_ACTIONS: 'true',
      JENKINS_URL: 'https://jenkins.example/',
      GITHUB_REF_NAME: 'main',
      BUILD_NUMBER: '9'
    },
    expected: { system: 'GitHub Actions', commit: null, branch: 'main', label: null, ciJobUrl: null }
  }
];

describe('readCiEnvironment', () => {
  for (const { name, env, expected } of cases) {
    it(`reads ${name}`, () => {
      expect(readCiEnvironment(env)).toEqual(expected);
    });
  }

  it('treats a marker set to an empty string as absent', () => {
    expect(readCiEnvironment({ GITHUB_ACTIONS: '', GITHUB_SHA: SHA })).toBeNull();
  });

  it('has one row per system with a distinct marker', () => {
    const markers = CI_SYSTEMS.map((system) => system.marker);
    expect(new Set(markers).size).toBe(markers.length);
  });
});
