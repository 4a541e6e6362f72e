/**
 * Collects what one pass over a channel finds: (mark, key) pairs for the rules, and the runs of
 * keys redundant-keys may remove. Grows its arrays by doubling, so it allocates per finding,
 * never per key. One builder serves every channel (see channel-digest.ts): `reset` empties it.
 */

/** Marks combine as bit flags; see MARK in channel-digest.ts. */
export class DigestBuilder {
  marks: Int32Array = new Int32Array(32);
  markCount = 0;
  flags = 0;
  /** (first, last) key pairs of runs redundant-keys may remove. */
  runs: Int32Array = new Int32Array(16);
  runCount = 0;

  /** Forgets every mark and run, keeping the grown arrays for the next channel. */
  reset(): void {
    this.markCount = 0;
    this.flags = 0;
    this.runCount = 0;
  }

  /** Records `mark` bits at `keyIndex`; calls must come in ascending key order. */
  mark(mark: number, keyIndex: number): void {
    if (2 * this.markCount + 2 > this.marks.length) this.marks = grow(this.marks);
    this.marks[2 * this.markCount] = mark;
    this.marks[2 * this.markCount + 1] = keyIndex;
    this.markCount++;
    this.flags |= mark;
  }

  /** Records a run of keys `first`..`last` (inclusive). */
  run(first: number, last: number): void {
    if (2 * this.runCount + 2 > this.runs.length) this.runs = grow(this.runs);
    this.runs[2 * this.runCount] = first;
    this.runs[2 * this.runCount + 1] = last;
    this.runCount++;
  }
}

function grow(array: Int32Array): Int32Array {
  const grown = new Int32Array(array.length * 2);
  grown.set(array);
  return grown;
}
