import { createHash } from 'node:crypto';
import { describe, expect, test } from 'vitest';
import { DEMO_PROJECTS } from '../demo-accounts';
import { listDemoBuilds } from './demo-builds';
import { DEMO_PROJECT_STORIES } from './demo-projects';

const BASE_DATE = new Date('2026-03-01T12:00:00Z');
const DAY_MS = 86_400_000;

describe('listDemoBuilds', () => {
  const builds = listDemoBuilds(BASE_DATE);

  test('plans at least 36 builds across the three projects, each on main and its feature branch', () => {
    expect(builds.length).toBeGreaterThanOrEqual(36);
    for (const story of DEMO_PROJECT_STORIES) {
      const branches = new Set(builds.filter((build) => build.project === story.slug).map((build) => build.branch));
      expect([...branches].sort()).toEqual([story.featureBranch, 'main'].sort());
    }
    expect(new Set(builds.map((build) => build.project))).toEqual(
      new Set(DEMO_PROJECTS.map((project) => project.slug))
    );
  });

  test('dates increase strictly and fall within the 30 days before the base date', () => {
    const times = builds.map((build) => Date.parse(build.createdAt));
    times.forEach((time, k) => k === 0 || expect(time).toBeGreaterThan(times[k - 1]));
    expect(times[0]).toBeGreaterThanOrEqual(BASE_DATE.getTime() - 31 * DAY_MS);
    expect(times[times.length - 1]).toBeLessThanOrEqual(BASE_DATE.getTime());
    for (const build of builds) expect(new Date(build.createdAt).toISOString()).toBe(build.createdAt);
  });

  test('dates move with the base date and nothing else does', () => {
    const later = listDemoBuilds(new Date(BASE_DATE.getTime() + 10 * DAY_MS));
    builds.forEach((build, k) => {
      expect(Date.parse(later[k].createdAt) - Date.parse(build.createdAt)).toBe(10 * DAY_MS);
      expect({ ...later[k], createdAt: '', assets: null }).toEqual({ ...build, createdAt: '', assets: null });
    });
  });

  test('gives each build a unique 40-hex commit, an increasing pipeline label and a CI link', () => {
    expect(new Set(builds.map((build) => build.commitSha)).size).toBe(builds.length);
    const pipelines = builds.map((build) => {
      expect(build.commitSha).toMatch(/^[0-9a-f]{40}$/);
      expect(build.label).toMatch(/^#\d{4}$/);
      expect(build.ciJobUrl).toBe(
        `https://ci.lanternfish.example/tidewatch/${build.project}/pipelines/${build.label.slice(1)}`
      );
      return Number(build.label.slice(1));
    });
    pipelines.forEach((pipeline, k) => k === 0 || expect(pipeline).toBeGreaterThan(pipelines[k - 1]));
  });

  test('authors are demo accounts who are members of the project they push to', () => {
    for (const build of builds) {
      const project = DEMO_PROJECTS.find((candidate) => candidate.slug === build.project)!;
      expect(Object.keys(project.members)).toContain(build.authorEmail);
      expect(build.author.length).toBeGreaterThan(0);
    }
  });

  test('every build ships 3 to 8 small files, .gltf assets with their .bin', async () => {
    for (const build of builds) {
      const files = await build.assets();
      expect(files.length).toBeGreaterThanOrEqual(3);
      expect(files.length).toBeLessThanOrEqual(8);
      const paths = files.map((file) => file.path);
      expect(new Set(paths).size).toBe(paths.length);
      for (const file of files) expect(file.bytes.byteLength).toBeLessThan(200_000);
      for (const path of paths.filter((p) => p.endsWith('.gltf')))
        expect(paths).toContain(path.replace(/\.gltf$/, '.bin'));
      expect(build.contents.map((item) => item.path)).toEqual(paths.filter((p) => !p.endsWith('.bin')));
    }
  });

  test('is deterministic: two plans generate byte-identical files', async () => {
    const again = listDemoBuilds(BASE_DATE);
    // SHA-256 per file: comparing digests is exact and far faster than a deep equal over megabytes.
    const digests = async (files: Awaited<ReturnType<(typeof builds)[number]['assets']>>) =>
      files.map((file) => `${file.path} ${createHash('sha256').update(file.bytes).digest('hex')}`);
    for (const [k, build] of builds.entries())
      expect(await digests(await again[k].assets())).toEqual(await digests(await build.assets()));
  });

  test('tells a story: failing builds on every feature branch, each followed by a fix on that branch', () => {
    for (const story of DEMO_PROJECT_STORIES) {
      const feature = builds.filter((build) => build.project === story.slug && build.branch === story.featureBranch);
      const firstFailure = feature.findIndex((build) => build.expectsErrors);
      expect(firstFailure).toBeGreaterThanOrEqual(0);
      expect(feature.slice(firstFailure).some((build) => !build.expectsErrors)).toBe(true);
    }
    // The drift that creeps onto the characters' main branch is gone two builds later.
    const main = builds.filter((build) => build.project === 'tidewatch-characters' && build.branch === 'main');
    const drift = main.findIndex((build) =>
      build.contents.some((item) => item.title === 'Harbor Warden' && item.defects.includes('driftLength'))
    );
    expect(main[drift + 1].contents.find((item) => item.title === 'Harbor Warden')?.defects).toContain('driftLength');
    expect(main[drift + 2].contents.find((item) => item.title === 'Harbor Warden')?.defects).not.toContain(
      'driftLength'
    );
  });

  test('the whole plan generates in a few seconds', async () => {
    const started = performance.now();
    for (const build of listDemoBuilds(BASE_DATE)) await build.assets();
    // Common practice for a demo seed: well under the 5 s a person waits without wondering.
    expect(performance.now() - started).toBeLessThan(5000);
  });
});
