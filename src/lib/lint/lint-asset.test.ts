import { describe, expect, it } from 'vitest';
import { buildLintReport } from './build-lint-report';
import type { Finding } from './finding';
import { gateFailures } from './gate';
import { lintAsset } from './lint-asset';
import { parsePolicy, policyVersionOf } from './policy';
import { buildAnimatedDocument, jsonBytes, sourceFromBytes, writeGlb } from './read/testing';
import { ENGINE_VERSION } from './version';

async function buoyGlb(): Promise<Uint8Array> {
  return writeGlb(
    buildAnimatedDocument([
      {
        nodeName: 'Buoy',
        interpolation: 'LINEAR',
        times: [0, 1],
        output: new Float32Array([0, 0, 0, 1, 0, 0.6, 0, 0.8])
      }
    ])
  );
}

describe('lintAsset', () => {
  it('turns a truncated GLB into one asset-unreadable error and still lints the next asset', async () => {
    const glb = await buoyGlb();
    const policy = parsePolicy({});
    const sources = [
      sourceFromBytes('harbor/broken.glb', glb.subarray(0, 40)),
      sourceFromBytes('harbor/garbage.glb', new Uint8Array([1, 2, 3, 4, 5, 6, 7, 8])),
      sourceFromBytes('harbor/notes.gltf', jsonBytes({ tide: 'low' })),
      sourceFromBytes('harbor/buoy.glb', glb)
    ];
    const reports = [];
    for (const source of sources) reports.push(await lintAsset(source, policy));

    for (const report of reports.slice(0, 3)) {
      expect(report.unreadable).toBe(true);
      expect(report.findings).toHaveLength(1);
      expect(report.findings[0]).toMatchObject({ rule: 'asset-unreadable', severity: 'error', asset: report.path });
      expect(report.findings[0].message).toContain(report.path);
      expect(report.findings[0].hint.length).toBeGreaterThan(0);
    }
    expect(reports.slice(0, 3).map((report) => report.findings[0].values.code)).toEqual([
      'asset.glb-invalid',
      'asset.not-gltf',
      'asset.not-gltf'
    ]);
    expect(reports[3]).toMatchObject({ unreadable: false, skipped: false, byteLength: glb.byteLength });
    expect(reports[3].stats).toEqual({ animations: 1, rotationChannels: 1, rotationKeys: 2, nodesWithRotation: 0 });
    expect(reports[3].findings.filter((finding) => finding.rule === 'asset-unreadable')).toEqual([]);
  });

  it('lets a policy lower the severity of asset-unreadable', async () => {
    const report = await lintAsset(
      sourceFromBytes('harbor/empty.glb', new Uint8Array(0)),
      parsePolicy({ rules: { 'asset-unreadable': 'warning' } })
    );
    expect(report.unreadable).toBe(true);
    expect(report.findings.map((finding) => finding.severity)).toEqual(['warning']);
  });

  it('skips assets outside the include globs or inside the exclude globs, without reading them', async () => {
    const policy = parsePolicy({ include: ['chars/**/*.glb'], exclude: ['**/*.draft.glb'] });
    const garbage = new Uint8Array([9, 9, 9]);
    const outside = await lintAsset(sourceFromBytes('props/crate.glb', garbage), policy);
    const excluded = await lintAsset(sourceFromBytes('chars/hero.draft.glb', garbage), policy);
    const included = await lintAsset(sourceFromBytes('chars/.export/hero.glb', garbage), policy);
    for (const report of [outside, excluded]) {
      expect(report).toMatchObject({ skipped: true, unreadable: false, findings: [] });
    }
    expect(included).toMatchObject({ skipped: false, unreadable: true });
  });
});

describe('gateFailures and buildLintReport', () => {
  const finding = (severity: Finding['severity'], asset: string): Finding => ({
    rule: 'unit-drift',
    severity,
    asset,
    animation: 'Sway',
    channel: 0,
    node: '/Buoy',
    keys: [0, 0],
    time: 0,
    values: {},
    message: 'm',
    hint: 'h',
    fingerprint: `${severity}-${asset}`
  });

  it('fails on findings at or above gate.failOn', () => {
    const findings = [finding('info', 'a.glb'), finding('warning', 'a.glb'), finding('error', 'b.glb')];
    expect(gateFailures(findings, parsePolicy({})).map((f) => f.severity)).toEqual(['error']);
    expect(gateFailures(findings, parsePolicy({ gate: { failOn: 'warning' } })).map((f) => f.severity)).toEqual([
      'warning',
      'error'
    ]);
    expect(gateFailures(findings, parsePolicy({ gate: { failOn: 'info' } }))).toHaveLength(3);
  });

  it('summarizes assets and findings by severity under the policy version', () => {
    const policy = parsePolicy({});
    const stats = { animations: 1, rotationChannels: 1, rotationKeys: 2, nodesWithRotation: 0 };
    const report = buildLintReport(
      [
        {
          path: 'a.glb',
          byteLength: 10,
          unreadable: false,
          skipped: false,
          stats,
          findings: [finding('error', 'a.glb')]
        },
        {
          path: 'b.glb',
          byteLength: 20,
          unreadable: false,
          skipped: false,
          stats,
          findings: [finding('warning', 'b.glb'), finding('warning', 'b.glb')]
        }
      ],
      policy
    );
    expect(report).toMatchObject({
      schema: 'orientry.lint-report',
      schemaVersion: 1,
      tool: { name: 'orientry', version: ENGINE_VERSION },
      policyVersion: policyVersionOf(policy),
      summary: { error: 1, warning: 2, info: 0, assets: 2, findings: 3 }
    });
    expect(report.assets.map((asset) => asset.path)).toEqual(['a.glb', 'b.glb']);
  });
});
