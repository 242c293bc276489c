/**
 * Mail as configured: a relay named by SMTP_HOST, or else our own SMTP server on loopback
 * whose messages stay in memory (and show at /dev/outbox when DEV_OUTBOX=true).
 */
import type { Logger } from '../logger';

import { startLocalSmtpServer } from './localSmtp';
import { createMailer, type Mailer } from './mailer';
import { createOutbox, type Outbox } from './outbox';

export interface MailSetup {
  mailer: Mailer;
  /** Present when the local SMTP server receives the mail. */
  outbox?: Outbox;
  describe: string;
  close(): Promise<void>;
}

export async function startMail(
  config: {
    smtpHost?: string;
    smtpPort?: number;
    from: string;
  },
  logger: Logger,
): Promise<MailSetup> {
  if (config.smtpHost) {
    const host = config.smtpHost;
    const port = config.smtpPort ?? 587;
    const loopback = host === 'localhost' || host.startsWith('127.') || host === '::1';
    return {
      mailer: createMailer({
        from: config.from,
        target: Promise.resolve({ host, port, requireTls: !loopback }),
      }),
      describe: `mail goes to SMTP ${host}:${port}`,
      close: async () => {},
    };
  }
  const outbox = createOutbox();
  const local = await startLocalSmtpServer({ outbox, logger, port: config.smtpPort ?? 0 });
  return {
    mailer: createMailer({
      from: config.from,
      target: Promise.resolve({ host: local.host, port: local.port, requireTls: false }),
    }),
    outbox,
    describe: `mail goes to the local SMTP server on ${local.host}:${local.port} (kept in memory)`,
    close: local.close,
  };
}
