import { describe, expect, it } from 'vitest';
import { defaultPolicy, fingerprintOf, parsePolicy } from '$lib/lint';
import { unreadableAssetReport } from './unreadable-asset-report';

const permissionDenied = Object.assign(new Error("EACCES: permission denied, open 'chars/hero.glb'"), {
  code: 'EACCES'
});

describe('unreadableAssetReport', () => {
  it('reports one asset-unreadable error naming the file system code', () => {
    const report = unreadableAssetReport('chars/hero.glb', permissionDenied, defaultPolicy());
    expect(report).toMatchObject({ path: 'chars/hero.glb', unreadable: true, skipped: false, byteLength: 0 });
    expect(report.findings).toHaveLength(1);
    expect(report.findings[0]).toMatchObject({
      rule: 'asset-unreadable',
      severity: 'error',
      asset: 'chars/hero.glb',
      values: { code: 'asset.file-unreadable', reason: 'EACCES' }
    });
    expect(report.findings[0].message).toContain('EACCES');
  });

  it('shares its fingerprint with the library so a waiver covers both causes', () => {
    const report = unreadableAssetReport('chars/hero.glb', permissionDenied, defaultPolicy());
    expect(report.findings[0].fingerprint).toBe(
      fingerprintOf({ rule: 'asset-unreadable', asset: 'chars/hero.glb', animation: null, node: null })
    );
  });

  it('follows the policy: a lowered rule lowers the finding, a rule turned off drops it', () => {
    const lowered = unreadableAssetReport(
      'a.glb',
      permissionDenied,
      parsePolicy({ rules: { 'asset-unreadable': 'warning' } })
    );
    expect(lowered.findings[0].severity).toBe('warning');
    const silenced = unreadableAssetReport(
      'a.glb',
      permissionDenied,
      parsePolicy({ rules: { 'asset-unreadable': 'off' } })
    );
    expect(silenced.findings).toEqual([]);
    expect(silenced.unreadable).toBe(true);
  });

  it('uses the message of an error without a code', () => {
    const report = unreadableAssetReport('a.glb', new Error('disk went away'), defaultPolicy());
    expect(report.findings[0].values.reason).toBe('disk went away');
  });
});
