/**
 * A project's waivers as the waivers page and API show them: who proposed and decided each one,
 * when it expires, whether it has expired, and in how many builds the gate applied it.
 */
import { Op, col, fn } from 'sequelize';
import { Build, FindingRecord, User, Waiver, WaiverEvent } from '../db/models';
import type { WaiverScope, WaiverStatus } from '../db/models/waiver';

/** A waiver's standing for display: its stored status, or `expired` for an approved one past its expiry. */
export type WaiverState = WaiverStatus | 'expired';

/** A person named in a waiver's record. */
export interface WaiverPerson {
  id: number;
  name: string;
}

/** One waiver as lists show it. Dates are ISO 8601. */
export interface WaiverView {
  id: number;
  scope: WaiverScope;
  fingerprint: string | null;
  rule: string | null;
  assetPath: string | null;
  reason: string;
  status: WaiverStatus;
  state: WaiverState;
  expiresAt: string | null;
  createdAt: string;
  proposedBy: WaiverPerson | null;
  decidedBy: WaiverPerson | null;
  decidedAt: string | null;
  /** Who revoked a revoked waiver, and when (from its history). */
  revokedBy: WaiverPerson | null;
  revokedAt: string | null;
  /** Builds in which the gate let a finding pass because of this waiver. */
  appliedBuildCount: number;
  /** The newest of those builds, or null. */
  lastAppliedBuildId: number | null;
  /** For a fingerprint waiver: the newest stored finding with that fingerprint, so the hash has a meaning. */
  finding: { rule: string; assetPath: string; node: string | null } | null;
}

/** The waiver's display state at `now`. */
export function waiverStateOf(waiver: Pick<Waiver, 'status' | 'expiresAt'>, now: Date): WaiverState {
  if (waiver.status === 'approved' && waiver.expiresAt && waiver.expiresAt.getTime() <= now.getTime()) return 'expired';
  return waiver.status;
}

/** Every waiver of the project, newest first. */
export async function listWaivers(projectId: number, now: Date = new Date()): Promise<WaiverView[]> {
  const waivers = await Waiver.findAll({
    where: { projectId },
    include: [
      { model: User, as: 'proposedBy', attributes: ['id', 'name'] },
      { model: User, as: 'decidedBy', attributes: ['id', 'name'] }
    ],
    order: [['id', 'DESC']]
  });
  const applied = await countApplications(
    projectId,
    waivers.map((waiver) => waiver.id)
  );
  const findings = await findLatestFindings(projectId, waivers);
  const revocations = await findRevocations(waivers);
  return waivers.map((waiver) => ({
    ...toView(waiver, now, applied.get(waiver.id), waiver.fingerprint ? findings.get(waiver.fingerprint) : undefined),
    ...revocations.get(waiver.id)
  }));
}

/** One waiver of the project, or null. */
export async function findWaiver(
  projectId: number,
  waiverId: number,
  now: Date = new Date()
): Promise<WaiverView | null> {
  const waiver = await Waiver.findOne({
    where: { id: waiverId, projectId },
    include: [
      { model: User, as: 'proposedBy', attributes: ['id', 'name'] },
      { model: User, as: 'decidedBy', attributes: ['id', 'name'] }
    ]
  });
  if (!waiver) return null;
  const applied = await countApplications(projectId, [waiver.id]);
  const findings = await findLatestFindings(projectId, [waiver]);
  const revocations = await findRevocations([waiver]);
  return {
    ...toView(waiver, now, applied.get(waiver.id), waiver.fingerprint ? findings.get(waiver.fingerprint) : undefined),
    ...revocations.get(waiver.id)
  };
}

function toView(
  waiver: Waiver,
  now: Date,
  applied?: { count: number; lastBuildId: number },
  finding?: WaiverView['finding']
): WaiverView {
  const people = waiver as Waiver & { proposedBy?: User | null; decidedBy?: User | null };
  return {
    id: waiver.id,
    scope: waiver.scope,
    fingerprint: waiver.fingerprint,
    rule: waiver.rule,
    assetPath: waiver.assetPath,
    reason: waiver.reason,
    status: waiver.status,
    state: waiverStateOf(waiver, now),
    expiresAt: waiver.expiresAt?.toISOString() ?? null,
    createdAt: waiver.createdAt.toISOString(),
    proposedBy: people.proposedBy ? { id: people.proposedBy.id, name: people.proposedBy.name } : null,
    decidedBy: people.decidedBy ? { id: people.decidedBy.id, name: people.decidedBy.name } : null,
    decidedAt: waiver.decidedAt?.toISOString() ?? null,
    revokedBy: null,
    revokedAt: null,
    appliedBuildCount: applied?.count ?? 0,
    lastAppliedBuildId: applied?.lastBuildId ?? null,
    finding: finding ?? null
  };
}

/** Who revoked each revoked waiver and when, from the history. */
async function findRevocations(
  waivers: readonly Waiver[]
): Promise<Map<number, Pick<WaiverView, 'revokedBy' | 'revokedAt'>>> {
  const result = new Map<number, Pick<WaiverView, 'revokedBy' | 'revokedAt'>>();
  const revoked = waivers.filter((waiver) => waiver.status === 'revoked').map((waiver) => waiver.id);
  if (revoked.length === 0) return result;
  const events = await WaiverEvent.findAll({
    where: { waiverId: { [Op.in]: revoked }, action: 'revoked' },
    include: [{ model: User, as: 'user', attributes: ['id', 'name'] }],
    order: [['id', 'ASC']]
  });
  for (const event of events) {
    const user = (event as WaiverEvent & { user?: User | null }).user;
    result.set(event.waiverId, {
      revokedBy: user ? { id: user.id, name: user.name } : null,
      revokedAt: event.createdAt.toISOString()
    });
  }
  return result;
}

/** The newest stored finding of the project for each fingerprint the waivers name. */
async function findLatestFindings(
  projectId: number,
  waivers: readonly Waiver[]
): Promise<Map<string, NonNullable<WaiverView['finding']>>> {
  const result = new Map<string, NonNullable<WaiverView['finding']>>();
  const fingerprints = [...new Set(waivers.map((waiver) => waiver.fingerprint).filter((value) => value !== null))];
  if (fingerprints.length === 0) return result;
  const newest = (await FindingRecord.findAll({
    attributes: [[fn('MAX', col('Finding.id')), 'id']],
    where: { fingerprint: { [Op.in]: fingerprints } },
    include: [{ model: Build, as: 'build', where: { projectId }, attributes: [] }],
    group: ['fingerprint'],
    raw: true
  })) as unknown as { id: number }[];
  if (newest.length === 0) return result;
  const rows = await FindingRecord.findAll({
    attributes: ['fingerprint', 'rule', 'assetPath', 'node'],
    where: { id: { [Op.in]: newest.map((row) => Number(row.id)) } }
  });
  for (const row of rows) result.set(row.fingerprint, { rule: row.rule, assetPath: row.assetPath, node: row.node });
  return result;
}

/** Per waiver: the number of builds whose findings it waived and the newest such build. */
async function countApplications(
  projectId: number,
  waiverIds: number[]
): Promise<Map<number, { count: number; lastBuildId: number }>> {
  const result = new Map<number, { count: number; lastBuildId: number }>();
  if (waiverIds.length === 0) return result;
  const rows = (await FindingRecord.findAll({
    attributes: [
      'waiverId',
      [fn('COUNT', fn('DISTINCT', col('buildId'))), 'count'],
      [fn('MAX', col('buildId')), 'lastBuildId']
    ],
    where: {
      waiverId: { [Op.in]: waiverIds },
      // Findings only point at waivers of their own project; the build filter keeps that a fact, not a hope.
      buildId: {
        [Op.in]: Build.sequelize!.literal(`(SELECT "id" FROM "builds" WHERE "projectId" = ${Number(projectId)})`)
      }
    },
    group: ['waiverId'],
    raw: true
  })) as unknown as { waiverId: number; count: number; lastBuildId: number }[];
  for (const row of rows) {
    result.set(row.waiverId, { count: Number(row.count), lastBuildId: Number(row.lastBuildId) });
  }
  return result;
}
