/**
 * rotation-encoding: a rotation sampler's output must be VEC4 with float components, or with
 * normalized signed/unsigned byte or short components. Anything else is outside the spec and
 * players either reject the clip or decode it as raw integers.
 * Source: glTF 2.0 §3.11 Animations, table of accessor types per `channel.path` (rotation: VEC4;
 * float, signed byte normalized, unsigned byte normalized, signed short normalized, unsigned short
 * normalized), and §3.6.2 accessors (`normalized` is only for integer component types).
 */
import type { RotationChannel } from '../read/rotation-channel';
import type { ChannelRule, RuleContext } from './rule';
import { describeChannel, wholeChannelDraft } from './channel-draft';

/** Component types glTF 2.0 §3.11 allows for rotation output, with whether they must be normalized. */
const ALLOWED_COMPONENTS: Record<number, { name: string; isNormalized: boolean }> = {
  5126: { name: 'float', isNormalized: false },
  5120: { name: 'signed byte', isNormalized: true },
  5121: { name: 'unsigned byte', isNormalized: true },
  5122: { name: 'signed short', isNormalized: true },
  5123: { name: 'unsigned short', isNormalized: true }
};

const COMPONENT_NAMES: Record<number, string> = {
  5120: 'signed byte',
  5121: 'unsigned byte',
  5122: 'signed short',
  5123: 'unsigned short',
  5125: 'unsigned int',
  5126: 'float'
};

export const rotationEncoding: ChannelRule = {
  id: 'rotation-encoding',
  defaultSeverity: 'error',
  scope: 'channel',
  title: 'Rotation keys use an encoding the spec does not allow',
  rationale:
    'glTF allows rotation keys only as four floats or four normalized integers. Other encodings are either ' +
    'rejected or decoded as raw integers, which turns every key into a huge non-unit quaternion.',
  source: 'glTF 2.0 §3.11 Animations (accessor types per channel path); §3.6.2 Accessors',
  check: checkRotationEncoding
};

function checkRotationEncoding(channel: RotationChannel, context: RuleContext): void {
  const { outputType, componentType, normalized } = channel.raw;
  const allowed = ALLOWED_COMPONENTS[componentType];
  const problems: string[] = [];
  if (outputType !== 'VEC4') problems.push(`its output is ${outputType}, not VEC4 (x, y, z, w)`);
  if (allowed === undefined) {
    problems.push(`its components are ${componentName(componentType)}, which rotations may not use`);
  } else if (allowed.isNormalized && !normalized) {
    problems.push(
      `its ${allowed.name} components are not marked normalized, so a stored 127 reads as 127 rather than 1.0`
    );
  } else if (!allowed.isNormalized && normalized) {
    problems.push('its float components are marked normalized, which only integer components may be');
  }
  if (problems.length === 0) return;
  context.emit(
    wholeChannelDraft(channel, {
      values: { outputType, componentType, normalized },
      message:
        `${describeChannel(channel)} stores rotations in a way glTF does not allow: ${problems.join('; ')}. ` +
        'Rotation keys must be VEC4 floats, or VEC4 normalized signed/unsigned bytes or shorts (glTF 2.0 §3.11).',
      hint:
        "Re-export with float rotation keys, or with normalized signed shorts and the accessor's `normalized` flag " +
        'set.',
      target: 'rotation:encoding'
    })
  );
}

function componentName(componentType: number): string {
  const name = COMPONENT_NAMES[componentType];
  return name === undefined ? `componentType ${componentType}` : `${name} (componentType ${componentType})`;
}
