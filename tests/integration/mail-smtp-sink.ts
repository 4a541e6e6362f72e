/**
 * An SMTP server on loopback for the mail tests: it keeps every message it accepts, raw and parsed
 * with mailparser, so tests assert on the MIME a real mail server would get. It can refuse
 * recipients (to test retries and permanent failures) and listen on a chosen port (to come up
 * after the sender has already tried it).
 */
import type { AddressInfo } from 'node:net';
import { simpleParser, type ParsedMail } from 'mailparser';
import { SMTPServer } from 'smtp-server';

/** One accepted message. */
export interface SinkMessage {
  raw: string;
  parsed: ParsedMail;
  envelopeTo: string[];
}

/** A running sink. */
export interface SmtpSink {
  port: number;
  url: string;
  messages: SinkMessage[];
  /** Waits until at least `count` messages arrived (default 10 s), then returns them all. */
  waitFor(count: number, timeoutMs?: number): Promise<SinkMessage[]>;
  close(): Promise<void>;
}

/** Options of {@link startSmtpSink}. */
export interface SmtpSinkOptions {
  port?: number;
  /** Refuses each recipient with this SMTP code and text, e.g. `[451, 'Try later']`. */
  refuseWith?: [number, string];
}

/** Starts a sink on 127.0.0.1 (plain SMTP, no TLS, no authentication). */
export async function startSmtpSink(options: SmtpSinkOptions = {}): Promise<SmtpSink> {
  const messages: SinkMessage[] = [];
  const server = new SMTPServer({
    secure: false,
    disabledCommands: ['STARTTLS'],
    authOptional: true,
    logger: false,
    onRcptTo(address, _session, callback) {
      if (!options.refuseWith) return callback();
      const [code, text] = options.refuseWith;
      callback(Object.assign(new Error(`${text} (${address.address})`), { responseCode: code }));
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        simpleParser(raw).then(
          (parsed) => {
            messages.push({
              raw: raw.toString('utf8'),
              parsed,
              envelopeTo: session.envelope.rcptTo.map((recipient) => recipient.address)
            });
            callback();
          },
          (error: Error) => callback(error)
        );
      });
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;
  return {
    port,
    url: `smtp://127.0.0.1:${port}`,
    messages,
    async waitFor(count, timeoutMs = 10_000) {
      const deadline = Date.now() + timeoutMs;
      while (messages.length < count) {
        if (Date.now() > deadline) {
          throw new Error(`Expected ${count} e-mails within ${timeoutMs} ms, got ${messages.length}.`);
        }
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
      return messages;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve()))
  };
}
