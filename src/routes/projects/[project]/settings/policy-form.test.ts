import { describe, expect, it } from 'vitest';
import { defaultPolicy, parsePolicy, policyVersionOf } from '$lib/lint/policy';
import { RULE_IDS } from '$lib/lint/rule-ids';
import { fieldNames, parsePolicyForm, policyFieldGroups, valuesOfForm, valuesOfPolicy } from './policy-form';

const groups = policyFieldGroups();

describe('policyFieldGroups', () => {
  it('has a field for every editable policy setting, with the schema’s limits and choices', () => {
    const names = fieldNames(groups);
    for (const name of [
      'tolerances.unitWarning',
      'wideArcDegrees',
      'splineMinLength',
      'convention.requireGltfBasis',
      'engine.eulerOrder',
      'gate.failOn',
      'include',
      'exclude'
    ]) {
      expect(names).toContain(name);
    }
    expect(names.filter((name) => name.startsWith('rules.'))).toEqual(RULE_IDS.map((id) => `rules.${id}`));
    const fields = groups.flatMap((group) => group.fields);
    const wideArc = fields.find((field) => field.path === 'wideArcDegrees');
    // policySchema: wideArcDegrees is z.number().min(90).max(180).default(150).
    expect(wideArc).toMatchObject({
      kind: 'number',
      defaultValue: 150,
      min: { value: 90, isInclusive: true },
      max: { value: 180, isInclusive: true }
    });
    expect(fields.find((field) => field.path === 'engine.rotationStorage')).toMatchObject({
      kind: 'choice',
      options: ['quaternion', 'euler']
    });
  });
});

describe('parsePolicyForm', () => {
  it('gives back the same policy it was filled from', () => {
    const policy = parsePolicy({
      rules: { 'wide-arc': 'off' },
      include: ['chars/**'],
      engine: { rotationStorage: 'euler' }
    });
    const parsed = parsePolicyForm(valuesOfPolicy(policy, groups), groups);
    expect(parsed.fieldErrors).toBeNull();
    expect(policyVersionOf(parsed.policy!)).toBe(policyVersionOf(policy));
  });

  it('reads a submitted form, with an unticked checkbox as false and empty rule choices as defaults', () => {
    const form = new FormData();
    for (const [name, value] of Object.entries(valuesOfPolicy(defaultPolicy(), groups))) {
      if (name !== 'convention.requireGltfBasis') form.set(name, value);
    }
    form.set('rules.spin-spike', 'warning');
    form.set('exclude', 'drafts/**\n\n  **/*.tmp.glb  ');
    const parsed = parsePolicyForm(valuesOfForm(form, groups), groups);
    expect(parsed.policy?.convention.requireGltfBasis).toBe(false);
    expect(parsed.policy?.rules).toEqual({ 'spin-spike': 'warning' });
    expect(parsed.policy?.exclude).toEqual(['drafts/**', '**/*.tmp.glb']);
  });

  it.each([
    { field: 'wideArcDegrees', value: 'wide', message: /is not a number/ },
    { field: 'wideArcDegrees', value: '', message: /Enter a number \(default 150\)/ },
    // policySchema: wideArcDegrees has .max(180).
    { field: 'wideArcDegrees', value: '181', message: /^Must be at most 180\.$/ },
    // policySchema: tolerances are positive(), so 0 is refused.
    { field: 'tolerances.zeroLength', value: '0', message: /^Must be more than 0\.$/ },
    // policySchema: unitError must be at least unitWarning (refine).
    { field: 'tolerances.unitError', value: '0.0001', message: /^Must be at least “Unit length: warning above”$/ },
    { field: 'gate.failOn', value: 'fatal', message: /^Choose one of error, warning, info\.$/ }
  ])('names the field and keeps the input when $field is "$value"', ({ field, value, message }) => {
    const values = { ...valuesOfPolicy(defaultPolicy(), groups), [field]: value };
    const parsed = parsePolicyForm(values, groups);
    expect(parsed.policy).toBeNull();
    expect(parsed.fieldErrors?.[field]).toMatch(message);
    expect(values[field]).toBe(value);
  });
});
