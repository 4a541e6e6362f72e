/**
 * Groups offending keys (or segments between keys) into runs, so a rule reports "keys 40–95"
 * once instead of 56 times. Rules feed it in ascending order; it hands back each finished run
 * with its worst member. Allocates one object per run, never per key.
 *
 * After {@link MAX_RANGES_PER_CHANNEL} runs, further runs fold into one last range that says how
 * many runs it stands for: a report with thousands of lines for one channel helps nobody.
 */

/** Most runs reported per rule and channel before the rest fold into one summary range. */
export const MAX_RANGES_PER_CHANNEL = 20;

/** One run of flagged keys, inclusive. */
export interface KeyRange {
  first: number;
  last: number;
  /** The key (or segment start) with the highest score. */
  worstIndex: number;
  worstScore: number;
  /** How many keys or segments in the run were flagged. */
  flaggedCount: number;
  /** Runs folded into this one past the limit; 0 for an ordinary run. */
  foldedRanges: number;
}

/**
 * `keys`: keys k and k+1 flagged one after the other join one run.
 * `segments`: segment (k, k+1) joins the run that ends at key k (they share that key).
 */
export type RangeUnit = 'keys' | 'segments';

export class KeyRangeCollector {
  private current: KeyRange | null = null;
  private overflow: KeyRange | null = null;
  private emitted = 0;

  constructor(
    private readonly unit: RangeUnit,
    private readonly onRange: (range: KeyRange) => void,
    private readonly limit = MAX_RANGES_PER_CHANNEL
  ) {}

  /** Flags keys `first`..`last` (one key, or a segment's two keys) with `score` (higher is worse) at `index`. */
  add(first: number, last: number, score: number, index: number): void {
    const current = this.current;
    const reach = this.unit === 'keys' ? 1 : 0;
    if (current !== null && first <= current.last + reach) {
      if (last > current.last) current.last = last;
      current.flaggedCount++;
      if (score > current.worstScore) {
        current.worstScore = score;
        current.worstIndex = index;
      }
      return;
    }
    this.close();
    this.current = { first, last, worstIndex: index, worstScore: score, flaggedCount: 1, foldedRanges: 0 };
  }

  /** Emits the open run and the folded remainder, if any. Call once after the last `add`. */
  finish(): void {
    this.close();
    if (this.overflow !== null) this.onRange(this.overflow);
    this.overflow = null;
    this.emitted = 0;
  }

  private close(): void {
    const range = this.current;
    if (range === null) return;
    this.current = null;
    if (this.emitted < this.limit) {
      this.emitted++;
      this.onRange(range);
      return;
    }
    const overflow = this.overflow;
    if (overflow === null) {
      this.overflow = { ...range, foldedRanges: 1 };
      return;
    }
    overflow.last = range.last;
    overflow.flaggedCount += range.flaggedCount;
    overflow.foldedRanges++;
    if (range.worstScore > overflow.worstScore) {
      overflow.worstScore = range.worstScore;
      overflow.worstIndex = range.worstIndex;
    }
  }
}
