import { execFileSync } from 'node:child_process';
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readGitRevision } from './git-revision';

let folder: string;

function git(cwd: string, ...args: string[]): string {
  return execFileSync('git', args, {
    cwd,
    encoding: 'utf8',
    env: {
      ...process.env,
      GIT_AUTHOR_NAME: 'Tidewatch CI',
      GIT_AUTHOR_EMAIL: 'ci@lanternfish.example',
      GIT_COMMITTER_NAME: 'Tidewatch CI',
      GIT_COMMITTER_EMAIL: 'ci@lanternfish.example'
    }
  }).trim();
}

beforeAll(async () => {
  folder = await mkdtemp(join(tmpdir(), 'orientry-git-'));
});
afterAll(async () => {
  await rm(folder, { recursive: true, force: true });
});

describe('readGitRevision', () => {
  it('says nothing, with the reason, outside a repository', async () => {
    const revision = await readGitRevision(folder);
    expect(revision.commit).toBeNull();
    expect(revision.branch).toBeNull();
    expect(revision.failure).toContain('git rev-parse');
  });

  it('reads the commit and branch of a checkout, as git itself reports them', async () => {
    const repository = join(folder, 'repository');
    await mkdir(repository);
    git(repository, 'init', '--quiet', '--initial-branch', 'feature/lantern-arm');
    await writeFile(join(repository, 'keeper.gltf'), '{}');
    git(repository, 'add', 'keeper.gltf');
    git(repository, 'commit', '--quiet', '-m', 'Keeper rig');
    const revision = await readGitRevision(repository);
    expect(revision).toEqual({
      commit: git(repository, 'rev-parse', 'HEAD'),
      branch: 'feature/lantern-arm',
      failure: null
    });
    expect(revision.commit).toMatch(/^[0-9a-f]{40}$/);
  });

  it('gives no branch on a detached HEAD', async () => {
    const repository = join(folder, 'repository');
    git(repository, 'checkout', '--quiet', '--detach');
    const revision = await readGitRevision(repository);
    expect(revision.commit).toMatch(/^[0-9a-f]{40}$/);
    expect(revision.branch).toBeNull();
  });
});
