/**
 * The mail outbox screen's queries (admins only; the route checks): the queued, sending, sent and
 * failed messages with their attempts and last error, the messages the local catcher received,
 * one message of either kind in full, and a manual retry of a failed message. Import as a
 * namespace: `outboxView.list()`.
 */
import { Op } from 'sequelize';
import { MailMessage } from '../db/models';
import type { MailStatus } from '../db/models/mail-message';
import { caughtMails, type CaughtMail } from './caught-mail';

/** One outbox row as the list shows it. */
export interface OutboxItem {
  id: number;
  kind: string;
  toAddress: string;
  subject: string;
  status: MailStatus;
  attempts: number;
  lastError: string | null;
  buildId: number | null;
  createdAt: string;
  nextAttemptAt: string;
  sentAt: string | null;
  leaseOwner: string | null;
  leaseUntil: string | null;
}

/** One caught message as the list shows it. */
export interface CaughtItem {
  id: number;
  subject: string;
  fromText: string;
  toText: string;
  byteLength: number;
  receivedAt: string;
  /** The outbox row this copy came from, when its Message-ID names one. */
  outboxId: number | null;
}

/** A message in full, for the preview: bodies, headers and the links it carries. */
export interface MailPreview {
  subject: string;
  fromText: string | null;
  toText: string;
  textBody: string | null;
  htmlBody: string | null;
  /** Header lines, as sent (caught copies) or as queued (outbox rows: extra headers only). */
  headers: { name: string; value: string }[];
  /** Every http(s) link in the bodies, in order of appearance, without repeats. */
  links: string[];
}

/** Messages by status, newest first, and the caught ones. */
export interface OutboxListing {
  counts: Record<MailStatus, number>;
  messages: OutboxItem[];
  caught: CaughtItem[];
  caughtTotal: number;
}

/** The newest `limit` outbox rows (optionally of one status) and caught messages. */
export async function list(options: { status?: MailStatus; limit?: number } = {}): Promise<OutboxListing> {
  const limit = options.limit ?? 100;
  const counts: Record<MailStatus, number> = { queued: 0, sending: 0, sent: 0, failed: 0 };
  const grouped = (await MailMessage.count({ group: ['status'] })) as unknown as {
    status: MailStatus;
    count: number;
  }[];
  for (const { status, count } of grouped) counts[status] = Number(count);
  const rows = await MailMessage.findAll({
    where: options.status ? { status: options.status } : {},
    attributes: { exclude: ['textBody', 'htmlBody', 'headersJson'] },
    order: [['id', 'DESC']],
    limit
  });
  const caught = await caughtMails().findAll({
    attributes: ['id', 'subject', 'fromText', 'toText', 'byteLength', 'receivedAt', 'messageId'],
    order: [['id', 'DESC']],
    limit
  });
  return {
    counts,
    messages: rows.map(outboxItemOf),
    caught: caught.map(caughtItemOf),
    caughtTotal: await caughtMails().count()
  };
}

/** One outbox row with its preview and the ids of its caught copies; null when unknown. */
export async function getMessage(
  id: number
): Promise<{ item: OutboxItem; preview: MailPreview; dedupeKey: string; caughtIds: number[] } | null> {
  const row = await MailMessage.findByPk(id);
  if (!row) return null;
  const headers = row.headersJson ? (JSON.parse(row.headersJson) as Record<string, string>) : {};
  const copies = await caughtMails().findAll({
    where: { messageId: { [Op.like]: `outbox-${row.id}.%` } },
    attributes: ['id'],
    order: [['id', 'ASC']]
  });
  return {
    item: outboxItemOf(row),
    dedupeKey: row.dedupeKey,
    caughtIds: copies.map((copy) => copy.id),
    preview: {
      subject: row.subject,
      fromText: null,
      toText: row.toAddress,
      textBody: row.textBody,
      htmlBody: row.htmlBody,
      headers: Object.entries(headers).map(([name, value]) => ({ name, value })),
      links: linksOf(row.htmlBody, row.textBody)
    }
  };
}

/** One caught message with its preview; null when unknown. */
export async function getCaught(id: number): Promise<{ item: CaughtItem; preview: MailPreview } | null> {
  const row = await caughtMails().findByPk(id);
  if (!row) return null;
  return {
    item: caughtItemOf(row),
    preview: {
      subject: row.subject,
      fromText: row.fromText,
      toText: row.toText,
      textBody: row.textBody,
      htmlBody: row.htmlBody,
      headers: headerLinesOf(row.headersText),
      links: linksOf(row.htmlBody, row.textBody)
    }
  };
}

/** Queues a failed message again with fresh attempts; false when it is not failed (or unknown). */
export async function retry(id: number, now: Date = new Date()): Promise<boolean> {
  const [changed] = await MailMessage.update(
    { status: 'queued', attempts: 0, nextAttemptAt: now, leaseOwner: null, leaseUntil: null },
    { where: { id, status: 'failed' } }
  );
  return changed === 1;
}

function outboxItemOf(row: MailMessage): OutboxItem {
  return {
    id: row.id,
    kind: row.kind,
    toAddress: row.toAddress,
    subject: row.subject,
    status: row.status,
    attempts: row.attempts,
    lastError: row.lastError,
    buildId: row.buildId,
    createdAt: row.createdAt.toISOString(),
    nextAttemptAt: row.nextAttemptAt.toISOString(),
    sentAt: row.sentAt?.toISOString() ?? null,
    leaseOwner: row.leaseOwner,
    leaseUntil: row.leaseUntil?.toISOString() ?? null
  };
}

function caughtItemOf(row: CaughtMail): CaughtItem {
  const outboxId = /^outbox-(\d+)\./.exec(row.messageId ?? '')?.[1];
  return {
    id: row.id,
    subject: row.subject,
    fromText: row.fromText,
    toText: row.toText,
    byteLength: row.byteLength,
    receivedAt: row.receivedAt.toISOString(),
    outboxId: outboxId ? Number(outboxId) : null
  };
}

/** Header lines of a raw header section, folded continuation lines joined to their header. */
function headerLinesOf(headersText: string): { name: string; value: string }[] {
  const headers: { name: string; value: string }[] = [];
  for (const line of headersText.split(/\r?\n/)) {
    if (/^[ \t]/.test(line) && headers.length > 0) {
      const last = headers[headers.length - 1];
      last.value = `${last.value} ${line.trim()}`.trim();
      continue;
    }
    const colon = line.indexOf(':');
    if (colon > 0) headers.push({ name: line.slice(0, colon), value: line.slice(colon + 1).trim() });
  }
  return headers;
}

function linksOf(html: string | null, text: string | null): string[] {
  const links = new Set<string>();
  for (const match of (html ?? '').matchAll(/href="(https?:\/\/[^"]+)"/g)) links.add(unescapeAttribute(match[1]));
  for (const match of (text ?? '').matchAll(/https?:\/\/[^\s<>"]+/g)) links.add(match[0]);
  return [...links];
}

function unescapeAttribute(value: string): string {
  return value
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
}
