import { describe, expect, it } from 'vitest';
import { toTextSummary } from './text-summary';
import { makeAsset, makeFinding, makeReport, sampleReport } from './sample-report.fixture';

// ECMA-48 control sequence introducer (ESC [), which every ANSI colour code starts with.
const ESCAPE = '\u001b[';

describe('toTextSummary', () => {
  const text = toTextSummary(sampleReport());
  const lines = text.split('\n');

  it('writes no ANSI escape codes unless colour is asked for', () => {
    expect(text).not.toContain(ESCAPE);
    expect(toTextSummary(sampleReport(), { color: false })).toBe(text);
  });

  it('colours severity markers, asset paths and hints when colour is on, and the text underneath is unchanged', () => {
    const colored = toTextSummary(sampleReport(), { color: true });
    expect(colored).toContain(`${ESCAPE}31merror${ESCAPE}0m`); // SGR 31 red
    expect(colored).toContain(`${ESCAPE}33mwarn `); // SGR 33 yellow
    expect(colored).toContain(`${ESCAPE}36minfo `); // SGR 36 cyan
    // eslint-disable-next-line no-control-regex -- stripping SGR sequences
    expect(colored.replace(/\u001b\[\d+m/g, '')).toBe(text);
  });

  it('heads each asset with its path and a count of findings by severity', () => {
    expect(lines).toContain('characters/harbor-keeper.glb  4 findings (1 error, 2 warnings, 1 info)');
    expect(lines).toContain('props/lantern.gltf  clean');
    expect(lines).toContain('props/broken-buoy.glb  unreadable, 1 finding (1 error)');
  });

  it('groups findings by severity, errors first, whatever order they came in', () => {
    const markers = lines.filter((line) => /^ {2}(error|warn |info )/.test(line)).map((line) => line.slice(2, 7));
    expect(markers).toEqual(['error', 'warn ', 'warn ', 'info ', 'error']);
  });

  it('gives rule, node, animation and channel, key range and time, then message and hint', () => {
    const index = lines.indexOf('  error  hemisphere-jump  /Keeper/Hips/Spine  Walk channel 3  keys 4-5  t=0.167s');
    expect(index).toBeGreaterThan(0);
    expect(lines[index + 1]).toBe(
      '         CUBICSPLINE keys 4 and 5 lie in opposite hemispheres (dot -0.412); the curve passes near zero.'
    );
    expect(lines[index + 2]).toBe(
      '         hint: Negate key 5 and its tangents, and every later key, so neighbours share a sign.'
    );
  });

  it('leaves out what a node-level finding does not have', () => {
    expect(lines).toContain('  warn   baked-basis  /Keeper');
    expect(lines).toContain('  error  asset-unreadable');
  });

  it('ends with one line of totals', () => {
    expect(text.endsWith('\n')).toBe(true);
    expect(lines[lines.length - 2]).toBe('3 assets, 5 findings: 2 errors, 2 warnings, 1 info');
  });

  it('says when an asset was skipped, and writes a single key as "key N"', () => {
    const report = makeReport([
      makeAsset('props/crate.glb', [], { skipped: true }),
      makeAsset('props/bell.glb', [makeFinding({ keys: [6, 6], time: 0.25 })])
    ]);
    const summary = toTextSummary(report);
    expect(summary).toContain('props/crate.glb  skipped by the policy\n');
    expect(summary).toContain('Walk channel 3  key 6  t=0.25s');
    expect(summary).toContain('2 assets, 1 finding: 0 errors, 1 warning, 0 info\n');
  });

  it('prints only the totals line for an empty build', () => {
    expect(toTextSummary(makeReport([]))).toBe('0 assets, 0 findings: 0 errors, 0 warnings, 0 info\n');
  });
});
