import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { toJsonReport } from './json-report';
import { makeAsset, makeFinding, makeReport, sampleReport } from './sample-report.fixture';

const TOP_KEYS = ['schema', 'schemaVersion', 'tool', 'policyVersion', 'summary', 'assets'];
const ASSET_KEYS = ['path', 'byteLength', 'unreadable', 'skipped', 'stats', 'findings'];
const FINDING_KEYS = [
  'rule',
  'severity',
  'asset',
  'animation',
  'channel',
  'node',
  'keys',
  'time',
  'values',
  'message',
  'hint',
  'fingerprint'
];

describe('toJsonReport', () => {
  it('parses back to the same report', () => {
    const report = sampleReport();
    expect(JSON.parse(toJsonReport(report))).toEqual(report);
  });

  it('identifies the format and its version', () => {
    const parsed = JSON.parse(toJsonReport(sampleReport()));
    expect(parsed.schema).toBe('orientry.lint-report');
    expect(parsed.schemaVersion).toBe(1);
  });

  it('writes keys in the documented order at every level', () => {
    const parsed = JSON.parse(toJsonReport(sampleReport()));
    expect(Object.keys(parsed)).toEqual(TOP_KEYS);
    expect(Object.keys(parsed.tool)).toEqual(['name', 'version']);
    expect(Object.keys(parsed.summary)).toEqual(['assets', 'findings', 'error', 'warning', 'info']);
    expect(Object.keys(parsed.assets[0])).toEqual(ASSET_KEYS);
    expect(Object.keys(parsed.assets[0].stats)).toEqual([
      'animations',
      'rotationChannels',
      'rotationKeys',
      'nodesWithRotation'
    ]);
    expect(Object.keys(parsed.assets[0].findings[0])).toEqual(FINDING_KEYS);
  });

  it('gives byte-identical text for reports that differ only in key insertion order', () => {
    const finding = makeFinding({ values: { dot: -0.5, angleDegrees: 120 } });
    const shuffled = Object.fromEntries(Object.entries(finding).reverse()) as typeof finding;
    shuffled.values = { angleDegrees: 120, dot: -0.5 };
    const a = makeReport([makeAsset('a.glb', [finding])]);
    const b = makeReport([makeAsset('a.glb', [shuffled])]);
    expect(toJsonReport(b)).toBe(toJsonReport(a));
    const values = JSON.parse(toJsonReport(a)).assets[0].findings[0].values;
    expect(Object.keys(values)).toEqual(['angleDegrees', 'dot']);
  });

  it('pretty prints with two spaces and ends with a newline', () => {
    const text = toJsonReport(sampleReport());
    expect(text.startsWith('{\n  "schema": "orientry.lint-report",\n  "schemaVersion": 1,\n')).toBe(true);
    expect(text.endsWith('}\n')).toBe(true);
  });

  it('writes numbers JSON cannot hold as null', () => {
    const finding = makeFinding({
      values: { dot: Number.NaN, lengthRatio: Number.POSITIVE_INFINITY },
      time: Number.NaN
    });
    const parsed = JSON.parse(toJsonReport(makeReport([makeAsset('a.glb', [finding])])));
    expect(parsed.assets[0].findings[0].values).toEqual({ dot: null, lengthRatio: null });
    expect(parsed.assets[0].findings[0].time).toBeNull();
  });

  it('keeps an empty build valid: no assets, zero counts', () => {
    const parsed = JSON.parse(toJsonReport(makeReport([])));
    expect(parsed.assets).toEqual([]);
    expect(parsed.summary).toEqual({ assets: 0, findings: 0, error: 0, warning: 0, info: 0 });
  });

  it('has every field it writes documented in docs/report-format.md', () => {
    const doc = readFileSync(new URL('../../../../docs/report-format.md', import.meta.url), 'utf8');
    const parsed = JSON.parse(toJsonReport(sampleReport()));
    const paths = new Set<string>();
    collectPaths(parsed, '', paths);
    const undocumented = [...paths].filter((path) => !doc.includes(`\`${path}\``));
    expect(undocumented).toEqual([]);
  });
});

/** Field paths like `assets[].findings[].rule`; `values` is free-form, so only the field itself is listed. */
function collectPaths(value: unknown, prefix: string, paths: Set<string>): void {
  if (Array.isArray(value)) {
    for (const item of value) if (item && typeof item === 'object') collectPaths(item, `${prefix}[]`, paths);
    return;
  }
  if (!value || typeof value !== 'object') return;
  for (const [key, child] of Object.entries(value)) {
    const path = prefix ? `${prefix}.${key}` : key;
    paths.add(path);
    if (key !== 'values' && key !== 'keys') collectPaths(child, path, paths);
  }
}
