import { describe, expect, it } from 'vitest';
import { decideVerdict, type GateFinding } from './decide-verdict';

const gateFinding = (overrides: Partial<GateFinding>): GateFinding => ({
  rule: 'hemisphere-jump',
  severity: 'error',
  asset: 'chars/kelp-diver.glb',
  node: '/Diver/Hips',
  time: 1.25,
  status: 'new',
  isWaived: false,
  ...overrides
});

const newOnErrors = { failOn: 'error', scope: 'new' } as const;

describe('decideVerdict', () => {
  it('passes an empty build', () => {
    expect(decideVerdict([], newOnErrors)).toEqual({ verdict: 'pass', reason: 'No new errors', failing: [] });
  });

  it('fails on a new error and names rule, asset, node and time', () => {
    const decision = decideVerdict([gateFinding({})], newOnErrors);
    expect(decision.verdict).toBe('fail');
    expect(decision.reason).toBe('1 new error: hemisphere-jump in chars/kelp-diver.glb (/Diver/Hips at 1.25 s)');
  });

  it('counts plural errors and summarises past the third', () => {
    const findings = ['a.glb', 'b.glb', 'c.glb', 'd.glb', 'e.glb'].map((asset) =>
      gateFinding({ asset, node: null, time: null })
    );
    expect(decideVerdict(findings, newOnErrors).reason).toBe(
      '5 new errors: hemisphere-jump in a.glb, hemisphere-jump in b.glb, hemisphere-jump in c.glb and 2 more'
    );
  });

  it('passes when the only error is unchanged from the baseline under scope new', () => {
    const decision = decideVerdict([gateFinding({ status: 'unchanged' })], newOnErrors);
    expect(decision).toEqual({ verdict: 'pass', reason: 'No new errors (1 unchanged)', failing: [] });
  });

  it('fails on an unchanged error under scope all, without calling it new', () => {
    const decision = decideVerdict([gateFinding({ status: 'unchanged', node: null })], {
      failOn: 'error',
      scope: 'all'
    });
    expect(decision.verdict).toBe('fail');
    expect(decision.reason).toBe('1 error: hemisphere-jump in chars/kelp-diver.glb (at 1.25 s)');
  });

  it('never counts a waived finding, under either scope', () => {
    const waived = [gateFinding({ isWaived: true })];
    expect(decideVerdict(waived, newOnErrors)).toEqual({
      verdict: 'pass',
      reason: 'No new errors (1 waived)',
      failing: []
    });
    expect(decideVerdict(waived, { failOn: 'error', scope: 'all' }).verdict).toBe('pass');
  });

  it('never counts a fixed finding', () => {
    const decision = decideVerdict([gateFinding({ status: 'fixed' })], { failOn: 'info', scope: 'all' });
    expect(decision).toEqual({ verdict: 'pass', reason: 'No findings (1 fixed)', failing: [] });
  });

  it.each([
    { failOn: 'error', severity: 'warning', verdict: 'pass' },
    { failOn: 'warning', severity: 'warning', verdict: 'fail' },
    { failOn: 'warning', severity: 'error', verdict: 'fail' },
    { failOn: 'warning', severity: 'info', verdict: 'pass' },
    { failOn: 'info', severity: 'info', verdict: 'fail' }
  ] as const)('with failOn $failOn a new $severity gives $verdict', ({ failOn, severity, verdict }) => {
    expect(decideVerdict([gateFinding({ severity })], { failOn, scope: 'new' }).verdict).toBe(verdict);
  });

  it('counts failing findings per severity, heaviest first', () => {
    const findings = [
      gateFinding({ severity: 'warning', rule: 'unit-drift', node: null, time: 0 }),
      gateFinding({ severity: 'error' }),
      gateFinding({ severity: 'warning', status: 'unchanged' })
    ];
    const decision = decideVerdict(findings, { failOn: 'warning', scope: 'new' });
    expect(decision.reason).toBe(
      '1 new error, 1 new warning: unit-drift in chars/kelp-diver.glb (at 0 s), hemisphere-jump in chars/kelp-diver.glb (/Diver/Hips at 1.25 s)'
    );
    expect(decision.failing).toHaveLength(2);
  });

  it('words the pass reason after the gate threshold', () => {
    expect(decideVerdict([], { failOn: 'warning', scope: 'new' }).reason).toBe('No new errors or warnings');
    expect(decideVerdict([], { failOn: 'error', scope: 'all' }).reason).toBe('No errors');
  });
});
