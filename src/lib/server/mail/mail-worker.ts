/**
 * The background sender of the outbox: claims one due message at a time under a lease (see
 * outbox-lease.ts), hands it to the SMTP transport and records the outcome. A refused or failed
 * attempt is retried with back-off (retry-delay.ts) until it succeeds or runs out of attempts,
 * then the message is `failed` with its last error, for the outbox screen. A permanent refusal
 * (SMTP 5xx) fails at once: asking again gets the same answer.
 *
 * The worker polls every couple of seconds and wakes at once when this process queues a message.
 * Delivery is at least once: if the process dies between the server's "250 OK" and the UPDATE that
 * records it, the lease runs out and the message is sent again. Its Message-ID stays the same, so
 * a receiving system can tell the copies apart; every other path sends a message exactly once.
 */
import crypto from 'node:crypto';
import os from 'node:os';
import type { Transporter } from 'nodemailer';
import type { MailMessage } from '../db/models';
import { claimNext, markAttemptFailed, markSent } from './outbox-lease';
import { RETRY_DEFAULTS, retryDelayMs, type RetryOptions } from './retry-delay';

/** The part of a nodemailer transport the worker uses. */
export type MailTransport = Pick<Transporter, 'sendMail'>;

/** Settings of a {@link MailWorker}. */
export interface MailWorkerOptions extends Partial<RetryOptions> {
  transport: MailTransport;
  /** The From header, e.g. `Orientry <orientry@localhost>`. */
  from: string;
  /** Names this worker in leases; default host, process id and a random suffix. */
  owner?: string;
  /** How often to look for due messages when nobody wakes the worker. */
  pollIntervalMs?: number;
  /** How long a claim lasts; longer than the slowest SMTP conversation (nodemailer gives up after 60 s). */
  leaseMs?: number;
  /** Where one-line reports of failed attempts go. */
  log?: (line: string) => void;
}

/** Defaults of the worker's own settings. */
export const MAIL_WORKER_DEFAULTS = { pollIntervalMs: 2_000, leaseMs: 2 * 60 * 1000 };

/** Sends queued mail in the background of one process. Start it once; stop it on shutdown. */
export class MailWorker {
  readonly owner: string;
  private readonly options: Required<Omit<MailWorkerOptions, 'owner'>>;
  private isRunning = false;
  private loop: Promise<void> | undefined;
  private wakeUp: (() => void) | undefined;
  private isWakeRequested = false;

  constructor(options: MailWorkerOptions) {
    this.owner =
      options.owner ?? `${os.hostname().slice(0, 60)}:${process.pid}:${crypto.randomBytes(3).toString('hex')}`;
    const { owner: _owner, ...rest } = withoutUndefined(options);
    this.options = {
      ...RETRY_DEFAULTS,
      ...MAIL_WORKER_DEFAULTS,
      log: (line) => console.warn(line),
      ...rest,
      transport: options.transport,
      from: options.from
    };
  }

  /** Starts the polling loop (a second call does nothing). */
  start(): void {
    if (this.isRunning) return;
    this.isRunning = true;
    this.loop = this.run();
  }

  /** Looks for due messages now instead of at the next poll. */
  wake(): void {
    this.isWakeRequested = true;
    this.wakeUp?.();
  }

  /** Stops after the message being sent, if any, is recorded. */
  async stop(): Promise<void> {
    this.isRunning = false;
    this.wakeUp?.();
    await this.loop;
  }

  /** Sends every message due now, one at a time; resolves to how many attempts were made. */
  async runOnce(now: () => Date = () => new Date()): Promise<number> {
    let attempts = 0;
    for (;;) {
      const message = await claimNext(this.owner, now(), this.options.leaseMs);
      if (!message) return attempts;
      attempts++;
      await this.deliver(message, now);
      if (!this.isRunning && this.loop) return attempts;
    }
  }

  private async run(): Promise<void> {
    while (this.isRunning) {
      this.isWakeRequested = false;
      try {
        await this.runOnce();
      } catch (error) {
        // The database was busy or gone for a moment: the next poll tries again, nothing is lost.
        console.error('Orientry mail: the outbox could not be read; retrying at the next poll.', error);
      }
      if (this.isRunning && !this.isWakeRequested) await this.sleep();
    }
  }

  private sleep(): Promise<void> {
    return new Promise((resolve) => {
      const done = () => {
        clearTimeout(timer);
        this.wakeUp = undefined;
        resolve();
      };
      const timer = setTimeout(done, this.options.pollIntervalMs);
      timer.unref();
      this.wakeUp = done;
    });
  }

  private async deliver(message: MailMessage, now: () => Date): Promise<void> {
    try {
      await this.options.transport.sendMail({
        from: this.options.from,
        to: message.toAddress,
        subject: message.subject,
        text: message.textBody,
        html: message.htmlBody ?? undefined,
        messageId: messageIdOf(message, this.options.from),
        headers: { ...headersOf(message), 'Auto-Submitted': 'auto-generated' }
      });
    } catch (error) {
      const isPermanent = isPermanentRefusal(error);
      const isLastAttempt = isPermanent || message.attempts >= this.options.maxAttempts;
      const retryAt = isLastAttempt ? null : new Date(now().getTime() + retryDelayMs(message.attempts, this.options));
      const reason = describeSendError(error);
      await markAttemptFailed(message, this.owner, `Attempt ${message.attempts}: ${reason}`, retryAt);
      this.options.log(
        `Orientry mail: message ${message.id} to ${message.toAddress} failed (attempt ${message.attempts}): ${reason}; ` +
          (retryAt ? `trying again at ${retryAt.toISOString()}.` : 'giving up; see the mail outbox.')
      );
      return;
    }
    await markSent(message, this.owner, now());
  }
}

/** A stable Message-ID per outbox row, the same on every attempt. */
export function messageIdOf(message: Pick<MailMessage, 'id' | 'dedupeKey'>, from: string): string {
  const domain = /@([^>\s]+)>?\s*$/.exec(from)?.[1] ?? 'localhost';
  const digest = crypto.createHash('sha256').update(message.dedupeKey).digest('hex').slice(0, 12);
  return `<outbox-${message.id}.${digest}@${domain}>`;
}

function headersOf(message: MailMessage): Record<string, string> {
  if (!message.headersJson) return {};
  return JSON.parse(message.headersJson) as Record<string, string>;
}

/** SMTP 5xx: the server refuses for good (unknown mailbox, policy), so retrying cannot help. */
function isPermanentRefusal(error: unknown): boolean {
  const code = (error as { responseCode?: unknown }).responseCode;
  return typeof code === 'number' && code >= 500 && code < 600;
}

function describeSendError(error: unknown): string {
  if (error instanceof Error) return error.message.replace(/\s+/g, ' ').trim() || error.name;
  return String(error);
}

function withoutUndefined<T extends object>(value: T): Partial<T> {
  return Object.fromEntries(Object.entries(value).filter(([, entry]) => entry !== undefined)) as Partial<T>;
}
