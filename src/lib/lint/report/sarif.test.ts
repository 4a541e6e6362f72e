import { describe, expect, it } from 'vitest';
import { RULE_IDS } from '../rule-ids';
import { RULES } from '../rules/index';
import { SARIF_FINGERPRINT_KEY, toSarif } from './sarif';
import { makeAsset, makeFinding, makeReport, sampleReport } from './sample-report.fixture';

// Section numbers are those of the OASIS SARIF 2.1.0 specification (with Errata 01).

/* eslint-disable @typescript-eslint/no-explicit-any -- a parsed SARIF log is checked structurally, field by field */
function parse(text: string): any {
  return JSON.parse(text);
}

/** The logicalLocation kinds §3.33.7 lists (executable code, XML/HTML, JSON). */
const SPEC_LOGICAL_KINDS = [
  'function',
  'member',
  'module',
  'namespace',
  'resource',
  'type',
  'returnType',
  'parameter',
  'variable',
  'element',
  'attribute',
  'text',
  'comment',
  'processingInstruction',
  'dtd',
  'declaration',
  'object',
  'array',
  'property',
  'value'
];

describe('toSarif', () => {
  const report = sampleReport();
  const log = parse(toSarif(report));
  const run = log.runs[0];
  const findings = report.assets.flatMap((asset) => asset.findings);

  it('writes a sarifLog with version 2.1.0, its schema and exactly one run (§3.13)', () => {
    expect(log.version).toBe('2.1.0'); // §3.13.2: version SHALL be present, "2.1.0"
    expect(log.$schema).toBe('https://json.schemastore.org/sarif-2.1.0.json'); // §3.13.3
    expect(Array.isArray(log.runs)).toBe(true); // §3.13.4: runs SHALL be present
    expect(log.runs).toHaveLength(1);
  });

  it('names the tool in run.tool.driver (§3.14.6, §3.18.2, §3.19)', () => {
    expect(run.tool.driver.name).toBe('Orientry'); // §3.19: a toolComponent SHALL have a name
    expect(run.tool.driver.version).toBe(report.tool.version);
    expect(run.tool.driver.semanticVersion).toBe('1.0.0'); // §3.19.12
    expect(run.tool.driver).not.toHaveProperty('informationUri');
  });

  it('lists one reporting descriptor per rule id, in the stable rule-id order (§3.19.23, §3.49)', () => {
    const ids = run.tool.driver.rules.map((rule: any) => rule.id); // §3.49.3: id SHALL be present
    expect(ids).toEqual([...RULE_IDS]);
    expect(new Set(ids).size).toBe(ids.length);
    for (const rule of run.tool.driver.rules) expect(rule.name).toMatch(/^[A-Z][A-Za-z0-9]*$/); // §3.49.7
    const hemisphere = run.tool.driver.rules.find((rule: any) => rule.id === 'hemisphere-jump');
    expect(hemisphere.name).toBe('HemisphereJump');
  });

  it('describes each implemented rule from its own title, rationale, source and severity (§3.49.9-14)', () => {
    const levels = { error: 'error', warning: 'warning', info: 'note' };
    for (const rule of RULES) {
      const descriptor = run.tool.driver.rules.find((candidate: any) => candidate.id === rule.id);
      expect(descriptor.shortDescription.text).toBe(rule.title);
      expect(descriptor.fullDescription.text).toBe(rule.rationale);
      expect(descriptor.help.text).toContain(rule.source);
      expect(descriptor.defaultConfiguration.level).toBe(levels[rule.defaultSeverity]); // §3.50.3
    }
    const unreadable = run.tool.driver.rules.find((rule: any) => rule.id === 'asset-unreadable');
    expect(unreadable.shortDescription.text.length).toBeGreaterThan(0);
    expect(unreadable.defaultConfiguration.level).toBe('error');
  });

  it('writes one result per finding with message, rule id and a ruleIndex that points at that rule (§3.27)', () => {
    expect(run.results).toHaveLength(findings.length);
    run.results.forEach((result: any, index: number) => {
      const finding = findings[index];
      expect(result.message.text).toBe(`${finding.message} ${finding.hint}`); // §3.27.11, §3.11: text present
      expect(result.ruleId).toBe(finding.rule); // §3.27.5
      expect(run.tool.driver.rules[result.ruleIndex].id).toBe(result.ruleId); // §3.27.6
    });
  });

  it('maps error, warning and info to the SARIF levels error, warning and note (§3.27.10)', () => {
    const levels = run.results.map((result: any) => result.level);
    expect(levels).toEqual(findings.map((f) => ({ error: 'error', warning: 'warning', info: 'note' })[f.severity]));
    expect(levels).toContain('note');
  });

  it('locates each result in its asset, with one location only (§3.27.12, §3.28, §3.29, §3.4)', () => {
    run.results.forEach((result: any, index: number) => {
      expect(result.locations).toHaveLength(1);
      const artifact = result.locations[0].physicalLocation.artifactLocation;
      expect(artifact.uri).toBe(findings[index].asset);
      expect(run.artifacts[artifact.index].location.uri).toBe(artifact.uri);
    });
    expect(run.artifacts.map((a: any) => a.length)).toEqual(report.assets.map((a) => a.byteLength));
  });

  it('names animation, channel and node as logical locations of a §3.33.7 kind', () => {
    const [jump] = run.results;
    expect(jump.locations[0].logicalLocations).toEqual([
      { name: 'Walk', fullyQualifiedName: 'animations/Walk', kind: 'object' },
      { name: 'channels/3', fullyQualifiedName: 'animations/Walk/channels/3', kind: 'object' },
      { name: 'Spine', fullyQualifiedName: 'nodes/Keeper/Hips/Spine', kind: 'object' }
    ]);
    const nodeOnly = run.results.find((result: any) => result.ruleId === 'baked-basis');
    expect(nodeOnly.locations[0].logicalLocations).toEqual([
      { name: 'Keeper', fullyQualifiedName: 'nodes/Keeper', kind: 'object' }
    ]);
    const unreadable = run.results.find((result: any) => result.ruleId === 'asset-unreadable');
    expect(unreadable.locations[0]).not.toHaveProperty('logicalLocations');
    for (const result of run.results)
      for (const logical of result.locations[0].logicalLocations ?? [])
        expect(SPEC_LOGICAL_KINDS).toContain(logical.kind);
  });

  it('carries the fingerprint as a versioned partial fingerprint (§3.27.17, §3.5.4)', () => {
    expect(SARIF_FINGERPRINT_KEY).toMatch(/\/v\d+$/);
    run.results.forEach((result: any, index: number) => {
      expect(result.partialFingerprints).toEqual({ 'orientry/v1': findings[index].fingerprint });
    });
  });

  it('keeps keys, time, values and hint in the result property bag (§3.8)', () => {
    expect(run.results[1].properties).toEqual({
      keys: findings[1].keys,
      time: findings[1].time,
      values: findings[1].values,
      hint: findings[1].hint
    });
  });

  it('percent-encodes asset paths into relative URI references (§3.10, RFC 3986)', () => {
    const path = 'props/Lanterne d’été #2.glb';
    const text = toSarif(makeReport([makeAsset(path, [makeFinding()])]));
    const uri = parse(text).runs[0].results[0].locations[0].physicalLocation.artifactLocation.uri;
    expect(uri).toBe('props/Lanterne%20d%E2%80%99%C3%A9t%C3%A9%20%232.glb');
    expect(uri).toMatch(/^[A-Za-z0-9\-._~%!$&'()*+,;=:@/]*$/); // RFC 3986 path characters only
    expect(decodeURIComponent(new URL(uri, 'https://build.invalid/build-root/').pathname)).toBe(`/build-root/${path}`);
  });

  it('appends a descriptor for a rule id it does not know, so every ruleIndex resolves', () => {
    const text = toSarif(makeReport([makeAsset('a.glb', [makeFinding({ rule: 'future-rule' })])]));
    const parsed = parse(text).runs[0];
    const result = parsed.results[0];
    expect(parsed.tool.driver.rules[result.ruleIndex]).toEqual({ id: 'future-rule', name: 'FutureRule' });
  });

  it('is deterministic and stays valid for a build with no assets', () => {
    expect(toSarif(report)).toBe(toSarif(sampleReport()));
    const empty = parse(toSarif(makeReport([])));
    expect(empty.runs[0].results).toEqual([]);
    expect(empty.runs[0].artifacts).toEqual([]);
    expect(empty.runs[0].properties.policyVersion).toBe('9f2c41d07ab35e88');
  });
});
