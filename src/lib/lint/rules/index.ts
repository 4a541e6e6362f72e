/**
 * Every rule, in report order (the order of RULE_IDS). `asset-unreadable` is not here: the reader
 * emits it when a file cannot be read at all.
 */
import type { Rule } from './rule';
import { keyTimes } from './key-times';
import { rotationEncoding } from './rotation-encoding';
import { notARotation } from './not-a-rotation';
import { unitDrift } from './unit-drift';
import { hemisphereJump } from './hemisphere-jump';
import { antipodalKeys } from './antipodal-keys';
import { wideArc } from './wide-arc';
import { spinSpike } from './spin-spike';
import { splineDip } from './spline-dip';
import { bakedBasis } from './baked-basis';
import { clipBasisOffset } from './clip-basis-offset';
import { mirroredBasis } from './mirrored-basis';
import { gimbalProximity } from './gimbal-proximity';
import { redundantKeys } from './redundant-keys';

export const RULES: readonly Rule[] = [
  keyTimes,
  rotationEncoding,
  notARotation,
  unitDrift,
  hemisphereJump,
  antipodalKeys,
  wideArc,
  spinSpike,
  splineDip,
  bakedBasis,
  clipBasisOffset,
  mirroredBasis,
  gimbalProximity,
  redundantKeys
];
