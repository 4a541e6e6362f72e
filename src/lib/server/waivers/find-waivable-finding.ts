/**
 * The finding a waiver proposal is about, found by its fingerprint in the project's newest
 * build that has it, so the proposal form can show what is being waived (rule, asset, node,
 * message) instead of a bare hash.
 */
import { Build, FindingRecord } from '../db/models';

/** What the proposal form shows about the finding. */
export interface WaivableFindingView {
  fingerprint: string;
  rule: string;
  severity: string;
  assetPath: string;
  node: string | null;
  animation: string | null;
  timeSeconds: number | null;
  message: string;
  buildId: number;
  buildLabel: string | null;
}

/** The newest stored finding of the project with this fingerprint, or null. */
export async function findWaivableFinding(projectId: number, fingerprint: string): Promise<WaivableFindingView | null> {
  if (!/^[0-9a-f]{16}$/.test(fingerprint)) return null;
  const finding = await FindingRecord.findOne({
    where: { fingerprint },
    include: [{ model: Build, as: 'build', where: { projectId }, attributes: ['id', 'label'] }],
    order: [['id', 'DESC']]
  });
  if (!finding) return null;
  const build = (finding as FindingRecord & { build: Build }).build;
  return {
    fingerprint: finding.fingerprint,
    rule: finding.rule,
    severity: finding.severity,
    assetPath: finding.assetPath,
    node: finding.node,
    animation: finding.animation,
    timeSeconds: finding.timeSeconds,
    message: finding.message,
    buildId: build.id,
    buildLabel: build.label
  };
}
