/**
 * A waiver's life, one function per change: `propose` (artists and up), `approve` and `reject`
 * a proposal, `revoke` an approved waiver (leads and admins). Import as a namespace:
 * `waivers.propose(...)`. Each change and its history line (WaiverEvent) are written in one
 * transaction, and the state is checked in the UPDATE itself, so two leads deciding at once
 * cannot both win.
 *
 *   proposed ──approve──▶ approved ──revoke──▶ revoked
 *       │                    │
 *       └──reject──▶ rejected  (expired: an approved waiver past `expiresAt`; the gate stops applying it)
 *
 * Rights are checked here as well as in the routes, so no caller can skip them.
 */
import type { Transaction } from 'sequelize';
import { isProjectRoleAtLeast, type ProjectRole } from '../../types/roles';
import type { SessionUser } from '../../types/session-user';
import { Waiver, WaiverEvent } from '../db/models';
import type { WaiverStatus } from '../db/models/waiver';
import type { WaiverAction } from '../db/models/waiver-event';
import { ForbiddenError } from '../errors';
import { WaiverNotFoundError, WaiverStateError } from './waiver-errors';
import { expiryMomentOf, type ProposeWaiverInput, type WaiverDecisionInput } from './waiver-input';

/** Who acts, and their standing in the project (admins act as leads). */
export interface WaiverActor {
  user: SessionUser;
  role: ProjectRole;
}

/** The project a waiver belongs to. */
export interface WaiverProject {
  id: number;
  name: string;
}

/**
 * Proposes a waiver. The expiry day, when given, must not be in the past.
 * @throws ForbiddenError below the artist role; WaiverStateError for an expiry already passed.
 */
export async function propose(
  project: WaiverProject,
  actor: WaiverActor,
  input: ProposeWaiverInput,
  now: Date = new Date()
): Promise<Waiver> {
  requireRole(project, actor, 'artist', 'propose a waiver');
  const expiresAt = input.expiresOn ? expiryMomentOf(input.expiresOn) : null;
  if (expiresAt && expiresAt.getTime() <= now.getTime()) {
    throw new WaiverStateError(
      'waiver.expiry-past',
      `The expiry ${input.expiresOn} has already passed. Pick a later day or leave the expiry empty.`
    );
  }
  const isFingerprint = input.scope === 'fingerprint';
  return inTransaction(async (transaction) => {
    const waiver = await Waiver.create(
      {
        projectId: project.id,
        scope: input.scope,
        fingerprint: isFingerprint ? (input.fingerprint ?? null) : null,
        rule: isFingerprint ? null : (input.rule ?? null),
        assetPath: isFingerprint ? null : (input.assetPath ?? null),
        reason: input.reason,
        expiresAt,
        status: 'proposed',
        proposedById: actor.user.id
      },
      { transaction }
    );
    await WaiverEvent.create(
      { waiverId: waiver.id, userId: actor.user.id, action: 'proposed', note: null },
      { transaction }
    );
    return waiver;
  });
}

/**
 * Applies a lead's decision: approve or reject a proposal, or revoke an approved waiver.
 * @throws ForbiddenError below the lead role; WaiverNotFoundError for a waiver of another
 *   project; WaiverStateError when the waiver's state does not allow the change.
 */
export async function decide(
  project: WaiverProject,
  actor: WaiverActor,
  waiverId: number,
  decision: WaiverDecisionInput,
  now: Date = new Date()
): Promise<Waiver> {
  requireRole(project, actor, 'lead', `${decision.action} waivers`);
  const change = CHANGES[decision.action];
  return inTransaction(async (transaction) => {
    const waiver = await Waiver.findOne({ where: { id: waiverId, projectId: project.id }, transaction });
    if (!waiver) {
      throw new WaiverNotFoundError('waiver.not-found', `${project.name} has no waiver ${waiverId}. Reload the list.`);
    }
    if (!change.from.includes(waiver.status)) {
      throw new WaiverStateError(
        'waiver.state',
        `Waiver ${waiverId} is ${waiver.status}, so it cannot be ${change.event}. Reload the list to see its current state.`
      );
    }
    if (decision.action === 'approve' && waiver.expiresAt && waiver.expiresAt.getTime() <= now.getTime()) {
      throw new WaiverStateError(
        'waiver.expired',
        `Waiver ${waiverId} expired on ${waiver.expiresAt.toISOString().slice(0, 10)}; approving it would change nothing. Ask for a new proposal.`
      );
    }
    const isDecision = decision.action !== 'revoke';
    const [changed] = await Waiver.update(
      {
        status: change.to,
        ...(isDecision ? { decidedById: actor.user.id, decidedAt: now } : {})
      },
      { where: { id: waiverId, status: waiver.status }, transaction }
    );
    // Another decision landed between the read and the write: report the state it left.
    if (changed === 0) {
      throw new WaiverStateError(
        'waiver.state',
        `Waiver ${waiverId} was changed by someone else just now. Reload the list.`
      );
    }
    await WaiverEvent.create(
      { waiverId, userId: actor.user.id, action: change.event, note: decision.note ?? null },
      { transaction }
    );
    await waiver.reload({ transaction });
    return waiver;
  });
}

/** Which states each decision starts from and what it leads to. */
const CHANGES: Record<WaiverDecisionInput['action'], { from: WaiverStatus[]; to: WaiverStatus; event: WaiverAction }> =
  {
    approve: { from: ['proposed'], to: 'approved', event: 'approved' },
    reject: { from: ['proposed'], to: 'rejected', event: 'rejected' },
    revoke: { from: ['approved'], to: 'revoked', event: 'revoked' }
  };

function requireRole(project: WaiverProject, actor: WaiverActor, minimum: ProjectRole, what: string): void {
  if (isProjectRoleAtLeast(actor.role, minimum)) return;
  throw new ForbiddenError(
    'project.role-required',
    `Only a ${minimum} or an admin of ${project.name} can ${what}; you are ${actor.role === 'artist' ? 'an' : 'a'} ${actor.role}.`
  );
}

function inTransaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
  const sequelize = Waiver.sequelize;
  if (!sequelize) throw new Error('The Waiver model is not bound to a database; open the database first.');
  return sequelize.transaction(work);
}
