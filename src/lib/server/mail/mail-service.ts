/**
 * Mail for one server process: registers the build-mail hook, picks where mail goes and runs the
 * worker. With SMTP_URL, mail goes to that server. Without it, the process starts its own mail
 * catcher on 127.0.0.1 (MAIL_CATCHER_PORT, default a free port) and sends there, so every message
 * lands on the mail outbox screen. Processes sharing a database each run a worker; leases keep
 * them from sending a message twice, and caught messages from every catcher meet in the database.
 */
import { getConfig, type ServerConfig } from '../config';
import { onBuildStored } from '../ingest/build-stored-hooks';
import { queueBuildMail } from './build-mail-hook';
import { startMailCatcher, type MailCatcher } from './mail-catcher';
import { createMailTransport, type MailTarget } from './mail-transport';
import { MailWorker } from './mail-worker';
import * as outbox from './outbox';

/** The running mail parts of this process. */
export interface MailService {
  worker: MailWorker;
  /** The local catcher, when this process started one. */
  catcher: MailCatcher | null;
  /** Where mail goes, for the start-up line (credentials masked). */
  description: string;
  /** Stops the worker (after the message in flight) and the catcher, and unregisters the hook. */
  stop(): Promise<void>;
}

let running: Promise<MailService> | undefined;

/** Starts mail once per process (later calls share the first); resolves when the catcher listens. */
export function startMailService(config: ServerConfig = getConfig()): Promise<MailService> {
  running ??= start(config).catch((error: unknown) => {
    running = undefined;
    throw error;
  });
  return running;
}

/** Stops the process's mail service, if started. */
export async function stopMailService(): Promise<void> {
  const service = running;
  running = undefined;
  if (service) await (await service).stop();
}

async function start(config: ServerConfig): Promise<MailService> {
  let catcher: MailCatcher | null = null;
  let target: MailTarget;
  let description: string;
  if (config.mail.smtpUrl) {
    target = { smtpUrl: config.mail.smtpUrl };
    description = `sending through ${maskedUrl(config.mail.smtpUrl)}`;
  } else {
    const port = config.mail.catcherPort;
    try {
      catcher = await startMailCatcher({ port });
      target = { host: catcher.host, port: catcher.port };
      description = `catching mail locally on ${catcher.host}:${catcher.port} (set SMTP_URL to deliver it)`;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EADDRINUSE' || port === 0) throw error;
      // Another server on this database already catches on the fixed port: send there.
      target = { host: '127.0.0.1', port };
      description = `sending to the mail catcher already listening on 127.0.0.1:${port}`;
    }
  }
  const worker = new MailWorker({ transport: createMailTransport(target), from: config.mail.from });
  const removeHook = onBuildStored(queueBuildMail);
  const stopWaking = outbox.onEnqueued(() => worker.wake());
  worker.start();
  return {
    worker,
    catcher,
    description,
    async stop() {
      removeHook();
      stopWaking();
      await worker.stop();
      await catcher?.close();
    }
  };
}

function maskedUrl(url: string): string {
  const parsed = new URL(url);
  if (parsed.password) parsed.password = '***';
  return parsed.toString();
}
