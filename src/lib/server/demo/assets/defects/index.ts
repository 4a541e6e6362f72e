/**
 * Every defect injector, and the rule each one is built to trip. The demo's build plan and
 * the tests both read {@link DEFECT_RULES}, so a defect and its expected finding never drift apart.
 */
import type { Document } from '@gltf-transform/core';
import type { RuleId } from '$lib/lint/rule-ids';
import { bakeZUpCorrection } from './bake-z-up-correction';
import { breakKeyTimes } from './break-key-times';
import { clipBasisOffset } from './clip-basis-offset';
import { driftLength } from './drift-length';
import { flipHemisphere } from './flip-hemisphere';
import { gimbalFlipBake } from './gimbal-flip-bake';
import { insertAntipodal } from './insert-antipodal';
import { mirrorScale } from './mirror-scale';
import { nanKey } from './nan-key';
import { quantizeRotations } from './quantize-rotations';
import { redundantKeys } from './redundant-keys';
import { wideArc } from './wide-arc';

export { bakeZUpCorrection, Z_UP_CORRECTION_NODE, type BakeZUpCorrectionOptions } from './bake-z-up-correction';
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

/** Every injector by name; each mutates and returns the document it is given. */
export const DEFECTS = {
  driftLength,
  flipHemisphere,
  insertAntipodal,
  wideArc,
  gimbalFlipBake,
  bakeZUpCorrection,
  clipBasisOffset,
  mirrorScale,
  breakKeyTimes,
  nanKey,
  quantizeRotations,
  redundantKeys
} as const;

/** Names of the defect injectors. */
export type DefectName = keyof typeof DEFECTS;

/** The options object of one injector. */
export type DefectOptions<Name extends DefectName> = NonNullable<Parameters<(typeof DEFECTS)[Name]>[1]>;

/**
 * The rules each defect trips under the default policy, the rule it is built for first. Some
 * defects inherently trip a second rule: a ~170° flip bake is also a wide arc, and an antipodal
 * pair also changes hemisphere. Empty for encodings that are valid and must pass clean.
 */
export const DEFECT_RULES: Readonly<Record<DefectName, readonly RuleId[]>> = {
  driftLength: ['unit-drift'],
  flipHemisphere: ['hemisphere-jump'],
  insertAntipodal: ['antipodal-keys', 'hemisphere-jump'],
  wideArc: ['wide-arc'],
  gimbalFlipBake: ['spin-spike', 'wide-arc'],
  bakeZUpCorrection: ['baked-basis'],
  clipBasisOffset: ['clip-basis-offset'],
  mirrorScale: ['mirrored-basis'],
  breakKeyTimes: ['key-times'],
  nanKey: ['not-a-rotation'],
  quantizeRotations: [],
  redundantKeys: ['redundant-keys']
};

/** One defect with its options, applied later to a freshly generated document. */
export interface DefectStep {
  name: DefectName;
  /** Rules this step trips: {@link DEFECT_RULES} for the defect plus any the target channel adds. */
  rules: readonly RuleId[];
  apply(document: Document): Document;
}

/**
 * Binds a defect to its options, e.g. `defectStep('flipHemisphere', { animation: 'Swim', node: 'Hips', fromKey: 12 })`.
 * Build plans hold steps rather than documents so nothing is generated until a build's assets are asked for.
 * @param alsoTrips rules the chosen channel adds, e.g. `spline-dip` for a hemisphere flip on a CUBICSPLINE channel.
 */
export function defectStep<Name extends DefectName>(
  name: Name,
  options: DefectOptions<Name>,
  alsoTrips: readonly RuleId[] = []
): DefectStep {
  const inject = DEFECTS[name] as (document: Document, options: DefectOptions<Name>) => Document;
  return { name, rules: [...DEFECT_RULES[name], ...alsoTrips], apply: (document) => inject(document, options) };
}
