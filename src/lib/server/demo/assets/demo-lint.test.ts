/**
 * The demo history checked against the real lint engine: every build must show exactly the
 * trouble its story claims, under the policy its project runs with.
 */
import { describe, expect, test } from 'vitest';
import { defaultPolicy, lintAsset, lintDocument, parsePolicy, type Finding } from '$lib/lint';
import type { DemoFile } from './asset-files';
import { createCameraRig } from './camera-rig';
import { createCharacter } from './character';
import { listDemoBuilds } from './demo-builds';
import { DEMO_ASSETS } from './demo-asset-catalog';
import { getDemoPolicy } from './demo-projects';
import { createDockWindlass } from './dock-windlass';
import { DEFECT_RULES, defectStep, type DefectStep } from './defects';
import { createLighthouseLamp } from './lighthouse-lamp';
import { roundTripGlb } from './testing';

/** Lints every main file of a build the way ingestion does: bytes in, side files from the same upload. */
async function lintFiles(files: readonly DemoFile[], policy = defaultPolicy()): Promise<Finding[]> {
  const byPath = new Map(files.map((file) => [file.path, file.bytes]));
  const findings: Finding[] = [];
  for (const file of files.filter((candidate) => !candidate.path.endsWith('.bin'))) {
    const folder = file.path.slice(0, file.path.lastIndexOf('/') + 1);
    const readSideFile = async (relativePath: string) => byPath.get(folder + relativePath) ?? null;
    const report = await lintAsset({ path: file.path, bytes: file.bytes, readSideFile }, policy);
    expect(report.unreadable).toBe(false);
    findings.push(...report.findings);
  }
  return findings;
}

describe('clean generated assets', () => {
  test.each(Object.keys(DEMO_ASSETS))('%s has no error or warning findings', async (key) => {
    const asset = DEMO_ASSETS[key as keyof typeof DEMO_ASSETS];
    const { findings } = lintDocument(await roundTripGlb(asset.create(1)), asset.path, defaultPolicy());
    // Dense bakes of steady turns may carry redundant-keys info findings; nothing heavier.
    expect(findings.filter((finding) => finding.severity !== 'info')).toEqual([]);
  });
});

describe('each defect trips the rule it is built for', () => {
  const cases: [string, () => ReturnType<typeof createCharacter>, DefectStep][] = [
    [
      'driftLength',
      () => createCharacter({ name: 'Fixture' }),
      defectStep('driftLength', { animation: 'Idle', node: 'Head', factor: 1.003 })
    ],
    [
      'flipHemisphere',
      () => createCharacter({ name: 'Fixture' }),
      defectStep('flipHemisphere', { animation: 'Swim', node: 'Hips', fromKey: 20 })
    ],
    [
      'insertAntipodal',
      () => createCharacter({ name: 'Fixture' }),
      defectStep('insertAntipodal', { animation: 'Wave', node: 'Forearm.R', keyIndex: 20 })
    ],
    [
      'wideArc',
      () => createCharacter({ name: 'Fixture', swimStyle: 'crawl' }),
      defectStep('wideArc', { animation: 'Swim', node: 'UpperArm.R', fromKey: 3 })
    ],
    [
      'gimbalFlipBake',
      () => createCameraRig({ name: 'Cam', kind: 'crane', shot: 'Shot' }),
      defectStep('gimbalFlipBake', { animation: 'Shot', node: 'Pan', keyIndex: 40 })
    ],
    ['bakeZUpCorrection', () => createLighthouseLamp(), defectStep('bakeZUpCorrection', {})],
    [
      'clipBasisOffset',
      () => createCharacter({ name: 'Fixture' }),
      defectStep('clipBasisOffset', { animation: 'Idle', node: 'Hips' })
    ],
    ['mirrorScale', () => createDockWindlass(), defectStep('mirrorScale', { node: 'Drum' })],
    [
      'breakKeyTimes',
      () => createDockWindlass(),
      defectStep('breakKeyTimes', { animation: 'Pay Out', node: 'Drum', keyIndex: 12 })
    ],
    [
      'nanKey',
      () => createCharacter({ name: 'Fixture' }),
      defectStep('nanKey', { animation: 'Idle', node: 'Neck', keyIndex: 50 })
    ],
    [
      'redundantKeys',
      () => createCharacter({ name: 'Fixture' }),
      defectStep('redundantKeys', { animation: 'Idle', node: 'Spine', afterKey: 5 })
    ],
    ['quantizeRotations', () => createCharacter({ name: 'Fixture' }), defectStep('quantizeRotations', {})]
  ];

  test.each(cases)('%s', async (name, generate, step) => {
    const lint = async (document: ReturnType<typeof generate>) =>
      lintDocument(await roundTripGlb(document), 'fixture.glb', defaultPolicy()).findings;
    const clean = await lint(generate());
    const broken = await lint(step.apply(generate()));
    const rulesIn = (findings: Finding[]) => new Set(findings.filter((f) => f.severity !== 'info').map((f) => f.rule));
    expect(clean.filter((finding) => finding.severity !== 'info')).toEqual([]);
    const expected = DEFECT_RULES[step.name];
    for (const rule of expected) expect(broken.map((finding) => finding.rule)).toContain(rule);
    // Nothing beyond what the registry says the defect trips (info findings aside).
    for (const rule of rulesIn(broken)) expect(expected).toContain(rule);
    expect(name).toBe(step.name);
  });
});

describe('the demo history under each project’s policy', () => {
  const builds = listDemoBuilds(new Date('2026-03-01T12:00:00Z'));

  test.each(builds.map((build) => [`${build.label} ${build.project} ${build.branch}`, build] as const))(
    '%s shows exactly the trouble its story claims',
    async (_, build) => {
      const findings = await lintFiles(await build.assets(), parsePolicy(getDemoPolicy(build.project)));
      const heavy = new Set(findings.filter((finding) => finding.severity !== 'info').map((finding) => finding.rule));
      const expectedHeavy = build.expectedRules.filter((rule) => rule !== 'redundant-keys');
      expect([...heavy].sort()).toEqual([...expectedHeavy].sort());
      if (build.expectedRules.includes('redundant-keys')) {
        expect(findings.some((finding) => finding.rule === 'redundant-keys')).toBe(true);
      }
      expect(findings.some((finding) => finding.severity === 'error')).toBe(build.expectsErrors);
    }
  );
});
