/**
 * The story of the demo, as data: who pushed what to which branch on which day of the last
 * month, and which defect rode along. Read top to bottom it is a month at Lanternfish
 * Interactive: clean-ish starts with a couple of standing warnings, feature branches that break
 * the gate and get fixed, a drift that creeps onto main and is gone two builds later.
 */
import type { DemoAssetKey } from './demo-asset-catalog';
import type { DemoAuthorHandle, DemoProjectSlug } from './demo-projects';
import { defectStep, type DefectStep } from './defects';

/** One asset as a build ships it: a revision of a catalog asset plus any defects it carries. */
export interface TimelineAsset {
  key: DemoAssetKey;
  revision: number;
  defects: DefectStep[];
}

/** One build in the story. */
export interface TimelineEntry {
  project: DemoProjectSlug;
  /** `main`, or the project's feature branch. */
  branch: 'main' | 'feature';
  /** Day of the 30-day window (0 = oldest). */
  day: number;
  /** Hour of that day, UTC, fractional (13.5 = 13:30). */
  hour: number;
  author: DemoAuthorHandle;
  /** Whether the build has error findings under its project's demo policy (so a fail-on-error gate stops it). */
  hasErrors: boolean;
  commitMessage: string;
  /** What the build shows a visitor, in one sentence. */
  story: string;
  assets: TimelineAsset[];
}

const asset = (key: DemoAssetKey, revision: number, ...defects: DefectStep[]): TimelineAsset => ({
  key,
  revision,
  defects
});

// Standing issues that stay until a later build fixes them.
const keeperIdleDrift = defectStep('driftLength', { animation: 'Idle', node: 'Head', factor: 1.003 });
const wardenWaveRedundant = defectStep('redundantKeys', { animation: 'Wave', node: 'Hand.R', afterKey: 10, count: 5 });
const wardenIdleDrift = defectStep('driftLength', {
  animation: 'Idle',
  node: 'Spine',
  factor: 1.02,
  fromKey: 40,
  toKey: 70
});
const buoyClapperRedundant = defectStep('redundantKeys', {
  animation: 'Swell',
  node: 'Bell Clapper',
  afterKey: 20,
  count: 6
});
const buoySwellDrift = defectStep('driftLength', { animation: 'Swell', node: 'Tide Buoy', factor: 1.003 });
const swimArmFlip = defectStep('flipHemisphere', { animation: 'Swim', node: 'UpperArm.L', fromKey: 31 });
const zUpCorrection = defectStep('bakeZUpCorrection', {});
const lampRotorReduced = defectStep('wideArc', { animation: 'Beacon', node: 'Lamp Rotor', fromKey: 30 });
const craneTiltFlip = defectStep('gimbalFlipBake', { animation: 'Shot 010', node: 'Tilt', keyIndex: 70 });

/** The demo's builds, oldest first. */
export const DEMO_TIMELINE: readonly TimelineEntry[] = [
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 0, hour: 10.2, hasErrors: false, author: 'tomasz',
    commitMessage: 'Import Kelp Diver, Harbor Warden and Lamp Keeper rigs',
    story: 'First build: clean apart from a slight length drift on the Lamp Keeper idle and a few redundant keys on the Harbor Warden wave.',
    assets: [asset('kelp-diver', 1), asset('harbor-warden', 1, wardenWaveRedundant), asset('lamp-keeper', 1, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'main', day: 1, hour: 11.5, hasErrors: false, author: 'priya',
    commitMessage: 'Add lighthouse lamp, dock windlass and tide buoy',
    story: 'Props start clean; the buoy bell clapper carries a few redundant keys.',
    assets: [asset('lighthouse-lamp', 1), asset('dock-windlass', 1), asset('tide-buoy', 1, buoyClapperRedundant)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 2, hour: 9.75, hasErrors: false, author: 'juno',
    commitMessage: 'Harbor Warden idle: calmer breathing',
    story: 'A routine re-export; the standing warnings are unchanged.',
    assets: [asset('kelp-diver', 1), asset('harbor-warden', 2, wardenWaveRedundant), asset('lamp-keeper', 1, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'main', day: 2, hour: 15.1, hasErrors: false, author: 'priya',
    commitMessage: 'Layout cams for the harbor intro',
    story: 'Three camera rigs for the intro, all clean.',
    assets: [asset('dock-crane-cam', 1), asset('lighthouse-orbit-cam', 1), asset('kelp-dolly-cam', 1)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'main', day: 3, hour: 14.4, hasErrors: false, author: 'kaito',
    commitMessage: 'Windlass: slower haul',
    story: 'The windlass haul is retimed; nothing new to report.',
    assets: [asset('lighthouse-lamp', 1), asset('dock-windlass', 2), asset('tide-buoy', 1, buoyClapperRedundant)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'feature', day: 4, hour: 16.3, hasErrors: true, author: 'juno',
    commitMessage: 'Kelp Diver: new crawl swim cycle (first pass)',
    story: 'The new swim arrives from a Z-up scene with a baked correction node, and the left arm flips hemisphere mid-stroke: the gate fails.',
    assets: [asset('kelp-diver', 2, swimArmFlip, zUpCorrection), asset('harbor-warden', 2, wardenWaveRedundant), asset('lamp-keeper', 1, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 5, hour: 10.9, hasErrors: false, author: 'tomasz',
    commitMessage: 'Harbor Warden wave: softer follow-through',
    story: 'Main moves on while the feature branch is red.',
    assets: [asset('kelp-diver', 1), asset('harbor-warden', 3, wardenWaveRedundant), asset('lamp-keeper', 1, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'main', day: 5, hour: 13.2, hasErrors: false, author: 'lesedi',
    commitMessage: 'Crane cam: wider sweep for shot 010',
    story: 'A wider crane sweep, still clean.',
    assets: [asset('dock-crane-cam', 2), asset('lighthouse-orbit-cam', 1), asset('kelp-dolly-cam', 1)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'feature', day: 6, hour: 11.1, hasErrors: true, author: 'juno',
    commitMessage: 'Swim: re-export from a Y-up scene',
    story: 'The Z-up correction node is gone; the hemisphere flip in the left arm is still there.',
    assets: [asset('kelp-diver', 3, swimArmFlip), asset('harbor-warden', 3, wardenWaveRedundant), asset('lamp-keeper', 1, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'feature', day: 6, hour: 15.8, hasErrors: true, author: 'priya',
    commitMessage: 'Lamp rework: bake the rotor every frame, run key reduction',
    story: 'Key reduction leaves a 170 degree step in the lamp rotor: a wide arc.',
    assets: [asset('lighthouse-lamp', 2, lampRotorReduced), asset('dock-windlass', 2), asset('tide-buoy', 1, buoyClapperRedundant)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'feature', day: 7, hour: 9.6, hasErrors: false, author: 'juno',
    commitMessage: 'Swim: keep quaternion signs continuous on export',
    story: 'Both swim defects are fixed; the branch is green again.',
    assets: [asset('kelp-diver', 3), asset('harbor-warden', 3, wardenWaveRedundant), asset('lamp-keeper', 1, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'feature', day: 7, hour: 17.2, hasErrors: true, author: 'priya',
    commitMessage: 'Lamp rework: lever snaps with STEP keys',
    story: 'The new lever keys include a NaN key from normalising a zero quaternion; the rotor wide arc remains.',
    assets: [asset('lighthouse-lamp', 2, lampRotorReduced, defectStep('nanKey', { animation: 'Beacon', node: 'Lamp Switch', keyIndex: 1 })), asset('dock-windlass', 2), asset('tide-buoy', 1, buoyClapperRedundant)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 8, hour: 14.0, hasErrors: false, author: 'tomasz',
    commitMessage: 'Merge feature/new-swim-cycle: crawl swim for Kelp Diver',
    story: 'The fixed crawl swim lands on main.',
    assets: [asset('kelp-diver', 3), asset('harbor-warden', 3, wardenWaveRedundant), asset('lamp-keeper', 1, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'feature', day: 8, hour: 16.6, hasErrors: false, author: 'priya',
    commitMessage: 'Lamp rework: no key reduction on the rotor; fix lever keys',
    story: 'Both lamp defects are fixed.',
    assets: [asset('lighthouse-lamp', 2), asset('dock-windlass', 2), asset('tide-buoy', 1, buoyClapperRedundant)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'main', day: 9, hour: 10.4, hasErrors: false, author: 'kaito',
    commitMessage: 'Add a quantized LOD of the tide buoy',
    story: 'A quantized copy of the buoy (normalized SHORT rotations) passes without findings.',
    assets: [asset('lighthouse-lamp', 1), asset('dock-windlass', 2), asset('tide-buoy', 1, buoyClapperRedundant), asset('tide-buoy-lod1', 1)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'feature', day: 9, hour: 15.3, hasErrors: true, author: 'lesedi',
    commitMessage: 'Storm sequence: overhead crane move baked from Euler curves',
    story: 'The Euler bake flips through gimbal lock for four frames: two half-turn spin spikes in the crane tilt.',
    assets: [asset('dock-crane-cam', 3, craneTiltFlip), asset('lighthouse-orbit-cam', 1), asset('kelp-dolly-cam', 1)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 10, hour: 11.7, hasErrors: true, author: 'juno',
    commitMessage: 'Lamp Keeper wave retargeted from Harbor Warden',
    story: 'The retarget leaves an antipodal key pair in the forearm.',
    assets: [asset('kelp-diver', 3), asset('harbor-warden', 3, wardenWaveRedundant), asset('lamp-keeper', 2, keeperIdleDrift, defectStep('insertAntipodal', { animation: 'Wave', node: 'Forearm.R', keyIndex: 20 }))] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'feature', day: 10, hour: 16.9, hasErrors: true, author: 'lesedi',
    commitMessage: 'Storm: orbit cam over the lighthouse',
    story: 'The orbit cam is reworked; the crane spin spikes are still there.',
    assets: [asset('dock-crane-cam', 3, craneTiltFlip), asset('lighthouse-orbit-cam', 2), asset('kelp-dolly-cam', 1)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 11, hour: 10.1, hasErrors: false, author: 'juno',
    commitMessage: 'Fix retargeted wave keys',
    story: 'The antipodal pair is gone.',
    assets: [asset('kelp-diver', 3), asset('harbor-warden', 3, wardenWaveRedundant), asset('lamp-keeper', 3, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'feature', day: 11, hour: 14.6, hasErrors: false, author: 'lesedi',
    commitMessage: 'Storm: rebake the crane with quaternion curves',
    story: 'Rebaked without Euler curves, the crane move is clean.',
    assets: [asset('dock-crane-cam', 4), asset('lighthouse-orbit-cam', 2), asset('kelp-dolly-cam', 1)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'feature', day: 12, hour: 13.3, hasErrors: true, author: 'kaito',
    commitMessage: 'Windlass: merge two haul takes',
    story: 'Splicing two takes repeats a key time in the drum channel: broken key times.',
    assets: [asset('lighthouse-lamp', 2), asset('dock-windlass', 3, defectStep('breakKeyTimes', { animation: 'Haul', node: 'Drum', keyIndex: 45 })), asset('tide-buoy', 1, buoyClapperRedundant)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'feature', day: 13, hour: 15.5, hasErrors: true, author: 'juno',
    commitMessage: 'Tread water: eggbeater kick as a spline clip',
    story: 'The spline clip flips hemisphere in the left thigh; on CUBICSPLINE that is an error, and the curve sags.',
    assets: [asset('kelp-diver', 4, defectStep('flipHemisphere', { animation: 'Tread', node: 'Thigh.L', fromKey: 5 }, ['spline-dip'])), asset('harbor-warden', 3, wardenWaveRedundant), asset('lamp-keeper', 3, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'feature', day: 13, hour: 17.0, hasErrors: false, author: 'kaito',
    commitMessage: 'Windlass: resample the haul to a clean 30 fps grid',
    story: 'Key times are strictly increasing again.',
    assets: [asset('lighthouse-lamp', 2), asset('dock-windlass', 3), asset('tide-buoy', 1, buoyClapperRedundant)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'feature', day: 14, hour: 10.8, hasErrors: false, author: 'juno',
    commitMessage: 'Tread: fix spline key signs',
    story: 'The tread clip is clean.',
    assets: [asset('kelp-diver', 4), asset('harbor-warden', 3, wardenWaveRedundant), asset('lamp-keeper', 3, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'main', day: 14, hour: 12.2, hasErrors: false, author: 'priya',
    commitMessage: 'Kelp dolly cam: slower push-in',
    story: 'A slower dolly, still clean.',
    assets: [asset('dock-crane-cam', 2), asset('lighthouse-orbit-cam', 1), asset('kelp-dolly-cam', 2)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'main', day: 15, hour: 11.0, hasErrors: false, author: 'priya',
    commitMessage: 'Merge feature/lamp-rework',
    story: 'The reworked lamp and the resampled windlass land on main, clean.',
    assets: [asset('lighthouse-lamp', 2), asset('dock-windlass', 3), asset('tide-buoy', 1, buoyClapperRedundant), asset('tide-buoy-lod1', 1)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 16, hour: 9.9, hasErrors: true, author: 'tomasz',
    commitMessage: 'Harbor Warden: new idle variation',
    story: 'A drift creeps into the Harbor Warden idle spine on main: about 2% too long, an error.',
    assets: [asset('kelp-diver', 3), asset('harbor-warden', 4, wardenWaveRedundant, wardenIdleDrift), asset('lamp-keeper', 3, keeperIdleDrift)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'feature', day: 17, hour: 11.4, hasErrors: true, author: 'lesedi',
    commitMessage: 'Storm: mirror the dolly rig for the reverse angle',
    story: 'A scale of -1 on the dolly rig flips its handedness: mirrored basis.',
    assets: [asset('dock-crane-cam', 4), asset('lighthouse-orbit-cam', 2), asset('kelp-dolly-cam', 2, defectStep('mirrorScale', { node: 'Kelp Dolly Cam Rig' }))] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 17, hour: 15.2, hasErrors: true, author: 'kaito',
    commitMessage: 'Add the Net Mender character',
    story: "The Net Mender's idle clip has a -90 degree basis offset baked into its hips; the Warden drift is still there.",
    assets: [asset('kelp-diver', 3), asset('harbor-warden', 4, wardenWaveRedundant, wardenIdleDrift), asset('lamp-keeper', 3, keeperIdleDrift), asset('net-mender', 1, defectStep('clipBasisOffset', { animation: 'Idle', node: 'Hips' }))] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'main', day: 18, hour: 14.7, hasErrors: false, author: 'kaito',
    commitMessage: 'Buoy: heavier swell',
    story: 'The heavier swell re-export drifts slightly in length: a unit-drift warning.',
    assets: [asset('lighthouse-lamp', 2), asset('dock-windlass', 3), asset('tide-buoy', 2, buoyClapperRedundant, buoySwellDrift), asset('tide-buoy-lod1', 1)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'feature', day: 18, hour: 16.1, hasErrors: false, author: 'lesedi',
    commitMessage: 'Storm: reverse angle as its own rig, no mirroring',
    story: 'The mirrored basis is gone.',
    assets: [asset('dock-crane-cam', 4), asset('lighthouse-orbit-cam', 2), asset('kelp-dolly-cam', 3)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 19, hour: 10.5, hasErrors: false, author: 'tomasz',
    commitMessage: 'Renormalize Harbor Warden idle on export; fix Net Mender idle basis',
    story: 'Two builds after it crept in, the Warden drift is fixed, along with the Net Mender basis offset.',
    assets: [asset('kelp-diver', 3), asset('harbor-warden', 5, wardenWaveRedundant), asset('lamp-keeper', 3, keeperIdleDrift), asset('net-mender', 2)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'main', day: 20, hour: 13.8, hasErrors: false, author: 'priya',
    commitMessage: 'Merge feature/storm-sequence',
    story: 'The storm cameras land on main, clean.',
    assets: [asset('dock-crane-cam', 4), asset('lighthouse-orbit-cam', 2), asset('kelp-dolly-cam', 3)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'feature', day: 21, hour: 14.3, hasErrors: true, author: 'juno',
    commitMessage: 'Net Mender: mirrored boathook for the left-hand pose',
    story: 'Mirroring the boathook with a negative scale flips its handedness.',
    assets: [asset('kelp-diver', 4), asset('harbor-warden', 5, wardenWaveRedundant), asset('lamp-keeper', 3, keeperIdleDrift), asset('net-mender', 2, defectStep('mirrorScale', { node: 'Boathook' }))] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'feature', day: 22, hour: 11.2, hasErrors: false, author: 'juno',
    commitMessage: 'Net Mender: author the left-hand boathook instead of mirroring',
    story: 'The mirrored basis is gone.',
    assets: [asset('kelp-diver', 4), asset('harbor-warden', 5, wardenWaveRedundant), asset('lamp-keeper', 3, keeperIdleDrift), asset('net-mender', 3)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'main', day: 23, hour: 10.6, hasErrors: true, author: 'lesedi',
    commitMessage: 'Orbit cam retimed to 8 s',
    story: 'The retime tool writes one orbit key from the opposite hemisphere: an antipodal pair.',
    assets: [asset('dock-crane-cam', 4), asset('lighthouse-orbit-cam', 3, defectStep('insertAntipodal', { animation: 'Shot 020', node: 'Orbit Pivot', keyIndex: 50 })), asset('kelp-dolly-cam', 3)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'main', day: 23, hour: 15.9, hasErrors: false, author: 'priya',
    commitMessage: 'Lighthouse lamp: faster storm-night turn',
    story: 'A faster lamp turn; the buoy drift warning is still open.',
    assets: [asset('lighthouse-lamp', 3), asset('dock-windlass', 3), asset('tide-buoy', 2, buoyClapperRedundant, buoySwellDrift), asset('tide-buoy-lod1', 1)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 24, hour: 9.4, hasErrors: false, author: 'tomasz',
    commitMessage: 'Renormalize Lamp Keeper idle',
    story: 'The standing Lamp Keeper drift warning is finally fixed.',
    assets: [asset('kelp-diver', 3), asset('harbor-warden', 5, wardenWaveRedundant), asset('lamp-keeper', 4), asset('net-mender', 2)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'main', day: 25, hour: 11.9, hasErrors: false, author: 'lesedi',
    commitMessage: 'Fix orbit retime keys',
    story: 'The antipodal pair is gone.',
    assets: [asset('dock-crane-cam', 4), asset('lighthouse-orbit-cam', 4), asset('kelp-dolly-cam', 3)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'main', day: 26, hour: 10.3, hasErrors: false, author: 'kaito',
    commitMessage: 'Buoy: renormalize the swell',
    story: 'The buoy drift is fixed; only the redundant clapper keys remain.',
    assets: [asset('lighthouse-lamp', 3), asset('dock-windlass', 3), asset('tide-buoy', 3, buoyClapperRedundant), asset('tide-buoy-lod1', 1)] },
  // prettier-ignore
  { project: 'tidewatch-characters', branch: 'main', day: 27, hour: 14.1, hasErrors: false, author: 'tomasz',
    commitMessage: 'Merge tread water and the left-hand boathook',
    story: 'The spline tread and the new boathook land on main.',
    assets: [asset('kelp-diver', 4), asset('harbor-warden', 5, wardenWaveRedundant), asset('lamp-keeper', 4), asset('net-mender', 3)] },
  // prettier-ignore
  { project: 'tidewatch-props', branch: 'feature', day: 28, hour: 12.5, hasErrors: false, author: 'priya',
    commitMessage: 'Lamp: storm-night flicker pass',
    story: 'Follow-up work on the lamp branch, clean.',
    assets: [asset('lighthouse-lamp', 4), asset('dock-windlass', 3), asset('tide-buoy', 3, buoyClapperRedundant), asset('tide-buoy-lod1', 1)] },
  // prettier-ignore
  { project: 'tidewatch-cinematics', branch: 'main', day: 29, hour: 9.8, hasErrors: false, author: 'priya',
    commitMessage: 'Lock intro cams for review',
    story: 'The intro cameras are locked for review, clean.',
    assets: [asset('dock-crane-cam', 5), asset('lighthouse-orbit-cam', 4), asset('kelp-dolly-cam', 3)] }
];
