/**
 * baked-basis: a scene root or root joint whose rest rotation is an exact quarter or half turn
 * about X, Y or Z (within convention.basisToleranceDegrees), when the policy requires glTF's own
 * basis (convention.requireGltfBasis). Such a node holds a basis conversion instead of the data
 * having been converted: −90° about X is the usual Z-up → Y-up correction. Engines that strip or
 * re-root the top node, root-motion extraction and retargeting then see the content lying on its
 * side or facing backwards, and clips authored for the uncorrected rig disagree with it.
 * Scene roots stored as `matrix` are checked through their world matrix; root joints need TRS.
 * Source: glTF 2.0 §3.4 (right-handed, +Y up, front faces +Z); common practice (exporter axis conversion).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { AssetFacts } from '../read/node-facts';
import type { AssetRule, RuleContext } from './rule';
import { findPrincipalTurn } from '../math/principal-turn';
import { quatFromMatrix } from '../math/quat-from-matrix';
import { formatDegrees, formatQuaternion } from './format-number';
import { describeTurn, describeTurnCause } from './describe-turn';

export const bakedBasis: AssetRule = {
  id: 'baked-basis',
  defaultSeverity: 'warning',
  scope: 'asset',
  title: 'A root node carries a basis conversion (quarter or half turn)',
  rationale:
    'glTF content is +Y up and faces +Z. A root that turns everything below it by a quarter or half turn about a ' +
    'principal axis means the data was never converted, only wrapped. Engines that strip or re-root the top node, ' +
    'root motion and retargeting then get content lying on its side or facing backwards.',
  source: 'glTF 2.0 §3.4 (coordinate system); common practice (exporter axis conversion)',
  check: checkBakedBasis
};

function checkBakedBasis(facts: AssetFacts, _channels: readonly RotationChannel[], context: RuleContext): void {
  const convention = context.policy.convention;
  if (!convention.requireGltfBasis) return;
  for (const node of facts.nodes) {
    if (!node.isSceneRoot && !node.isRootJoint) continue;
    const rotation = node.rotation ?? (node.isSceneRoot ? quatFromMatrix(node.worldMatrix) : null);
    if (rotation === null) continue;
    const match = findPrincipalTurn(
      rotation[0],
      rotation[1],
      rotation[2],
      rotation[3],
      convention.basisToleranceDegrees
    );
    if (match === null) continue;
    const turn = match.turn;
    const role = node.isSceneRoot ? 'scene root' : 'root joint';
    context.emit({
      animation: null,
      channel: null,
      node: node.nodePath,
      keys: null,
      time: null,
      values: {
        axis: turn.axis,
        angleDegrees: turn.angleDegrees,
        deviationDegrees: match.deviationDegrees,
        rotation: formatQuaternion(rotation)
      },
      message:
        `The ${role} ${node.nodePath} turns everything below it ${describeTurn(turn)} (rest rotation ` +
        `${formatQuaternion(rotation)}${match.deviationDegrees > 0.001 ? `, within ${formatDegrees(match.deviationDegrees)}` : ''}), ` +
        `which looks like ${describeTurnCause(turn)}. glTF content is +Y up and faces +Z, so the data itself was never ` +
        'converted: engines that strip or re-root the top node, root motion and retargeting see it lying on its ' +
        'side or facing the wrong way.',
      hint:
        'Run `orientry fix <file> -o <fixed file> --rules baked-basis` (remove baked basis): it folds the turn into ' +
        'the content, keys and inverse bind matrices and leaves this node without it. Or export with the ' +
        'tool\u2019s Y-up conversion applied to the data rather than added as a parent rotation.',
      target: 'rest'
    });
  }
}
