/**
 * Labels and one-line help for the policy form, keyed by the field's dotted path in the policy
 * schema. The schema decides which fields exist, their limits, choices and defaults; this only
 * words them. A field added to the schema without an entry still shows, with a label made from
 * its name.
 */

/** A field's words. `unit` follows the input (`°`, `°/s`). */
export interface PolicyFieldText {
  label: string;
  help?: string;
  unit?: string;
}

/** Section titles and sentences, keyed by the top-level policy key (`thresholds` gathers the loose numbers). */
export const POLICY_GROUP_TEXT: Record<string, { title: string; description?: string }> = {
  tolerances: { title: 'Tolerances', description: 'How far a quaternion may stray before a rule speaks.' },
  thresholds: { title: 'Motion thresholds', description: 'Limits on how keys move from one to the next.' },
  convention: { title: 'Basis convention', description: 'What counts as a baked basis correction.' },
  engine: { title: 'Target engine', description: 'How the engine that imports the assets stores rotations.' },
  rules: {
    title: 'Rule severities',
    description: 'Raise, lower or switch off single rules; “Default” keeps the rule’s own severity.'
  },
  gate: { title: 'CI gate', description: 'Which findings fail a build.' },
  assets: { title: 'Assets', description: 'Which files in a build are linted (picomatch globs, one per line).' }
};

export const POLICY_FIELD_TEXT: Record<string, PolicyFieldText> = {
  'tolerances.unitWarning': {
    label: 'Unit length: warning above',
    help: '|length − 1| past this warns (unit-drift); 0.001 is about a 0.2% scale.'
  },
  'tolerances.unitError': {
    label: 'Unit length: error above',
    help: '|length − 1| past this is an error; at least the warning value.'
  },
  'tolerances.zeroLength': { label: 'Zero length below', help: 'Shorter than this is no rotation at all.' },
  'tolerances.antipodal': {
    label: 'Antipodal distance',
    help: 'Largest 4D distance between a key and the negated previous key.'
  },
  'tolerances.redundantDegrees': {
    label: 'Redundant key angle',
    help: 'A key within this of what interpolation gives is redundant.',
    unit: '°'
  },
  wideArcDegrees: {
    label: 'Wide arc above',
    help: 'Rotation between consecutive keys that raises wide-arc.',
    unit: '°'
  },
  maxSpeedDegreesPerSecond: {
    label: 'Spin speed ceiling',
    help: 'Angular speed above which spin-spike looks closer.',
    unit: '°/s'
  },
  spinSpikeMedianFactor: {
    label: 'Spike over median',
    help: 'A spike must also beat the channel’s median speed by this factor.',
    unit: '×'
  },
  splineMinLength: {
    label: 'Spline minimum length',
    help: 'An un-normalised CUBICSPLINE curve shorter than this between keys dips.'
  },
  'convention.requireGltfBasis': {
    label: 'Require glTF basis',
    help: 'Assets are authored right-handed, +Y up, front +Z (glTF 2.0 §3.4).'
  },
  'convention.basisToleranceDegrees': {
    label: 'Baked basis tolerance',
    help: 'How close a root’s rest rotation must be to a quarter or half turn.',
    unit: '°'
  },
  'convention.clipOffsetToleranceDegrees': {
    label: 'Clip offset tolerance',
    help: 'How far root keys may stray from a quarter or half turn off rest.',
    unit: '°'
  },
  'engine.rotationStorage': { label: 'Rotation storage', help: 'Euler engines also get gimbal-proximity.' },
  'engine.eulerOrder': { label: 'Euler order', help: 'Intrinsic order, as three.js names it.' },
  'engine.gimbalMarginDegrees': {
    label: 'Gimbal margin',
    help: 'Keys whose middle angle lies this close to ±90° are flagged.',
    unit: '°'
  },
  'gate.failOn': { label: 'Fail on', help: 'The lowest severity that fails the gate.' },
  'gate.scope': { label: 'Judge', help: '“new”: only findings the baseline did not have fail.' },
  include: { label: 'Include', help: 'Empty: every asset.' },
  exclude: { label: 'Exclude', help: 'Skipped even when included.' }
};

/** Words for choices that are not self-explanatory. */
export const POLICY_CHOICE_TEXT: Record<string, string> = {
  new: 'new findings only',
  all: 'all findings',
  quaternion: 'quaternion',
  euler: 'Euler angles',
  off: 'Off'
};

/** A label from a schema key when the table has none: `clipOffsetToleranceDegrees` → `Clip offset tolerance degrees`. */
export function labelFromKey(key: string): string {
  const words = key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
  return words.charAt(0).toUpperCase() + words.slice(1);
}
