/**
 * The local mail catcher: a small SMTP server on the loopback interface that accepts every
 * message and stores it in `caught_mails` instead of delivering it. The server starts one when
 * SMTP_URL is unset, and the mail worker sends there, so the demo and a fresh install show their
 * e-mails on the mail outbox screen without any mail server. It listens on 127.0.0.1 only and
 * accepts no authentication: nothing outside the machine can reach it.
 */
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { caughtMails } from './caught-mail';

/** A running catcher. */
export interface MailCatcher {
  host: string;
  port: number;
  /** Stops accepting connections and waits for open ones to end. */
  close(): Promise<void>;
}

/** Settings of {@link startMailCatcher}. */
export interface MailCatcherOptions {
  /** 0 (default) picks a free port. */
  port?: number;
  host?: string;
  /** Largest message accepted; bigger ones are refused with SMTP 552. */
  maxByteLength?: number;
}

/** Largest message the catcher keeps: build e-mails are a few kilobytes; this leaves room. */
export const CATCHER_MAX_BYTE_LENGTH = 5 * 1024 * 1024;

/**
 * Starts a catcher and resolves once it listens.
 * @throws the listen error (e.g. `EADDRINUSE` when MAIL_CATCHER_PORT is taken).
 */
export async function startMailCatcher(options: MailCatcherOptions = {}): Promise<MailCatcher> {
  const host = options.host ?? '127.0.0.1';
  const maxByteLength = options.maxByteLength ?? CATCHER_MAX_BYTE_LENGTH;
  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    logger: false,
    banner: 'Orientry mail catcher',
    size: maxByteLength,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        if (stream.sizeExceeded) {
          callback(Object.assign(new Error(`Message larger than ${maxByteLength} bytes`), { responseCode: 552 }));
          return;
        }
        const envelope = {
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          to: session.envelope.rcptTo.map((recipient) => recipient.address)
        };
        storeMessage(Buffer.concat(chunks), envelope).then(
          () => callback(),
          (error: unknown) => {
            // 451 asks the sender to try again later, so a database hiccup loses nothing.
            console.error('Orientry mail catcher: could not store a message.', error);
            callback(Object.assign(new Error('Could not store the message; try again later'), { responseCode: 451 }));
          }
        );
      });
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  // After start-up, a broken connection is the client's problem; log it and keep listening.
  server.on('error', (error) => console.error('Orientry mail catcher:', error));
  const { port } = server.server.address() as AddressInfo;
  return {
    host,
    port,
    close: () => new Promise<void>((resolve) => server.close(() => resolve()))
  };
}

async function storeMessage(raw: Buffer, envelope: { from: string | null; to: string[] }): Promise<void> {
  const parsed = await simpleParser(raw, { skipTextToHtml: true, skipImageLinks: true, skipTextLinks: true });
  const headerEnd = raw.indexOf('\r\n\r\n');
  const headersText = raw.subarray(0, headerEnd >= 0 ? headerEnd : raw.length).toString('utf8');
  await caughtMails().create({
    messageId: parsed.messageId ? parsed.messageId.replace(/^<|>$/g, '') : null,
    envelopeFrom: envelope.from,
    envelopeTo: JSON.stringify(envelope.to),
    subject: parsed.subject ?? '',
    fromText: addressText(parsed.from),
    toText: addressText(parsed.to),
    headersText,
    textBody: parsed.text ?? null,
    htmlBody: typeof parsed.html === 'string' ? parsed.html : null,
    byteLength: raw.byteLength,
    receivedAt: new Date()
  });
}

function addressText(address: AddressObject | AddressObject[] | undefined): string {
  if (!address) return '';
  return (Array.isArray(address) ? address : [address]).map((entry) => entry.text).join(', ');
}
