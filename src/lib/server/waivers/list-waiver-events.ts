/**
 * The history of a project's waivers: who proposed, approved, rejected or revoked what, and
 * when, newest first. Each line names the waiver's terms so it reads on its own.
 */
import { User, Waiver, WaiverEvent } from '../db/models';
import type { WaiverAction } from '../db/models/waiver-event';
import type { WaiverScope } from '../db/models/waiver';

/** One line of the history. Dates are ISO 8601. */
export interface WaiverEventView {
  id: number;
  waiverId: number;
  action: WaiverAction;
  note: string | null;
  createdAt: string;
  /** Null for events the server raised itself. */
  user: { id: number; name: string } | null;
  waiver: { scope: WaiverScope; fingerprint: string | null; rule: string | null; assetPath: string | null };
}

/** Most history lines one answer holds. */
export const WAIVER_EVENTS_LIMIT = 200;

/** The newest events of the project's waivers (at most `limit`). */
export async function listWaiverEvents(projectId: number, limit = WAIVER_EVENTS_LIMIT): Promise<WaiverEventView[]> {
  const events = await WaiverEvent.findAll({
    include: [
      {
        model: Waiver,
        as: 'waiver',
        where: { projectId },
        attributes: ['id', 'scope', 'fingerprint', 'rule', 'assetPath']
      },
      { model: User, as: 'user', attributes: ['id', 'name'] }
    ],
    order: [['id', 'DESC']],
    limit
  });
  return events.map((event) => {
    const joined = event as WaiverEvent & { waiver: Waiver; user?: User | null };
    return {
      id: event.id,
      waiverId: event.waiverId,
      action: event.action,
      note: event.note,
      createdAt: event.createdAt.toISOString(),
      user: joined.user ? { id: joined.user.id, name: joined.user.name } : null,
      waiver: {
        scope: joined.waiver.scope,
        fingerprint: joined.waiver.fingerprint,
        rule: joined.waiver.rule,
        assetPath: joined.waiver.assetPath
      }
    };
  });
}
