/** Server configuration, read from the environment once at start-up and validated. */
import { z } from 'zod';

import { DEFAULT_QUERY_TIMEOUT_MS, DEFAULT_STATEMENT_TIMEOUT_MS } from '@/db';

import { DEFAULT_MAX_PENDING_ROWS } from './readings/writer';

const envSchema = z.object({
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'DATABASE_URL must be a postgres:// URL'),
  // A slow database answers 503 after these instead of holding requests (see db/index.ts).
  DB_STATEMENT_TIMEOUT_MS: z.coerce.number().int().min(100).default(DEFAULT_STATEMENT_TIMEOUT_MS),
  DB_QUERY_TIMEOUT_MS: z.coerce.number().int().min(100).default(DEFAULT_QUERY_TIMEOUT_MS),
  // Readings accepted but not yet committed, at most; past it ingest answers 503 busy.
  INGEST_MAX_PENDING_ROWS: z.coerce.number().int().min(1000).default(DEFAULT_MAX_PENDING_ROWS),
  PORT: z.coerce.number().int().min(0).max(65535).default(8080),
  HOST: z.string().default('127.0.0.1'),
  // Signs session tokens; every instance behind one load balancer must share it.
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters'),
  // Set when served over HTTPS so the session cookie is marked Secure.
  COOKIE_SECURE: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  WEB_DIR: z.string().optional(),
  // Outgoing mail. Without SMTP_HOST the server runs its own SMTP server on loopback and keeps
  // what it receives in memory (see server/mail/); DEV_OUTBOX=true shows it at /dev/outbox.
  SMTP_HOST: z.string().min(1).optional(),
  SMTP_PORT: z.coerce.number().int().min(0).max(65535).optional(),
  MAIL_FROM: z.string().min(3).default('Drybench <no-reply@drybench.example>'),
  // Where people reach the app; links in e-mail point here.
  PUBLIC_URL: z
    .url({ protocol: /^https?$/, error: 'PUBLIC_URL must be an http(s) URL' })
    .optional(),
  DEV_OUTBOX: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
});

export interface Config {
  databaseUrl: string;
  statementTimeoutMs: number;
  queryTimeoutMs: number;
  ingestMaxPendingRows: number;
  port: number;
  host: string;
  sessionSecret: string;
  cookieSecure: boolean;
  webDir?: string;
  mail: {
    /** Absent: use the in-process local SMTP server. */
    smtpHost?: string;
    smtpPort?: number;
    from: string;
  };
  /** Origin of the app as people reach it, without a trailing slash. */
  publicUrl: string;
  devOutbox: boolean;
}

// The server's statement_timeout should fire first: it cancels the statement on the database
// too, where the client-side limit only stops waiting for it.
const checkedEnvSchema = envSchema.refine(
  (e) => e.DB_STATEMENT_TIMEOUT_MS < e.DB_QUERY_TIMEOUT_MS,
  {
    path: ['DB_QUERY_TIMEOUT_MS'],
    message: 'DB_QUERY_TIMEOUT_MS must be longer than DB_STATEMENT_TIMEOUT_MS',
  },
);

export function readConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = checkedEnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  return {
    databaseUrl: e.DATABASE_URL,
    statementTimeoutMs: e.DB_STATEMENT_TIMEOUT_MS,
    queryTimeoutMs: e.DB_QUERY_TIMEOUT_MS,
    ingestMaxPendingRows: e.INGEST_MAX_PENDING_ROWS,
    port: e.PORT,
    host: e.HOST,
    sessionSecret: e.SESSION_SECRET,
    cookieSecure: e.COOKIE_SECURE,
    webDir: e.WEB_DIR,
    mail: { smtpHost: e.SMTP_HOST, smtpPort: e.SMTP_PORT, from: e.MAIL_FROM },
    publicUrl: (e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/+$/, ''),
    devOutbox: e.DEV_OUTBOX,
  };
}
