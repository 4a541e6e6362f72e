import { describe, expect, it } from 'vitest';
import { toJsonReport } from '../../lint/report/json-report';
import { makeAsset, makeFinding, makeReport } from '../../lint/report/sample-report.fixture';
import { toSarif } from '../../lint/report/sarif';
import type { BuildSummary } from './build-summary';
import { addStandingToJson, addStandingToSarif, type FindingStanding } from './report-standing';

const report = makeReport([
  makeAsset('characters/harbor-keeper.glb', [
    makeFinding(),
    makeFinding({ rule: 'unit-drift', time: 1.25, keys: [30, 30] })
  ]),
  makeAsset('props/buoy.glb', []),
  makeAsset('props/lantern.glb', [makeFinding({ rule: 'wide-arc', severity: 'info' })])
]);

const standings: FindingStanding[] = [
  { baselineStatus: 'unchanged', waiver: null },
  { baselineStatus: 'new', waiver: { id: 7, reason: 'Rig swap next sprint.', expiresAt: '2099-01-01T00:00:00.000Z' } },
  { baselineStatus: 'new', waiver: null }
];

const build = { id: 42, verdict: 'pass', baselineBuildId: 41 } as BuildSummary;

describe('addStandingToSarif', () => {
  const sarif = JSON.parse(addStandingToSarif(toSarif(report), standings, build)) as {
    runs: {
      results: { ruleId: string; baselineState: string; suppressions?: unknown[] }[];
      properties: Record<string, unknown>;
    }[];
  };

  it('gives every result its baseline state, in report order', () => {
    // SARIF 2.1.0 result.baselineState values: "new", "unchanged", "updated", "absent".
    expect(sarif.runs[0].results.map((result) => [result.ruleId, result.baselineState])).toEqual([
      ['hemisphere-jump', 'unchanged'],
      ['unit-drift', 'new'],
      ['wide-arc', 'new']
    ]);
  });

  it('suppresses only the waived result, externally and accepted, with the reason as justification', () => {
    const [first, waived, last] = sarif.runs[0].results;
    expect(first.suppressions).toBeUndefined();
    expect(last.suppressions).toBeUndefined();
    expect(waived.suppressions).toEqual([
      {
        kind: 'external',
        status: 'accepted',
        justification: 'Rig swap next sprint.',
        properties: { waiverId: 7, expiresAt: '2099-01-01T00:00:00.000Z' }
      }
    ]);
  });

  it("keeps the run's own properties and adds the build", () => {
    expect(sarif.runs[0].properties).toEqual({ policyVersion: report.policyVersion, build });
  });
});

describe('addStandingToJson', () => {
  const text = addStandingToJson(toJsonReport(report), standings, build);
  const json = JSON.parse(text) as Record<string, unknown> & {
    assets: { findings: Record<string, unknown>[] }[];
  };

  it('puts the build after policyVersion and keeps every documented field', () => {
    expect(Object.keys(json)).toEqual([
      'schema',
      'schemaVersion',
      'tool',
      'policyVersion',
      'build',
      'summary',
      'assets'
    ]);
    const plain = JSON.parse(toJsonReport(report)) as { assets: { findings: Record<string, unknown>[] }[] };
    const documented = Object.keys(plain.assets[0].findings[0]);
    expect(Object.keys(json.assets[0].findings[0])).toEqual([...documented, 'baselineStatus', 'waiver']);
  });

  it('adds the standing to each finding in report order', () => {
    const added = json.assets.flatMap((asset) => asset.findings.map((f) => [f.baselineStatus, f.waiver]));
    expect(added).toEqual(standings.map((standing) => [standing.baselineStatus, standing.waiver]));
  });

  it('ends with one newline like the plain report', () => {
    expect(text.endsWith('}\n')).toBe(true);
  });
});

describe('a standing list that does not match the report', () => {
  it('throws rather than pairing findings with the wrong standing', () => {
    expect(() => addStandingToSarif(toSarif(report), standings.slice(0, 2), build)).toThrow(/more findings/);
  });
});
