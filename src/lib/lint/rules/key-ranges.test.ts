import { describe, expect, it } from 'vitest';
import { KeyRangeCollector, type KeyRange } from './key-ranges';

function collect(unit: 'keys' | 'segments', flagged: [number, number, number][], limit?: number): KeyRange[] {
  const ranges: KeyRange[] = [];
  const collector = new KeyRangeCollector(unit, (range) => ranges.push(range), limit);
  for (const [first, last, score] of flagged) collector.add(first, last, score, first);
  collector.finish();
  return ranges;
}

describe('KeyRangeCollector', () => {
  it('joins consecutive keys into one run and keeps its worst key', () => {
    const ranges = collect('keys', [
      [3, 3, 0.1],
      [4, 4, 0.5],
      [5, 5, 0.2],
      [9, 9, 0.3]
    ]);
    expect(ranges).toEqual([
      { first: 3, last: 5, worstIndex: 4, worstScore: 0.5, flaggedCount: 3, foldedRanges: 0 },
      { first: 9, last: 9, worstIndex: 9, worstScore: 0.3, flaggedCount: 1, foldedRanges: 0 }
    ]);
  });

  it('joins segments only when they share a key', () => {
    const ranges = collect('segments', [
      [3, 4, 1],
      [4, 5, 1],
      [6, 7, 1]
    ]);
    expect(ranges.map((range) => [range.first, range.last])).toEqual([
      [3, 5],
      [6, 7]
    ]);
  });

  it('folds runs past the limit into one summary range', () => {
    const flagged: [number, number, number][] = [];
    for (let k = 0; k < 10; k++) flagged.push([k * 3, k * 3, k]);
    const ranges = collect('keys', flagged, 4);
    expect(ranges).toHaveLength(5);
    expect(ranges[4]).toMatchObject({ first: 12, last: 27, foldedRanges: 6, flaggedCount: 6, worstScore: 9 });
  });
});
