import { describe, expect, it } from 'vitest';
import { fingerprintOf, type Finding, type Severity } from '$lib/lint/finding';
import type { AssetReport } from '$lib/lint/lint-report';
import { defaultPolicy } from '$lib/lint/policy';
import type { WaiverTerms } from './find-waiver';
import { fixedBaselineFindings, planBuild } from './plan-build';

const now = new Date('2026-03-01T12:00:00Z');

function finding(rule: string, severity: Severity, asset: string, time: number): Finding {
  return {
    rule,
    severity,
    asset,
    animation: 'Swim',
    channel: 0,
    node: '/Diver/Hips',
    keys: [1, 2],
    time,
    values: {},
    message: `${rule} at ${time} s`,
    hint: 'fix it',
    fingerprint: fingerprintOf({ rule, asset, animation: 'Swim', node: '/Diver/Hips', target: 'rotation', time })
  };
}

function report(path: string, findings: Finding[]): AssetReport {
  return {
    path,
    byteLength: 100,
    unreadable: false,
    skipped: false,
    stats: { animations: 1, rotationChannels: 1, rotationKeys: 4, nodesWithRotation: 0 },
    findings
  };
}

const diver = 'chars/kelp-diver.glb';
const buoy = 'props/buoy.glb';

describe('planBuild', () => {
  it('counts open findings by severity and standing, and waived and fixed ones apart', () => {
    const unchanged = finding('unit-drift', 'warning', diver, 0.5);
    const fresh = finding('key-times', 'error', diver, 1);
    const waived = finding('hemisphere-jump', 'error', buoy, 0.25);
    const gone = finding('wide-arc', 'warning', buoy, 2);
    const waiver: WaiverTerms = {
      id: 9,
      scope: 'rule-asset',
      status: 'approved',
      fingerprint: null,
      rule: 'hemisphere-jump',
      assetPath: buoy,
      expiresAt: null
    };
    const plan = planBuild(
      [report(diver, [unchanged, fresh]), report(buoy, [waived])],
      { findings: [unchanged, gone], fixedFinding: (finding) => finding },
      [waiver],
      defaultPolicy(),
      now
    );
    expect(plan.counts).toEqual({ error: 1, warning: 1, info: 0, new: 1, unchanged: 1, fixed: 1, waived: 1 });
    expect(plan.decision.verdict).toBe('fail');
    expect(plan.decision.reason).toBe('1 new error: key-times in chars/kelp-diver.glb (/Diver/Hips at 1 s)');
    const [diverPlan, buoyPlan] = plan.assets;
    expect(diverPlan.findings.map((f) => [f.finding.rule, f.status, f.waiverId])).toEqual([
      ['unit-drift', 'unchanged', null],
      ['key-times', 'new', null]
    ]);
    expect(diverPlan.counts).toEqual({ error: 1, warning: 1, info: 0 });
    expect(diverPlan.worstRule).toBe('key-times');
    expect(buoyPlan.findings.map((f) => [f.finding.rule, f.status, f.waiverId])).toEqual([
      ['hemisphere-jump', 'new', 9],
      ['wide-arc', 'fixed', null]
    ]);
    // The waived error and the fixed warning leave the buoy with nothing open.
    expect(buoyPlan.counts).toEqual({ error: 0, warning: 0, info: 0 });
    expect(buoyPlan.worstRule).toBeNull();
  });

  it('compares with a baseline of fingerprints only, and asks for the whole finding of just the fixed ones', () => {
    const kept = finding('unit-drift', 'warning', diver, 0.5);
    const gone = finding('wide-arc', 'warning', buoy, 2);
    const elsewhere = finding('key-times', 'error', 'props/not-checked.glb', 1);
    // As the server reads a baseline: id, fingerprint and asset path.
    const entries = [kept, gone, elsewhere].map((whole, index) => ({
      id: 100 + index,
      fingerprint: whole.fingerprint,
      asset: whole.asset
    }));
    const reports = [report(diver, [kept]), report(buoy, [])];
    expect(fixedBaselineFindings(reports, entries).map((entry) => entry.id)).toEqual([101]);
    const asked: number[] = [];
    const plan = planBuild(
      reports,
      {
        findings: entries,
        fixedFinding: (entry) => {
          asked.push(entry.id);
          return gone;
        }
      },
      [],
      defaultPolicy(),
      now
    );
    // An asset the build did not check keeps its baseline findings out of the plan (not fixed).
    expect(asked).toEqual([101]);
    expect(plan.counts).toMatchObject({ unchanged: 1, fixed: 1, new: 0 });
    expect(plan.assets[1].findings).toEqual([{ finding: gone, status: 'fixed', waiverId: null }]);
    expect(plan.assets[0].findings[0].finding).toBe(kept);
  });

  it('passes a clean first build with no baseline', () => {
    const plan = planBuild([report(diver, [])], null, [], defaultPolicy(), now);
    expect(plan.counts).toEqual({ error: 0, warning: 0, info: 0, new: 0, unchanged: 0, fixed: 0, waived: 0 });
    expect(plan.decision).toEqual({ verdict: 'pass', reason: 'No new errors', failing: [] });
  });

  it('treats every finding of a first build as new', () => {
    const plan = planBuild([report(diver, [finding('key-times', 'error', diver, 1)])], null, [], defaultPolicy(), now);
    expect(plan.counts.new).toBe(1);
    expect(plan.decision.verdict).toBe('fail');
  });
});
