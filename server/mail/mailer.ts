/** Sends mail over SMTP with nodemailer: the local server in development, a relay in production. */
import nodemailer from 'nodemailer';

/** A file sent with a message (the week report's PDF). */
export interface MailAttachment {
  filename: string;
  contentType: string;
  content: Buffer;
}

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
  attachments?: MailAttachment[];
}

export interface Mailer {
  send(message: MailMessage): Promise<void>;
}

export interface SmtpTarget {
  host: string;
  port: number;
  /** Plain SMTP is only for loopback; a remote relay gets STARTTLS. */
  requireTls: boolean;
}

/** `target` may still be starting (the local server binds a free port first). */
export function createMailer(options: { from: string; target: Promise<SmtpTarget> }): Mailer {
  const transport = options.target.then((t) =>
    nodemailer.createTransport({
      host: t.host,
      port: t.port,
      secure: false,
      ignoreTLS: !t.requireTls,
      requireTLS: t.requireTls,
      // A mail relay that hangs must not hold a request for minutes.
      connectionTimeout: 5_000,
      greetingTimeout: 5_000,
      socketTimeout: 10_000,
    }),
  );
  return {
    async send(message) {
      await (await transport).sendMail({ from: options.from, ...message });
    },
  };
}
