/**
 * A real SMTP server on loopback (the `smtp-server` package) that parses each message it is
 * given and keeps it in an Outbox. `npm start` and the tests send mail through it with the
 * same nodemailer transport production uses against a real relay.
 */
import type { AddressInfo } from 'node:net';

import type { AddressObject } from 'mailparser';

import type { Logger } from '../logger';

import type { Outbox } from './outbox';

export interface LocalSmtpServer {
  host: string;
  port: number;
  close(): Promise<void>;
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);
}

export async function startLocalSmtpServer(options: {
  outbox: Outbox;
  logger: Logger;
  host?: string;
  /** 0 picks a free port. */
  port?: number;
}): Promise<LocalSmtpServer> {
  const host = options.host ?? '127.0.0.1';
  const log = options.logger.child({ component: 'mail' });
  // Loaded here, not at start: a server that relays to SMTP_HOST never needs either, and the two
  // hold ~8 MB of heap for good once loaded (README, issue 13's memory row).
  const [{ SMTPServer }, { simpleParser }] = await Promise.all([
    import('smtp-server'),
    import('mailparser'),
  ]);
  const server = new SMTPServer({
    // Loopback only, no certificate: plain SMTP without authentication, like a local relay.
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    // A week report's PDF (a page per few zones, the font embedded) rides along, base64 encoded.
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const to = addresses(parsed.to);
          const stored = options.outbox.add({
            receivedAt: new Date().toISOString(),
            from: addresses(parsed.from)[0] ?? '',
            to,
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
            attachments: parsed.attachments.map((a) => ({
              filename: a.filename ?? '',
              contentType: a.contentType,
              content: a.content,
            })),
          });
          // Never the text: reset and invitation mails carry their link in it.
          log.debug(
            { outboxId: stored.id, recipients: to.length },
            'local SMTP: kept a message in the outbox',
          );
          callback();
        })
        .catch((err: unknown) => {
          log.warn({ err }, 'local SMTP: could not parse a message; refused it');
          callback(err instanceof Error ? err : new Error(String(err)));
        });
    },
  });
  // A client that misbehaves (drops mid-message) costs its own session, not the server.
  server.on('error', (err) => log.warn({ err }, 'local SMTP: connection error'));
  await new Promise<void>((resolve, reject) => {
    server.server.once('error', reject);
    server.listen(options.port ?? 0, host, () => resolve());
  });
  // Tests and the demo stop by closing the app; the mail server must not keep them alive.
  server.server.unref();
  const { port } = server.server.address() as AddressInfo;
  return {
    host,
    port,
    close: () => new Promise((resolve) => server.close(() => resolve())),
  };
}
