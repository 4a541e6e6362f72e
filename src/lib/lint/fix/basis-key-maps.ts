/**
 * Key maps for the basis fixes: how a quarter or half turn C moved past a node changes that node's
 * animation keys. All three are linear, so they apply to CUBICSPLINE tangents unchanged.
 */
import { multiply, permuteScale, rotateVector, type BasisTurn, type Quat } from './basis-turn';
import type { KeyMap } from './channel-edits';

/**
 * `before·q·after` on every rotation key (Hamilton product). `id` names the map so channels that
 * share a sampler and get the same map share the edit.
 */
export function rotationMap(id: string, before: Quat | null, after: Quat | null): KeyMap {
  return {
    id: `rotation:${id}`,
    components: 4,
    apply(slot, offset) {
      let q: Quat = [slot[offset], slot[offset + 1], slot[offset + 2], slot[offset + 3]];
      if (before) q = multiply(before, q);
      if (after) q = multiply(q, after);
      slot.set(q, offset);
    }
  };
}

/** C·t on every translation key: exact, since C's matrix only moves and negates components. */
export function translationMap(basis: BasisTurn): KeyMap {
  return {
    id: 'translation',
    components: 3,
    apply: (slot, offset) => slot.set(rotateVector(basis, slot.subarray(offset, offset + 3)), offset)
  };
}

/** C·S·C⁻¹ on every scale key: the same scale with its axes renamed by the turn. */
export function scaleMap(basis: BasisTurn): KeyMap {
  return {
    id: 'scale',
    components: 3,
    apply: (slot, offset) => slot.set(permuteScale(basis, slot.subarray(offset, offset + 3)), offset)
  };
}
