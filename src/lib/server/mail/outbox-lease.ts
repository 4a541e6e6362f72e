/**
 * Leases on outbox messages, so several servers sharing one database never send the same
 * message twice. A worker claims one due message at a time with a conditional UPDATE: it sets
 * `status = 'sending'`, its own `leaseOwner` and a `leaseUntil`, only WHERE the message is still
 * due and unleased (queued with no live lease, or left `sending` by a worker whose lease ran out).
 * SQLite runs each UPDATE alone, so of two workers racing for a row exactly one sees a changed
 * row. Results are written back only while the worker still holds the lease.
 *
 * Design notes: claiming a batch at once was tried first; a slow mail server could then keep the
 * last messages of the batch past their lease and let another server send them again. One claim
 * per send costs one more small UPDATE and keeps the lease about one SMTP conversation long.
 */
import { literal, Op, type WhereOptions } from 'sequelize';
import { MailMessage } from '../db/models';

/** Rows a worker may claim at `now`. */
function dueAt(now: Date): WhereOptions<MailMessage> {
  return {
    nextAttemptAt: { [Op.lte]: now },
    [Op.or]: [
      { status: 'queued', [Op.or]: [{ leaseUntil: null }, { leaseUntil: { [Op.lt]: now } }] },
      { status: 'sending', leaseUntil: { [Op.lt]: now } }
    ]
  };
}

/**
 * Claims the next due message for `owner` until `now + leaseMs`, counting the attempt; null
 * when nothing is due. Candidates another worker claims first are skipped.
 */
export async function claimNext(owner: string, now: Date, leaseMs: number): Promise<MailMessage | null> {
  const candidates = await MailMessage.findAll({
    where: dueAt(now),
    attributes: ['id'],
    order: [
      ['nextAttemptAt', 'ASC'],
      ['id', 'ASC']
    ],
    limit: 5
  });
  for (const { id } of candidates) {
    const [changed] = await MailMessage.update(
      {
        status: 'sending',
        leaseOwner: owner,
        leaseUntil: new Date(now.getTime() + leaseMs),
        attempts: literal('"attempts" + 1') as unknown as number
      },
      { where: { [Op.and]: [{ id }, dueAt(now)] } }
    );
    if (changed === 1) return MailMessage.findOne({ where: { id, leaseOwner: owner } });
  }
  return null;
}

/** Records a delivered message; false when the lease was lost meanwhile (another worker owns it). */
export async function markSent(message: MailMessage, owner: string, now: Date): Promise<boolean> {
  const [changed] = await MailMessage.update(
    { status: 'sent', sentAt: now, lastError: null, leaseOwner: null, leaseUntil: null },
    { where: { id: message.id, leaseOwner: owner, status: 'sending' } }
  );
  return changed === 1;
}

/**
 * Records a failed attempt: queued again from `retryAt`, or failed for good when `retryAt` is null.
 * False when the lease was lost meanwhile.
 */
export async function markAttemptFailed(
  message: MailMessage,
  owner: string,
  lastError: string,
  retryAt: Date | null
): Promise<boolean> {
  const [changed] = await MailMessage.update(
    {
      status: retryAt ? 'queued' : 'failed',
      lastError: lastError.slice(0, 4000),
      leaseOwner: null,
      leaseUntil: null,
      ...(retryAt ? { nextAttemptAt: retryAt } : {})
    },
    { where: { id: message.id, leaseOwner: owner, status: 'sending' } }
  );
  return changed === 1;
}
