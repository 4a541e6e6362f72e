/**
 * The mail outbox (table `mail_messages`): code that wants to send an e-mail only queues it here,
 * inside its own transaction when it has one, and the mail worker sends it later. A request so
 * never waits for, or fails on, a mail server. Import as a namespace: `outbox.enqueue(...)`.
 */
import type { Transaction } from 'sequelize';
import { MailMessage } from '../db/models';

/** An e-mail to queue. */
export interface MailDraft {
  /** What the message is about: `build-regression`, `build-fixed`, `invitation`, `password-reset`. */
  kind: string;
  toAddress: string;
  subject: string;
  textBody: string;
  htmlBody: string | null;
  /** Extra headers, e.g. `List-Unsubscribe`. */
  headers?: Record<string, string>;
  buildId?: number | null;
  /**
   * Unique per message that must go out once, e.g. `build:42:regression:7`: queueing the same
   * key again (a retried request, a second server) keeps the first message and adds nothing.
   */
  dedupeKey: string;
}

const listeners = new Set<() => void>();

/**
 * Queues `draft` unless a message with its dedupe key exists. With a transaction the row commits
 * or rolls back with the caller's work, and workers in this process are woken after the commit.
 * Resolves to false when the key was already queued.
 */
export async function enqueue(draft: MailDraft, options: { transaction?: Transaction } = {}): Promise<boolean> {
  const { transaction } = options;
  const existing = await MailMessage.findOne({
    where: { dedupeKey: draft.dedupeKey },
    attributes: ['id'],
    transaction
  });
  if (existing) return false;
  // INSERT OR IGNORE: a racing writer with the same key wins quietly instead of failing this one.
  await MailMessage.bulkCreate(
    [
      {
        kind: draft.kind,
        toAddress: draft.toAddress,
        subject: draft.subject,
        textBody: draft.textBody,
        htmlBody: draft.htmlBody,
        headersJson: draft.headers && Object.keys(draft.headers).length > 0 ? JSON.stringify(draft.headers) : null,
        buildId: draft.buildId ?? null,
        dedupeKey: draft.dedupeKey
      }
    ],
    { ignoreDuplicates: true, transaction }
  );
  if (transaction) transaction.afterCommit(notifyListeners);
  else notifyListeners();
  // Inside a write transaction nobody can race the check above; outside one, a racing writer's
  // message is the one that goes out, which is all a dedupe key promises.
  return true;
}

/** Calls `listener` whenever this process queued a message (the worker wakes up); returns an unsubscribe. */
export function onEnqueued(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

function notifyListeners(): void {
  for (const listener of listeners) listener();
}
