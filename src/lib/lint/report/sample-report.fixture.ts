/**
 * Hand-built lint reports for the report-format tests: findings written out by hand (no reader,
 * no rules), fingerprints from {@link fingerprintOf}. The scenario is the Tidewatch demo project.
 * Test support only; nothing in the product imports it.
 */
import { fingerprintOf, type Finding, type Severity } from '../finding';
import { countBySeverity, type AssetReport, type LintReport } from '../lint-report';

/** A finding with every field filled; `overrides` replaces any of them and the fingerprint follows. */
export function makeFinding(overrides: Partial<Finding> = {}): Finding {
  const base: Omit<Finding, 'fingerprint'> = {
    rule: 'hemisphere-jump',
    severity: 'warning',
    asset: 'characters/harbor-keeper.glb',
    animation: 'Walk',
    channel: 3,
    node: '/Keeper/Hips/Spine',
    keys: [11, 12],
    time: 0.4583,
    values: { dot: -0.9981, angleDegrees: 176.2 },
    message: 'Keys 11 and 12 lie in opposite hemispheres (dot -0.998).',
    hint: 'Negate key 12 and every later key so neighbours share a sign.',
    ...overrides
  };
  const fingerprint =
    overrides.fingerprint ??
    fingerprintOf({
      rule: base.rule,
      asset: base.asset,
      animation: base.animation,
      node: base.node,
      target: base.channel === null ? null : 'rotation',
      time: base.time
    });
  return { ...base, fingerprint };
}

/** An asset report around the given findings, with plausible stats. */
export function makeAsset(path: string, findings: Finding[], flags: Partial<AssetReport> = {}): AssetReport {
  return {
    path,
    byteLength: 48_212,
    unreadable: false,
    skipped: false,
    stats: { animations: 2, rotationChannels: 14, rotationKeys: 412, nodesWithRotation: 9 },
    findings: findings.map((finding) => ({ ...finding, asset: path })),
    ...flags
  };
}

/** A report over the given assets with its summary counted from their findings. */
export function makeReport(assets: AssetReport[]): LintReport {
  const findings = assets.flatMap((asset) => asset.findings);
  return {
    schema: 'orientry.lint-report',
    schemaVersion: 1,
    tool: { name: 'orientry', version: '1.0.0' },
    policyVersion: '9f2c41d07ab35e88',
    assets,
    summary: { ...countBySeverity(findings), assets: assets.length, findings: findings.length }
  };
}

const severityFinding = (severity: Severity, rule: string, extra: Partial<Finding> = {}) =>
  makeFinding({ severity, rule, ...extra });

/**
 * Three assets: one with an error, a warning and an info finding, one clean, one unreadable.
 * Covers every severity and every nullable field being null at least once.
 */
export function sampleReport(): LintReport {
  const keeper = 'characters/harbor-keeper.glb';
  return makeReport([
    makeAsset(keeper, [
      severityFinding('error', 'hemisphere-jump', {
        keys: [4, 5],
        time: 0.1667,
        message: 'CUBICSPLINE keys 4 and 5 lie in opposite hemispheres (dot -0.412); the curve passes near zero.',
        hint: 'Negate key 5 and its tangents, and every later key, so neighbours share a sign.'
      }),
      severityFinding('warning', 'unit-drift', {
        animation: 'Idle',
        channel: 0,
        node: '/Keeper/Hips',
        keys: [0, 7],
        time: 0,
        values: { maxLengthError: 0.0031, keyCount: 8 },
        message: '8 keys have length up to 1.0031 (limit 1 ± 0.001).',
        hint: 'Divide each key by its length, or re-export with normalized rotations.'
      }),
      severityFinding('info', 'redundant-keys', {
        animation: 'Idle',
        channel: 2,
        node: '/Keeper/Hips/Spine/Neck',
        keys: [3, 9],
        time: 0.125,
        values: { removable: 6 },
        message: '6 keys are reproduced by interpolating their neighbours within 0.01°.',
        hint: 'Resample or simplify the channel to drop them.'
      }),
      severityFinding('warning', 'baked-basis', {
        animation: null,
        channel: null,
        node: '/Keeper',
        keys: null,
        time: null,
        values: { axis: 'X', angleDegrees: -90 },
        message: 'The scene root carries a fixed -90° turn about X: a Z-up to Y-up correction baked into the asset.',
        hint: 'Export in glTF basis (+Y up) or fold the turn into the children.'
      })
    ]),
    makeAsset('props/lantern.gltf', [], {
      stats: { animations: 1, rotationChannels: 1, rotationKeys: 24, nodesWithRotation: 1 }
    }),
    makeAsset(
      'props/broken-buoy.glb',
      [
        severityFinding('error', 'asset-unreadable', {
          animation: null,
          channel: null,
          node: null,
          keys: null,
          time: null,
          values: { code: 'asset.invalid-glb' },
          message: 'The file is not a GLB: the header magic is 0x00000000.',
          hint: 'Re-export the asset; the upload may be truncated.'
        })
      ],
      {
        unreadable: true,
        byteLength: 12,
        stats: { animations: 0, rotationChannels: 0, rotationKeys: 0, nodesWithRotation: 0 }
      }
    )
  ]);
}
