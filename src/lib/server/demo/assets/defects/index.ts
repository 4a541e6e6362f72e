/**
 * Every defect injector, and the rule each one is built to trip. The demo's build plan and
 * the tests both read {@link DEFECT_RULES}, so a defect and its expected finding never drift apart.
 */
import type { RuleId } from '$lib/lint/rule-ids';

export { bakeZUpCorrection, Z_UP_CORRECTION_NODE } from './bake-z-up-correction';
export { breakKeyTimes, type BreakKeyTimesOptions } from './break-key-times';
export { clipBasisOffset, type ClipBasisOffsetOptions } from './clip-basis-offset';
export { driftLength, type DriftLengthOptions } from './drift-length';
export { flipHemisphere, type FlipHemisphereOptions } from './flip-hemisphere';
export { gimbalFlipBake, type GimbalFlipBakeOptions } from './gimbal-flip-bake';
export { insertAntipodal, type InsertAntipodalOptions } from './insert-antipodal';
export { mirrorScale, type MirrorScaleOptions } from './mirror-scale';
export { nanKey, type NanKeyOptions } from './nan-key';
export { quantizeRotations, type QuantizeRotationsOptions } from './quantize-rotations';
export { redundantKeys, type RedundantKeysOptions } from './redundant-keys';
export { wideArc, type WideArcOptions } from './wide-arc';
export type { RotationTarget } from './rotation-track';

/** Names of the defect injectors. */
export type DefectName =
  | 'driftLength'
  | 'flipHemisphere'
  | 'insertAntipodal'
  | 'wideArc'
  | 'gimbalFlipBake'
  | 'bakeZUpCorrection'
  | 'clipBasisOffset'
  | 'mirrorScale'
  | 'breakKeyTimes'
  | 'nanKey'
  | 'quantizeRotations'
  | 'redundantKeys';

/** The rule each defect trips; `null` for encodings that are valid and must pass clean. */
export const DEFECT_RULES: Readonly<Record<DefectName, RuleId | null>> = {
  driftLength: 'unit-drift',
  flipHemisphere: 'hemisphere-jump',
  insertAntipodal: 'antipodal-keys',
  wideArc: 'wide-arc',
  gimbalFlipBake: 'spin-spike',
  bakeZUpCorrection: 'baked-basis',
  clipBasisOffset: 'clip-basis-offset',
  mirrorScale: 'mirrored-basis',
  breakKeyTimes: 'key-times',
  nanKey: 'not-a-rotation',
  quantizeRotations: null,
  redundantKeys: 'redundant-keys'
};
