import { describe, expect, it } from 'vitest';
import { compareWithBaseline, type ComparableFinding } from './compare-with-baseline';

const finding = (fingerprint: string, asset = 'chars/kelp-diver.glb', label = fingerprint) => ({
  fingerprint,
  asset,
  label
});
const statuses = (compared: { finding: ComparableFinding & { label: string }; status: string }[]) =>
  compared.map(({ finding, status }) => `${finding.label}:${status}`);

const checked = new Set(['chars/kelp-diver.glb', 'props/buoy.glb']);

describe('compareWithBaseline', () => {
  it('marks every finding new when there is no baseline', () => {
    expect(statuses(compareWithBaseline([finding('a'), finding('b')], null, checked))).toEqual(['a:new', 'b:new']);
  });

  it('marks findings present in the baseline unchanged and absent ones new', () => {
    const compared = compareWithBaseline([finding('a'), finding('b')], [finding('b')], checked);
    expect(statuses(compared)).toEqual(['a:new', 'b:unchanged']);
  });

  it('lists baseline findings now absent as fixed, after the current ones', () => {
    const compared = compareWithBaseline([finding('b')], [finding('a'), finding('b'), finding('c')], checked);
    expect(statuses(compared)).toEqual(['b:unchanged', 'a:fixed', 'c:fixed']);
  });

  it('carries the baseline finding itself in a fixed entry', () => {
    const old = finding('gone', 'props/buoy.glb', 'from-baseline');
    const [entry] = compareWithBaseline([], [old], checked);
    expect(entry.finding).toBe(old);
    expect(entry.status).toBe('fixed');
  });

  it('matches repeated fingerprints as a multiset', () => {
    const current = [finding('x', undefined, 'x1'), finding('x', undefined, 'x2'), finding('x', undefined, 'x3')];
    const baseline = [finding('x', undefined, 'old1'), finding('x', undefined, 'old2')];
    expect(statuses(compareWithBaseline(current, baseline, checked))).toEqual([
      'x1:unchanged',
      'x2:unchanged',
      'x3:new'
    ]);
    expect(statuses(compareWithBaseline(current.slice(0, 1), baseline, checked))).toEqual([
      'x1:unchanged',
      'old2:fixed'
    ]);
  });

  it('does not call findings of an asset missing from this build fixed', () => {
    const baseline = [finding('a', 'chars/kelp-diver.glb'), finding('b', 'env/reef-arch.glb')];
    expect(statuses(compareWithBaseline([], baseline, checked))).toEqual(['a:fixed']);
  });

  it('returns nothing for an empty build against an empty baseline', () => {
    expect(compareWithBaseline([], [], checked)).toEqual([]);
  });
});
