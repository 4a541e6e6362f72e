/**
 * What a fix changed in a document, reported through each transform's `onResult` option so
 * callers (fixDocument, the CLI) can tell "fixed" from "nothing to do" and say how much changed.
 */

/** The names of Orientry's fix transforms. */
export type FixName = 'renormalize' | 'unflipHemispheres' | 'breakAntipodalKeys' | 'removeBakedBasis';

export interface FixResult {
  fix: FixName;
  /** Animation keys rewritten (a CUBICSPLINE key counts once, with its tangents). */
  keysChanged: number;
  /** Nodes whose rest transform was rewritten. */
  nodesChanged: number;
  /** Accessors that took new data in place. */
  accessorsWritten: number;
  /** Accessors cloned so that other users of the original keep its data unchanged. */
  accessorsCloned: number;
}

/** True when the fix changed anything at all. */
export function hasChanges(result: FixResult): boolean {
  return result.keysChanged > 0 || result.nodesChanged > 0 || result.accessorsWritten > 0 || result.accessorsCloned > 0;
}
