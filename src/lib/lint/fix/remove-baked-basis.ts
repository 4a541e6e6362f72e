/**
 * Removes basis corrections from an asset's roots (baked-basis) and from its root clips
 * (clip-basis-offset).
 *
 * Rest corrections. A scene root or root joint whose rest rotation is a quarter or half turn C about
 * X, Y or Z only wraps content that was never converted to glTF's basis (§3.4). The fix folds C into
 * the content: with the root's local transform T·R·S and R = ρ·C (ρ the rounding left over, usually
 * nothing),
 *   T·ρ·C·S = T·ρ·S'·C  with S' = C·S·C⁻¹ (for a principal turn again a diagonal scale),
 * so the root keeps T, takes rotation ρ and scale S', and every child is premultiplied by C:
 * translation t → C·t, rotation r → C·r, scale unchanged; their translation and rotation keys alike.
 * The root's own rotation keys become q·C⁻¹ and its scale keys S' = C·S·C⁻¹, so the world transform of
 * every node is the same as before, at rest and at every key. Joint matrices stay the same too: the
 * root joint's inverse bind matrix is premultiplied by C (joint matrix = world · inverse bind, §3.7.3),
 * and content on the root itself (mesh, camera, lights) moves to a new child holding C.
 * Quantized rotation outputs are re-encoded (§3.11) from unit length, so they stay within one step of it.
 * Folding C into a child can turn that child into a corrected root joint (an armature node above the
 * hips); it is folded in turn, top down, until no root carries a principal turn.
 *
 * Clip corrections (clip-offsets.ts). A root rotation channel whose every key is the rest rotation turned by the same
 * principal turn D, on the parent side (key = D·rest) or the local side (key = rest·D), was exported
 * with other axis settings than the rig. Its keys become D⁻¹·key (or key·D⁻¹). This one changes what
 * the clip shows on purpose: afterwards it plays in the rig's orientation instead of turned against it.
 */
import type { Document, Node, Skin, Transform } from '@gltf-transform/core';
import { findPrincipalTurn, type PrincipalTurn } from '../math/principal-turn';
import { defaultPolicy } from '../policy';
import { multiply, permuteScale, rotateVector, toBasisTurn, type BasisTurn, type Quat } from './basis-turn';
import { rotationMap, scaleMap, translationMap } from './basis-key-maps';
import { applyChannelEdits, type ChannelEdit } from './channel-edits';
import { findClipOffsets } from './clip-offsets';
import { withoutUndefined } from './defined-options';
import type { FixResult } from './fix-result';
import { hasNodeContent, moveNodeContent } from './move-node-content';
import { listRootNodes } from './root-nodes';
import { fixedName } from './sampler-output';

export const REMOVE_BAKED_BASIS = 'removeBakedBasis';

export interface RemoveBakedBasisOptions {
  /** Fold rest corrections of scene roots and root joints into their content (baked-basis). */
  rest?: boolean;
  /** Take common principal-turn offsets out of root rotation channels (clip-basis-offset). */
  clips?: boolean;
  /** How close (rotation angle, degrees) a rest rotation must be to a principal turn. Default: the policy's. */
  basisToleranceDegrees?: number;
  /** How far (degrees) each key of a root clip may stray from one common offset. Default: the policy's. */
  clipOffsetToleranceDegrees?: number;
  /** Receives what the transform changed. */
  onResult?: (result: FixResult) => void;
}

const policyConvention = defaultPolicy().convention;

export const REMOVE_BAKED_BASIS_DEFAULTS: Required<Omit<RemoveBakedBasisOptions, 'onResult'>> = {
  rest: true,
  clips: true,
  basisToleranceDegrees: policyConvention.basisToleranceDegrees,
  clipOffsetToleranceDegrees: policyConvention.clipOffsetToleranceDegrees
};

/** A leftover rotation smaller than this (radians) is float rounding of an exact turn: it becomes identity. */
const RESIDUAL_SNAP_RADIANS = 1e-6;

/**
 * A transform that removes baked basis corrections from roots and root clips.
 *
 * @example await document.transform(removeBakedBasis({ clips: false }));
 */
export function removeBakedBasis(options: RemoveBakedBasisOptions = {}): Transform {
  const settings = { ...REMOVE_BAKED_BASIS_DEFAULTS, ...withoutUndefined(options) };
  return function removeBakedBasisTransform(document: Document): void {
    const result: FixResult = {
      fix: 'removeBakedBasis',
      keysChanged: 0,
      nodesChanged: 0,
      accessorsWritten: 0,
      accessorsCloned: 0
    };
    const add = (counts: Omit<FixResult, 'fix'>) => {
      result.keysChanged += counts.keysChanged;
      result.nodesChanged += counts.nodesChanged;
      result.accessorsWritten += counts.accessorsWritten;
      result.accessorsCloned += counts.accessorsCloned;
    };
    if (settings.clips)
      add({
        ...applyChannelEdits(document, findClipOffsets(document, settings.clipOffsetToleranceDegrees)),
        nodesChanged: 0
      });
    if (settings.rest) {
      // Each fold moves a turn one level down; a tree of n nodes cannot need more than n folds.
      const limit = document.getRoot().listNodes().length;
      for (let fold = 0; fold < limit; fold++) {
        const candidate = findCorrectedRoot(document, settings.basisToleranceDegrees);
        if (!candidate) break;
        add(foldRootTurn(document, candidate.node, toBasisTurn(candidate.turn)));
      }
    }
    options.onResult?.(result);
  };
}

/** The first root, top down, whose rest rotation is a principal turn within tolerance. */
function findCorrectedRoot(document: Document, toleranceDegrees: number): { node: Node; turn: PrincipalTurn } | null {
  for (const node of listRootNodes(document)) {
    const [x, y, z, w] = node.getRotation();
    const match = findPrincipalTurn(x, y, z, w, toleranceDegrees);
    if (match) return { node, turn: match.turn };
  }
  return null;
}

/** Folds the root's turn C into its children, clips and skins; see the file comment for the algebra. */
function foldRootTurn(document: Document, root: Node, basis: BasisTurn): Omit<FixResult, 'fix'> {
  const residual = multiply(root.getRotation(), basis.inverse);
  root.setRotation(snapToIdentity(residual)).setScale(permuteScale(basis, root.getScale()));
  const children = root.listChildren();
  for (const child of children) {
    child.setTranslation(rotateVector(basis, child.getTranslation()));
    child.setRotation(multiply(basis.quaternion, child.getRotation()));
  }
  let nodesChanged = 1 + children.length;
  if (hasNodeContent(root)) {
    moveNodeContent(document, root, [...basis.quaternion]);
    nodesChanged++;
  }
  for (const skin of document.getRoot().listSkins()) premultiplyInverseBind(document, skin, root, basis);

  const childSet = new Set(children);
  const edits: ChannelEdit[] = [];
  for (const animation of document.getRoot().listAnimations())
    for (const channel of animation.listChannels()) {
      const target = channel.getTargetNode();
      const path = channel.getTargetPath();
      if (target === root && path === 'rotation')
        edits.push({ channel, map: rotationMap('root', null, basis.inverse) });
      else if (target === root && path === 'scale') edits.push({ channel, map: scaleMap(basis) });
      else if (target && childSet.has(target) && path === 'rotation')
        edits.push({ channel, map: rotationMap('child', basis.quaternion, null) });
      else if (target && childSet.has(target) && path === 'translation')
        edits.push({ channel, map: translationMap(basis) });
    }
  return { ...applyChannelEdits(document, edits), nodesChanged };
}

/**
 * Identity when the residual rotation is float rounding. A drifting length is kept (unit-drift's
 * business, reported and fixed there), a length that is 1 up to float64 rounding becomes exactly 1.
 */
function snapToIdentity(q: Quat): Quat {
  const length = Math.hypot(q[0], q[1], q[2], q[3]);
  const angle = 2 * Math.atan2(Math.hypot(q[0], q[1], q[2]), Math.abs(q[3]));
  if (!(angle < RESIDUAL_SNAP_RADIANS)) return q;
  const w = Math.abs(length - 1) < 1e-9 ? 1 : length;
  return [0, 0, 0, q[3] < 0 ? -w : w];
}

/**
 * The root joint's joint matrix is world · inverse bind; its world lost C on the right, so its
 * inverse bind matrix gains C on the left. A shared inverse-bind accessor is cloned first.
 */
function premultiplyInverseBind(document: Document, skin: Skin, joint: Node, basis: BasisTurn): void {
  const jointIndex = skin.listJoints().indexOf(joint);
  if (jointIndex < 0) return;
  let accessor = skin.getInverseBindMatrices();
  if (!accessor) {
    // glTF 2.0 §3.7.3.1: absent inverse bind matrices are identity; write them out to change one.
    const identities = new Float32Array(16 * skin.listJoints().length);
    for (let index = 0; index < identities.length; index += 16)
      identities[index] = identities[index + 5] = identities[index + 10] = identities[index + 15] = 1;
    const buffer = document.getRoot().listBuffers()[0] ?? document.createBuffer();
    accessor = document
      .createAccessor(`${skin.getName() || 'skin'} inverse bind`)
      .setType('MAT4')
      .setArray(identities)
      .setBuffer(buffer);
    skin.setInverseBindMatrices(accessor);
  }
  const array = (accessor.getArray() as Float32Array).slice();
  const offset = jointIndex * 16;
  // Column-major 4×4 (§3.7.3.1): row r of column c is array[offset + 4c + r]; rows 0-2 mix, row 3 stays.
  for (let column = 0; column < 4; column++) {
    const base = offset + column * 4;
    const rotated = rotateVector(basis, [array[base], array[base + 1], array[base + 2]]);
    array[base] = rotated[0];
    array[base + 1] = rotated[1];
    array[base + 2] = rotated[2];
  }
  const root = document.getRoot();
  const isShared = accessor.listParents().some((parent) => parent !== root && parent !== skin);
  if (isShared) skin.setInverseBindMatrices(accessor.clone().setName(fixedName(accessor.getName())).setArray(array));
  else accessor.setArray(array);
}
