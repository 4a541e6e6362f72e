/**
 * Decides from a policy's `include` and `exclude` globs whether an asset is linted. Globs use
 * picomatch syntax on forward-slash paths relative to the build root; `dot: true` so an export
 * folder such as `.export/` is matched like any other.
 */
import picomatch from 'picomatch/posix.js';
import type { Policy } from './policy';

const matchers = new Map<string, (path: string) => boolean>();

/**
 * True when `assetPath` is linted: it matches an include glob (or there are none) and no exclude glob.
 * @example isAssetIncluded('chars/hero.glb', { include: ['chars/**'], exclude: ['**\/*.draft.glb'] }) → true
 */
export function isAssetIncluded(assetPath: string, policy: Pick<Policy, 'include' | 'exclude'>): boolean {
  const path = assetPath.replace(/^\.\//, '');
  if (policy.include.length > 0 && !policy.include.some((glob) => matcherFor(glob)(path))) return false;
  return !policy.exclude.some((glob) => matcherFor(glob)(path));
}

function matcherFor(glob: string): (path: string) => boolean {
  let matcher = matchers.get(glob);
  if (!matcher) {
    matcher = picomatch(glob, { dot: true });
    matchers.set(glob, matcher);
  }
  return matcher;
}
