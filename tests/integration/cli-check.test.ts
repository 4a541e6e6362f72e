import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  CLEAN_CHANNEL,
  createRotationDocument,
  FLIPPED_CUBIC_CHANNEL,
  writeGlb,
  writeGltf
} from '../../cli/testing/rotation-assets';
import { buildCli, runCli } from '../../cli/testing/run-cli';

const REFERENCE_FOLDER = resolve('tests/fixtures/reference');

interface JsonReport {
  schema: string;
  summary: { assets: number; error: number; warning: number; info: number };
  assets: {
    path: string;
    unreadable: boolean;
    findings: { rule: string; severity: string; values: { code?: string } }[];
  }[];
}

let work: string;

beforeAll(async () => {
  buildCli();
  work = await mkdtemp(join(tmpdir(), 'orientry-cli-check-'));
  await writeGlb(createRotationDocument([CLEAN_CHANNEL]), join(work, 'clean/keeper.glb'));
  await writeGltf(createRotationDocument([CLEAN_CHANNEL]), join(work, 'clean/lantern.gltf'), 'lantern-data.bin');
  await writeGlb(createRotationDocument([FLIPPED_CUBIC_CHANNEL]), join(work, 'flipped/keeper.glb'));
  const glb = await writeGlb(createRotationDocument([CLEAN_CHANNEL]), join(work, 'mixed/whole.glb'));
  // Cut the last 40 bytes: the GLB header still declares the full length (glTF 2.0 §4.4.2).
  await writeFile(join(work, 'mixed/truncated.glb'), glb.subarray(0, glb.byteLength - 40));
  await writeFile(join(work, 'broken-policy.json'), '{ "wideArcDegrees": ');
  await writeFile(join(work, 'invalid-policy.json'), JSON.stringify({ tolerances: { unitWarning: 'tight' } }));
  await writeFile(join(work, 'exclude-policy.json'), JSON.stringify({ exclude: ['flipped/**'] }));
  await writeFile(join(work, 'lenient-policy.json'), JSON.stringify({ rules: { 'hemisphere-jump': 'info' } }));
});

afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

describe('orientry check', () => {
  it('passes (exit 0) on clean assets and lists each one in the text report', () => {
    const run = runCli(['check', 'clean'], work);
    expect(run.stderr).toBe('');
    expect(run.status).toBe(0);
    expect(run.stdout).toContain('clean/keeper.glb');
    expect(run.stdout).toContain('clean/lantern.gltf');
  });

  it('fails (exit 1) on a hemisphere flip in a CUBICSPLINE channel and names the rule in JSON', () => {
    const run = runCli(['check', 'flipped/keeper.glb', '--format', 'json'], work);
    expect(run.status).toBe(1);
    const report = JSON.parse(run.stdout) as JsonReport;
    expect(report.schema).toBe('orientry.lint-report');
    const jump = report.assets[0].findings.find((finding) => finding.rule === 'hemisphere-jump');
    // The rule's documented severity for CUBICSPLINE (glTF 2.0 Appendix C: no sign correction in the spline).
    expect(jump?.severity).toBe('error');
  });

  it('writes SARIF that parses and names the rule', () => {
    const run = runCli(['check', 'flipped', '--format', 'sarif'], work);
    expect(run.status).toBe(1);
    const sarif = JSON.parse(run.stdout) as { version: string; runs: { results: { ruleId: string }[] }[] };
    expect(sarif.version).toBe('2.1.0');
    expect(sarif.runs[0].results.map((result) => result.ruleId)).toContain('hemisphere-jump');
  });

  it('writes JUnit XML with a failing test case for the rule', () => {
    const run = runCli(['check', 'flipped', '--format', 'junit'], work);
    expect(run.status).toBe(1);
    expect(run.stdout.startsWith('<?xml')).toBe(true);
    const testCase = /<testcase[^>]*name="hemisphere-jump"[^>]*>([\s\S]*?)<\/testcase>/.exec(run.stdout);
    expect(testCase?.[1]).toContain('<failure');
  });

  it('writes the report to --output and only a one-line summary to stderr', async () => {
    const run = runCli(['check', 'flipped', '--format', 'sarif', '-o', 'reports/orientry.sarif'], work);
    expect(run.status).toBe(1);
    expect(run.stdout).toBe('');
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(run.stderr).toContain('gate failed');
    expect(run.stderr).toContain('reports/orientry.sarif');
    const sarif = JSON.parse(await readFile(join(work, 'reports/orientry.sarif'), 'utf8')) as { runs: unknown[] };
    expect(sarif.runs).toHaveLength(1);
  });

  it('exits 2 when the report cannot be written', () => {
    // The parent of the output is a file, so no folder can be made there.
    const run = runCli(['check', 'clean', '--output', 'clean/keeper.glb/report.txt'], work);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('cannot write the report');
  });

  it('reports a truncated GLB as asset-unreadable (exit 1) and still lints the other file', () => {
    const run = runCli(['check', 'mixed', '--format', 'json'], work);
    expect(run.status).toBe(1);
    const report = JSON.parse(run.stdout) as JsonReport;
    const byPath = new Map(report.assets.map((asset) => [asset.path, asset]));
    const truncated = byPath.get('mixed/truncated.glb');
    expect(truncated?.unreadable).toBe(true);
    expect(truncated?.findings.map((finding) => finding.rule)).toEqual(['asset-unreadable']);
    expect(truncated?.findings[0].values.code).toBe('asset.glb-invalid');
    expect(byPath.get('mixed/whole.glb')?.unreadable).toBe(false);
    expect(byPath.get('mixed/whole.glb')?.findings.filter((finding) => finding.severity === 'error')).toEqual([]);
  });

  it('moves the gate with --fail-on and with a policy that lowers a rule', () => {
    expect(runCli(['check', 'flipped', '--policy', 'lenient-policy.json'], work).status).toBe(0);
    expect(runCli(['check', 'flipped', '--policy', 'lenient-policy.json', '--fail-on', 'info'], work).status).toBe(1);
  });

  it('skips assets the policy excludes, so they cannot fail the gate', () => {
    const run = runCli(['check', 'clean', 'flipped', '--policy', 'exclude-policy.json', '--format', 'json'], work);
    expect(run.status).toBe(0);
    const report = JSON.parse(run.stdout) as JsonReport & { assets: { skipped: boolean }[] };
    const flipped = report.assets.find((asset) => asset.path === 'flipped/keeper.glb');
    expect(flipped).toMatchObject({ skipped: true, findings: [] });
  });

  it('exits 2 naming the field for an invalid policy', () => {
    const run = runCli(['check', 'clean', '--policy', 'invalid-policy.json'], work);
    expect(run.status).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toContain('policy.tolerances.unitWarning');
    expect(run.stderr.trimEnd().split('\n')).toHaveLength(1);
  });

  it('exits 2 for a policy that is not JSON and for a missing policy file', () => {
    const broken = runCli(['check', 'clean', '--policy', 'broken-policy.json'], work);
    expect(broken.status).toBe(2);
    expect(broken.stderr).toContain('not valid JSON');
    const missing = runCli(['check', 'clean', '--policy', 'nowhere.json'], work);
    expect(missing.status).toBe(2);
    expect(missing.stderr).toContain('nowhere.json');
  });

  it('exits 2 when no file matches', () => {
    const run = runCli(['check', 'clean/**/*.fbx'], work);
    expect(run.status).toBe(2);
    expect(run.stderr).toContain('no .glb or .gltf file matched');
  });

  it('exits 2 with a one-line reason for an unknown flag', () => {
    const run = runCli(['check', 'clean', '--strict'], work);
    expect(run.status).toBe(2);
    expect(run.stderr).toBe('orientry check: unknown option --strict (see orientry check --help)\n');
  });

  it('keeps stdout parseable when --progress writes to stderr', () => {
    const run = runCli(['check', 'clean', 'flipped', '--format', 'json', '--progress'], work);
    expect(run.status).toBe(1);
    expect((JSON.parse(run.stdout) as JsonReport).summary.assets).toBe(3);
    expect(run.stderr).toContain('[3/3]');
  });

  it('prints help generated from the option table, and the versions', () => {
    const help = runCli(['check', '--help'], work);
    expect(help.status).toBe(0);
    expect(help.stdout).toContain('--fail-on <error|warning|info>');
    expect(help.stdout).toContain('src/lib/lint/policy.ts');
    const version = runCli(['--version'], work);
    expect(version.stdout).toMatch(/^orientry \d+\.\d+\.\d+ \(lint engine \d+\.\d+\.\d+\)\n$/);
  });

  it('lints the reference sample assets without crashing', () => {
    const run = runCli(['check', REFERENCE_FOLDER, '--format', 'json'], work);
    expect(run.stderr).not.toContain('internal error');
    expect([0, 1]).toContain(run.status);
    const report = JSON.parse(run.stdout) as JsonReport;
    // MANIFEST.md lists six .gltf files, all readable (buffers embedded as data: URIs).
    expect(report.summary.assets).toBe(6);
    expect(report.assets.filter((asset) => asset.unreadable)).toEqual([]);
  });
});
