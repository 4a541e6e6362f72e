/**
 * mirrored-basis: nodes whose world transform mirrors space (the determinant of its 3×3 part is
 * negative) and skins whose inverse bind matrices mirror. glTF allows mirroring — the determinant's
 * sign sets the triangle winding (§3.7.4) — but a mirror is not a rotation: no quaternion
 * describes it, so anything that splits a world transform into rotation and scale (retargeting,
 * physics, IK, root motion) gets a wrong rotation, and engines that do not flip winding for
 * mirrored nodes render their meshes inside out.
 * Only the node where mirroring starts is reported (its parent does not mirror); the finding counts
 * the meshes and joints below it that inherit the mirror. Parents are found by node path.
 * Source: glTF 2.0 §3.7.4 (determinant sets winding order), §3.7.3 (inverse bind matrices).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { AssetFacts, NodeFacts, SkinFacts } from '../read/node-facts';
import type { AssetRule, RuleContext } from './rule';
import { formatNumber } from './format-number';

const LISTED_JOINTS = 5;

export const mirroredBasis: AssetRule = {
  id: 'mirrored-basis',
  defaultSeverity: 'warning',
  scope: 'asset',
  title: 'A node or inverse bind matrix mirrors space (negative determinant)',
  rationale:
    'A transform with a negative determinant mirrors space. glTF allows it and flips triangle winding to match, ' +
    'but a mirror is not a rotation: retargeting, physics and IK that split transforms into rotation and scale get ' +
    'wrong rotations, and engines that ignore the winding flip draw the meshes inside out.',
  source: 'glTF 2.0 §3.7.4 (determinant sets winding order); §3.7.3 (skins)',
  check: checkMirroredBasis
};

function checkMirroredBasis(facts: AssetFacts, _channels: readonly RotationChannel[], context: RuleContext): void {
  const byPath = new Map<string, NodeFacts>();
  for (const node of facts.nodes) if (!byPath.has(node.nodePath)) byPath.set(node.nodePath, node);
  for (const node of facts.nodes) {
    if (!(node.worldDeterminant < 0)) continue;
    const parent = byPath.get(parentPathOf(node.nodePath));
    if (parent !== undefined && parent.worldDeterminant < 0) continue;
    reportNode(node, facts.nodes, context);
  }
  for (const skin of facts.skins) reportSkin(skin, context);
}

function reportNode(node: NodeFacts, nodes: readonly NodeFacts[], context: RuleContext): void {
  const prefix = `${node.nodePath}/`;
  let meshes = node.hasMesh ? 1 : 0;
  let joints = node.isJoint ? 1 : 0;
  for (const other of nodes) {
    if (!other.nodePath.startsWith(prefix) || !(other.worldDeterminant < 0)) continue;
    if (other.hasMesh) meshes++;
    if (other.isJoint) joints++;
  }
  const parts = [
    meshes > 0 ? plural(meshes, 'mesh', 'meshes') : '',
    joints > 0 ? plural(joints, 'joint', 'joints') : ''
  ];
  const affected = parts.filter((part) => part !== '').join(' and ') || 'no meshes or joints yet';
  context.emit({
    animation: null,
    channel: null,
    node: node.nodePath,
    keys: null,
    time: null,
    values: { determinant: node.worldDeterminant, meshes, joints },
    message:
      `The world transform of ${node.nodePath} mirrors space (determinant ${formatNumber(node.worldDeterminant, 3)}), ` +
      `and so does everything below it: ${affected}. glTF allows it (§3.7.4 flips the winding order), but a mirror ` +
      'is not a rotation: retargeting, physics and IK that split transforms into rotation and scale get wrong ' +
      'rotations, and engines that ignore the winding flip draw these meshes inside out.',
    hint:
      'Mirror the mesh data itself (and reverse its triangle winding) instead of using a negative scale, or ' +
      'mirror poses with rotations about the mirror plane rather than a scale of −1.',
    target: 'world'
  });
}

function reportSkin(skin: SkinFacts, context: RuleContext): void {
  const mirrored: string[] = [];
  let worst = 0;
  for (let j = 0; j < skin.inverseBindDeterminants.length; j++) {
    const determinant = skin.inverseBindDeterminants[j];
    if (!(determinant < 0)) continue;
    mirrored.push(skin.jointPaths[j] ?? `joint ${j}`);
    if (determinant < worst) worst = determinant;
  }
  if (mirrored.length === 0) return;
  const listed = mirrored.slice(0, LISTED_JOINTS).join(', ');
  const more = mirrored.length > LISTED_JOINTS ? ` and ${mirrored.length - LISTED_JOINTS} more` : '';
  const name = skin.name === '' ? `#${skin.skinIndex}` : `"${skin.name}"`;
  context.emit({
    animation: null,
    channel: null,
    node: mirrored[0],
    keys: null,
    time: null,
    values: {
      skin: skin.name,
      mirroredJoints: mirrored.length,
      joints: skin.jointPaths.length,
      worstDeterminant: worst
    },
    message:
      `Skin ${name} has ${plural(mirrored.length, 'inverse bind matrix', 'inverse bind matrices')} that mirror space ` +
      `(determinant down to ${formatNumber(worst, 3)}): ${listed}${more}. The bind pose of these joints is a mirror, ` +
      'not a rotation, so tools that read joint orientations from the bind pose (retargeting, IK, physics) get ' +
      'them wrong.',
    hint:
      'Rebind the skin with joints that carry no negative scale, or mirror the mesh data itself instead of the ' +
      'joints.',
    target: `skin:${skin.skinIndex}`
  });
}

function parentPathOf(nodePath: string): string {
  const cut = nodePath.lastIndexOf('/');
  return cut <= 0 ? '' : nodePath.slice(0, cut);
}

function plural(count: number, one: string, many: string): string {
  return `${count} ${count === 1 ? one : many}`;
}
