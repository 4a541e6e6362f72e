/**
 * The animation clips of a humanoid character: Idle, Swim and Wave baked at 30 fps with LINEAR
 * rotation channels, and Tread as a CUBICSPLINE clip with exact tangents. Every curve loops
 * over its clip (frequencies are whole multiples of 1/duration), as a game cycle must.
 */
import type { Document } from '@gltf-transform/core';
import { addSampledClip, rotationTrack } from './animation-clip';
import type { HumanoidJoint, HumanoidRig } from './humanoid-rig';
import type { AngleCurve } from './rotation-curve';

/** Keys per second for the LINEAR bakes (the studio's game frame rate). */
export const CHARACTER_FRAMES_PER_SECOND = 30;

/** Options for {@link addHumanoidClips}. */
export interface HumanoidClipOptions {
  /** Scales every swing (1 = as authored); characters differ a little in temperament. */
  amplitudeScale?: number;
  /**
   * `breaststroke`: arms sweep and return. `crawl`: arms windmill a full turn per cycle (keys
   * still 6° apart, but the channel covers 360°, which makes it the natural place for arc defects).
   */
  swimStyle?: 'breaststroke' | 'crawl';
}

/** Sway amplitude and rate: 2 Hz loops in every clip length used here (2 s and 3 s). */
const SWAY_DEGREES = 1.2;
const SWAY_HZ = 2;

type MotionTable = Partial<Record<HumanoidJoint, AngleCurve[]>>;

// prettier-ignore
const IDLE: MotionTable = {
  Hips: [{ axis: 'y', amplitudeDegrees: 3, frequencyHz: 1 / 3 }, { axis: 'x', amplitudeDegrees: 1.5, frequencyHz: 1 / 3, phaseTurns: 0.25 }],
  Spine: [{ axis: 'x', offsetDegrees: 2, amplitudeDegrees: 2.5, frequencyHz: 2 / 3 }, { axis: 'z', amplitudeDegrees: 1.5, frequencyHz: 1 / 3, phaseTurns: 0.1 }],
  Neck: [{ axis: 'y', amplitudeDegrees: 6, frequencyHz: 1 / 3, phaseTurns: 0.1 }, { axis: 'x', amplitudeDegrees: 2, frequencyHz: 2 / 3 }],
  Head: [{ axis: 'y', amplitudeDegrees: 10, frequencyHz: 1 / 3, phaseTurns: 0.2 }, { axis: 'z', amplitudeDegrees: 3, frequencyHz: 2 / 3, phaseTurns: 0.3 }],
  'UpperArm.L': [{ axis: 'z', offsetDegrees: -70, amplitudeDegrees: 3, frequencyHz: 2 / 3 }, { axis: 'x', amplitudeDegrees: 4, frequencyHz: 1 / 3 }],
  'UpperArm.R': [{ axis: 'z', offsetDegrees: 70, amplitudeDegrees: 3, frequencyHz: 2 / 3, phaseTurns: 0.5 }, { axis: 'x', amplitudeDegrees: 4, frequencyHz: 1 / 3, phaseTurns: 0.5 }],
  'Forearm.L': [{ axis: 'y', offsetDegrees: 12, amplitudeDegrees: 4, frequencyHz: 2 / 3, phaseTurns: 0.2 }],
  'Forearm.R': [{ axis: 'y', offsetDegrees: -12, amplitudeDegrees: 4, frequencyHz: 2 / 3, phaseTurns: 0.7 }]
};

// prettier-ignore
const SWIM_LEGS: MotionTable = {
  'Thigh.L': [{ axis: 'x', amplitudeDegrees: 25, frequencyHz: 1 }, { axis: 'z', amplitudeDegrees: 4, frequencyHz: 0.5 }],
  'Thigh.R': [{ axis: 'x', amplitudeDegrees: 25, frequencyHz: 1, phaseTurns: 0.5 }, { axis: 'z', amplitudeDegrees: 4, frequencyHz: 0.5, phaseTurns: 0.5 }],
  'Shin.L': [{ axis: 'x', offsetDegrees: 18, amplitudeDegrees: 16, frequencyHz: 1, phaseTurns: 0.15 }],
  'Shin.R': [{ axis: 'x', offsetDegrees: 18, amplitudeDegrees: 16, frequencyHz: 1, phaseTurns: 0.65 }],
  'Foot.L': [{ axis: 'x', offsetDegrees: 35, amplitudeDegrees: 12, frequencyHz: 1, phaseTurns: 0.3 }],
  'Foot.R': [{ axis: 'x', offsetDegrees: 35, amplitudeDegrees: 12, frequencyHz: 1, phaseTurns: 0.8 }]
};

// prettier-ignore
const SWIM_BREASTSTROKE: MotionTable = {
  Hips: [{ axis: 'x', offsetDegrees: 30, amplitudeDegrees: 5, frequencyHz: 0.5 }, { axis: 'y', amplitudeDegrees: 3, frequencyHz: 0.5, phaseTurns: 0.25 }],
  Spine: [{ axis: 'x', amplitudeDegrees: 6, frequencyHz: 0.5, phaseTurns: 0.1 }],
  Neck: [{ axis: 'x', offsetDegrees: -20, amplitudeDegrees: 5, frequencyHz: 0.5, phaseTurns: 0.2 }],
  'UpperArm.L': [{ axis: 'y', amplitudeDegrees: 35, frequencyHz: 0.5, phaseTurns: 0.25 }, { axis: 'z', offsetDegrees: -10, amplitudeDegrees: 30, frequencyHz: 0.5 }],
  'UpperArm.R': [{ axis: 'y', amplitudeDegrees: -35, frequencyHz: 0.5, phaseTurns: 0.25 }, { axis: 'z', offsetDegrees: 10, amplitudeDegrees: -30, frequencyHz: 0.5 }],
  'Forearm.L': [{ axis: 'y', offsetDegrees: 20, amplitudeDegrees: 30, frequencyHz: 0.5, phaseTurns: 0.4 }],
  'Forearm.R': [{ axis: 'y', offsetDegrees: -20, amplitudeDegrees: -30, frequencyHz: 0.5, phaseTurns: 0.4 }],
  ...SWIM_LEGS
};

// The crawl windmills each arm one full turn per 2 s cycle about the body's side axis.
// prettier-ignore
const SWIM_CRAWL: MotionTable = {
  Hips: [{ axis: 'x', offsetDegrees: 30, amplitudeDegrees: 3, frequencyHz: 1 }, { axis: 'y', amplitudeDegrees: 12, frequencyHz: 0.5 }],
  Spine: [{ axis: 'y', amplitudeDegrees: -8, frequencyHz: 0.5, phaseTurns: 0.1 }],
  Neck: [{ axis: 'x', offsetDegrees: -20, amplitudeDegrees: 3, frequencyHz: 1 }, { axis: 'y', amplitudeDegrees: 20, frequencyHz: 0.5, phaseTurns: 0.6 }],
  'UpperArm.L': [{ axis: 'x', turnsPerSecond: -0.5 }, { axis: 'z', offsetDegrees: -80, amplitudeDegrees: 8, frequencyHz: 0.5 }],
  'UpperArm.R': [{ axis: 'x', offsetDegrees: 180, turnsPerSecond: -0.5 }, { axis: 'z', offsetDegrees: 80, amplitudeDegrees: 8, frequencyHz: 0.5, phaseTurns: 0.5 }],
  'Forearm.L': [{ axis: 'z', offsetDegrees: 15, amplitudeDegrees: 15, frequencyHz: 0.5, phaseTurns: 0.3 }],
  'Forearm.R': [{ axis: 'z', offsetDegrees: -15, amplitudeDegrees: 15, frequencyHz: 0.5, phaseTurns: 0.8 }],
  ...SWIM_LEGS
};

// prettier-ignore
const WAVE: MotionTable = {
  Spine: [{ axis: 'z', amplitudeDegrees: 3, frequencyHz: 0.5 }, { axis: 'x', offsetDegrees: 2, amplitudeDegrees: 1.5, frequencyHz: 1 }],
  Head: [{ axis: 'y', offsetDegrees: -15, amplitudeDegrees: 4, frequencyHz: 0.5 }, { axis: 'z', amplitudeDegrees: 5, frequencyHz: 0.5, phaseTurns: 0.25 }],
  'UpperArm.L': [{ axis: 'z', offsetDegrees: -70, amplitudeDegrees: 2, frequencyHz: 0.5 }],
  'UpperArm.R': [{ axis: 'z', offsetDegrees: -60, amplitudeDegrees: 4, frequencyHz: 0.5 }, { axis: 'y', offsetDegrees: 10, amplitudeDegrees: 3, frequencyHz: 1 }],
  'Forearm.R': [{ axis: 'z', offsetDegrees: -45, amplitudeDegrees: 25, frequencyHz: 1 }],
  'Hand.R': [{ axis: 'z', amplitudeDegrees: 15, frequencyHz: 1, phaseTurns: 0.2 }, { axis: 'x', amplitudeDegrees: 5, frequencyHz: 0.5 }]
};

// Treading water: eggbeater legs and sculling arms, keyed 4 times a second as a spline.
// prettier-ignore
const TREAD: MotionTable = {
  Hips: [{ axis: 'y', amplitudeDegrees: 10, frequencyHz: 0.5 }, { axis: 'x', offsetDegrees: 8, amplitudeDegrees: 3, frequencyHz: 1 }],
  'UpperArm.L': [{ axis: 'z', offsetDegrees: -25, amplitudeDegrees: 20, frequencyHz: 0.5 }, { axis: 'y', amplitudeDegrees: 25, frequencyHz: 0.5, phaseTurns: 0.25 }],
  'UpperArm.R': [{ axis: 'z', offsetDegrees: 25, amplitudeDegrees: -20, frequencyHz: 0.5 }, { axis: 'y', amplitudeDegrees: -25, frequencyHz: 0.5, phaseTurns: 0.25 }],
  'Thigh.L': [{ axis: 'x', offsetDegrees: 30, amplitudeDegrees: 25, frequencyHz: 1 }, { axis: 'y', amplitudeDegrees: 20, frequencyHz: 1, phaseTurns: 0.25 }],
  'Thigh.R': [{ axis: 'x', offsetDegrees: 30, amplitudeDegrees: 25, frequencyHz: 1, phaseTurns: 0.5 }, { axis: 'y', amplitudeDegrees: -20, frequencyHz: 1, phaseTurns: 0.75 }],
  'Shin.L': [{ axis: 'x', offsetDegrees: -45, amplitudeDegrees: 20, frequencyHz: 1, phaseTurns: 0.2 }],
  'Shin.R': [{ axis: 'x', offsetDegrees: -45, amplitudeDegrees: 20, frequencyHz: 1, phaseTurns: 0.7 }]
};

/** Adds Idle, Swim and Wave (LINEAR, 30 fps) and Tread (CUBICSPLINE, 4 keys per second) to a rig. */
export function addHumanoidClips(document: Document, rig: HumanoidRig, options: HumanoidClipOptions = {}): void {
  const scale = options.amplitudeScale ?? 1;
  const tracksOf = (table: MotionTable, hasSway: boolean) =>
    Object.entries(table).map(([joint, curves], trackIndex) =>
      rotationTrack(rig.joints[joint as HumanoidJoint], [
        ...curves.map((curve) => ({ ...curve, amplitudeDegrees: (curve.amplitudeDegrees ?? 0) * scale })),
        ...(hasSway ? waterSway(trackIndex) : [])
      ])
    );
  const swim = options.swimStyle === 'crawl' ? SWIM_CRAWL : SWIM_BREASTSTROKE;
  const fps = CHARACTER_FRAMES_PER_SECOND;
  addSampledClip(document, {
    name: 'Idle',
    durationSeconds: 3,
    interpolation: 'LINEAR',
    keysPerSecond: fps,
    tracks: tracksOf(IDLE, true)
  });
  addSampledClip(document, {
    name: 'Swim',
    durationSeconds: 2,
    interpolation: 'LINEAR',
    keysPerSecond: fps,
    tracks: tracksOf(swim, true)
  });
  addSampledClip(document, {
    name: 'Wave',
    durationSeconds: 2,
    interpolation: 'LINEAR',
    keysPerSecond: fps,
    tracks: tracksOf(WAVE, true)
  });
  addSampledClip(document, {
    name: 'Tread',
    durationSeconds: 2,
    interpolation: 'CUBICSPLINE',
    keysPerSecond: 4,
    tracks: tracksOf(TREAD, false)
  });
}

/**
 * A small circular sway (the current rocking the body) added to every LINEAR track. Its
 * angular acceleration never vanishes, so no 30 fps key is reproduced by its neighbours within
 * 0.01° and the bakes carry no accidental redundant keys; only the injected ones are reported.
 */
function waterSway(trackIndex: number): AngleCurve[] {
  const phaseTurns = trackIndex * 0.13;
  return [
    { axis: 'x', amplitudeDegrees: SWAY_DEGREES, frequencyHz: SWAY_HZ, phaseTurns },
    { axis: 'z', amplitudeDegrees: SWAY_DEGREES, frequencyHz: SWAY_HZ, phaseTurns: phaseTurns + 0.25 }
  ];
}
