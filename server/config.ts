/** Server configuration, read from the environment once at start-up and validated. */
import net from 'node:net';

import { z } from 'zod';

import { DEFAULT_QUERY_TIMEOUT_MS, DEFAULT_STATEMENT_TIMEOUT_MS } from '@/db';

import { DEFAULT_RAW_READINGS_KEEP_MONTHS } from './jobs/readingPartitionsJob';
import { DEFAULT_MAX_PENDING_ROWS } from './readings/writer';
import type { StorageConfig } from './storage';

/** What Express's `trust proxy` setting receives: off, every hop, a hop count, or addresses. */
export type TrustProxy = boolean | number | string[];

// proxy-addr's names for address ranges, accepted in a TRUST_PROXY list as Express accepts them.
const PROXY_RANGE_NAMES = new Set(['loopback', 'linklocal', 'uniquelocal']);

/** An address (`10.0.0.2`), a subnet (`10.0.0.0/8`, `fd00::/8`) or one of proxy-addr's names. */
function isProxyAddress(entry: string): boolean {
  if (PROXY_RANGE_NAMES.has(entry)) return true;
  const [address = '', prefix, ...rest] = entry.split('/');
  const family = net.isIP(address);
  if (family === 0 || rest.length > 0) return false;
  if (prefix === undefined) return true;
  if (!/^\d{1,3}$/.test(prefix)) return false;
  return Number(prefix) <= (family === 4 ? 32 : 128);
}

const trustProxyField = z
  .string()
  .trim()
  .default('false')
  .transform((text, ctx): TrustProxy => {
    if (text === 'false' || text === '') return false;
    if (text === 'true') return true;
    if (/^\d+$/.test(text)) return Number(text);
    const entries = text.split(',').map((e) => e.trim());
    const bad = entries.filter((e) => !isProxyAddress(e));
    if (bad.length > 0) {
      ctx.addIssue({
        code: 'custom',
        message:
          'TRUST_PROXY takes false, true, a hop count or a comma list of addresses and subnets ' +
          `(e.g. 10.0.0.0/8,loopback); not ${bad.map((b) => JSON.stringify(b)).join(', ')}`,
      });
      return z.NEVER;
    }
    return entries;
  });

const booleanText = z.enum(['true', 'false']).transform((v) => v === 'true');

export const LOG_LEVELS = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const;
export type LogLevel = (typeof LOG_LEVELS)[number];

const envSchema = z.object({
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'DATABASE_URL must be a postgres:// URL'),
  // A slow database answers 503 after these instead of holding requests (see db/index.ts).
  DB_STATEMENT_TIMEOUT_MS: z.coerce.number().int().min(100).default(DEFAULT_STATEMENT_TIMEOUT_MS),
  DB_QUERY_TIMEOUT_MS: z.coerce.number().int().min(100).default(DEFAULT_QUERY_TIMEOUT_MS),
  // Readings accepted but not yet committed, at most; past it ingest answers 503 busy.
  INGEST_MAX_PENDING_ROWS: z.coerce.number().int().min(1000).default(DEFAULT_MAX_PENDING_ROWS),
  // Whole months of raw readings kept; older month partitions are dropped by the daily job
  // (server/jobs/readingPartitionsJob.ts). Hourly roll-ups are kept for ever.
  RAW_READINGS_KEEP_MONTHS: z.coerce
    .number()
    .int()
    .min(1)
    .max(1200)
    .default(DEFAULT_RAW_READINGS_KEEP_MONTHS),
  PORT: z.coerce.number().int().min(0).max(65535).default(8080),
  // Loopback by default: reaching the server from other machines is a decision (README).
  HOST: z.string().min(1).default('127.0.0.1'),
  NODE_ENV: z.string().optional(),
  // Signs session tokens; every instance behind one load balancer must share it.
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters'),
  // Secure session cookie; unset, it follows PUBLIC_URL (https → Secure).
  COOKIE_SECURE: booleanText.optional(),
  WEB_DIR: z.string().optional(),
  // Outgoing mail. Without SMTP_HOST the server runs its own SMTP server on loopback and keeps
  // what it receives in memory (see server/mail/); DEV_OUTBOX=true shows it at /dev/outbox.
  SMTP_HOST: z.string().min(1).optional(),
  SMTP_PORT: z.coerce.number().int().min(0).max(65535).optional(),
  MAIL_FROM: z.string().min(3).default('Drybench <no-reply@drybench.example>'),
  // Where people reach the app; links in e-mail point here and its host is an allowed Host.
  PUBLIC_URL: z
    .url({ protocol: /^https?$/, error: 'PUBLIC_URL must be an http(s) URL' })
    .optional(),
  DEV_OUTBOX: booleanText.default(false),
  // Which reverse proxies may name the client's address in X-Forwarded-For (rate limits).
  TRUST_PROXY: trustProxyField,
  // Open live sockets per account on one instance (default in server/live/hub.ts); the bench
  // raises it, its hundreds of sockets being one account's.
  LIVE_SOCKETS_PER_USER: z.coerce.number().int().min(1).optional(),
  // How much the server logs (server/logger.ts): one JSON line per request at info.
  LOG_LEVEL: z
    .string()
    .trim()
    .toLowerCase()
    .pipe(z.enum(LOG_LEVELS, { error: `LOG_LEVEL must be one of ${LOG_LEVELS.join(', ')}` }))
    .default('info'),
  // Photo storage over the S3 API (server/storage/). Unset, photo uploads answer 503;
  // `npm start` and the tests point these at a local fake.
  S3_ENDPOINT: z
    .url({ protocol: /^https?$/, error: 'S3_ENDPOINT must be an http(s) URL' })
    .optional(),
  S3_BUCKET: z.string().min(3).optional(),
  S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  S3_REGION: z.string().min(1).default('us-east-1'),
  // MQTT ingest (server/mqtt/): the broker the server subscribes to; unset, MQTT is off.
  MQTT_URL: z
    .url({ protocol: /^mqtts?$/, error: 'MQTT_URL must be an mqtt:// or mqtts:// URL' })
    .optional(),
  // The service account's password (shared with the broker); else the one in MQTT_URL.
  MQTT_PASSWORD: z.string().min(16).optional(),
  // The broker address sensors are shown on the Sensors page; else derived (mqttPublicUrlOf).
  MQTT_PUBLIC_URL: z
    .url({ protocol: /^mqtts?$/, error: 'MQTT_PUBLIC_URL must be an mqtt:// or mqtts:// URL' })
    .optional(),
  // Connections to the broker: mqtt handles one message per connection at a time, so these
  // bound the messages being stored at once. 16: at 200 messages/s 4 were saturated whenever a
  // store took over 20 ms (a busy machine) and messages queued for seconds
  // (scripts/bench/FINDINGS.md, MQTT).
  MQTT_CONNECTIONS: z.coerce.number().int().min(1).max(32).default(16),
});

export interface Config {
  databaseUrl: string;
  statementTimeoutMs: number;
  queryTimeoutMs: number;
  ingestMaxPendingRows: number;
  /** Whole months of raw readings kept (RAW_READINGS_KEEP_MONTHS). */
  rawReadingsKeepMonths: number;
  port: number;
  host: string;
  /** NODE_ENV=production. */
  production: boolean;
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
  /** PUBLIC_URL was set (not derived from HOST and PORT). */
  publicUrlSet: boolean;
  /** Show the local SMTP server's mail at /dev/outbox (asked for, and allowed here). */
  devOutbox: boolean;
  /** Why DEV_OUTBOX=true was overruled, for the start-up log; null when it was not. */
  devOutboxRefusal: string | null;
  trustProxy: TrustProxy;
  /** Absent: the live hub's default. */
  liveSocketsPerUser?: number;
  logLevel: LogLevel;
  /** Where photos are stored; absent when S3_BUCKET is not set. */
  storage?: StorageConfig;
  /** MQTT ingest; absent when MQTT_URL is not set. */
  mqtt?: MqttConfig;
}

export interface MqttConfig {
  url: string;
  password?: string;
  /** What sensors are told to connect to (no credentials in it). */
  publicUrl: string;
  connections: number;
}

/** 127.0.0.0/8, ::1 and the name localhost: addresses only this machine can reach. */
export function isLoopbackHost(host: string): boolean {
  const bare = host.replace(/^\[(.*)\]$/, '$1').toLowerCase();
  if (bare === 'localhost') return true;
  if (net.isIPv4(bare)) return bare.startsWith('127.');
  if (net.isIPv6(bare)) {
    const blocks = new net.BlockList();
    blocks.addAddress('::1', 'ipv6');
    blocks.addSubnet('::ffff:127.0.0.0', 104, 'ipv6');
    return blocks.check(bare, 'ipv6');
  }
  return false;
}

/**
 * The dev outbox lists every e-mail the server sent, password-reset links included, to anyone
 * who can load the page: so only on a loopback listen address and never in production.
 */
export function devOutboxAllowed(c: { host: string; production: boolean }): boolean {
  return isLoopbackHost(c.host) && !c.production;
}

// The server's statement_timeout should fire first: it cancels the statement on the database
// too, where the client-side limit only stops waiting for it.
const checkedEnvSchema = envSchema
  .refine((e) => e.DB_STATEMENT_TIMEOUT_MS < e.DB_QUERY_TIMEOUT_MS, {
    path: ['DB_QUERY_TIMEOUT_MS'],
    message: 'DB_QUERY_TIMEOUT_MS must be longer than DB_STATEMENT_TIMEOUT_MS',
  })
  .refine(
    // Half a storage setting would fail at the first upload; say so at start-up instead.
    (e) =>
      e.S3_BUCKET === undefined ||
      (e.S3_ACCESS_KEY_ID !== undefined && e.S3_SECRET_ACCESS_KEY !== undefined),
    {
      path: ['S3_BUCKET'],
      message: 'S3_BUCKET needs S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY',
    },
  )
  .refine(
    // The broker refuses the service account without one: say so at start-up.
    (e) =>
      e.MQTT_URL === undefined || e.MQTT_PASSWORD !== undefined || new URL(e.MQTT_URL).password,
    {
      path: ['MQTT_PASSWORD'],
      message: 'MQTT_URL needs MQTT_PASSWORD (or a password in the URL) for the service account',
    },
  );

export function readConfig(
  env: Readonly<Record<string, string | undefined>> = process.env,
): Config {
  const parsed = checkedEnvSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  const production = e.NODE_ENV === 'production';
  const publicUrl = (e.PUBLIC_URL ?? `http://${hostInUrl(e.HOST)}:${e.PORT}`).replace(/\/+$/, '');
  const outboxAllowed = devOutboxAllowed({ host: e.HOST, production });
  return {
    databaseUrl: e.DATABASE_URL,
    statementTimeoutMs: e.DB_STATEMENT_TIMEOUT_MS,
    queryTimeoutMs: e.DB_QUERY_TIMEOUT_MS,
    ingestMaxPendingRows: e.INGEST_MAX_PENDING_ROWS,
    rawReadingsKeepMonths: e.RAW_READINGS_KEEP_MONTHS,
    port: e.PORT,
    host: e.HOST,
    production,
    sessionSecret: e.SESSION_SECRET,
    cookieSecure: e.COOKIE_SECURE ?? publicUrl.startsWith('https:'),
    webDir: e.WEB_DIR,
    mail: { smtpHost: e.SMTP_HOST, smtpPort: e.SMTP_PORT, from: e.MAIL_FROM },
    publicUrl,
    publicUrlSet: e.PUBLIC_URL !== undefined,
    devOutbox: e.DEV_OUTBOX && outboxAllowed,
    devOutboxRefusal:
      e.DEV_OUTBOX && !outboxAllowed
        ? production
          ? 'DEV_OUTBOX=true ignored: the dev outbox is never shown with NODE_ENV=production.'
          : `DEV_OUTBOX=true ignored: HOST=${e.HOST} is not a loopback address, and the outbox shows password-reset links to whoever loads it.`
        : null,
    trustProxy: e.TRUST_PROXY,
    liveSocketsPerUser: e.LIVE_SOCKETS_PER_USER,
    logLevel: e.LOG_LEVEL,
    storage:
      e.S3_BUCKET !== undefined
        ? {
            endpoint: e.S3_ENDPOINT,
            bucket: e.S3_BUCKET,
            accessKeyId: e.S3_ACCESS_KEY_ID!,
            secretAccessKey: e.S3_SECRET_ACCESS_KEY!,
            region: e.S3_REGION,
          }
        : undefined,
    mqtt:
      e.MQTT_URL !== undefined
        ? {
            url: e.MQTT_URL,
            password: e.MQTT_PASSWORD,
            publicUrl: e.MQTT_PUBLIC_URL ?? mqttPublicUrlOf(e.MQTT_URL, publicUrl),
            connections: e.MQTT_CONNECTIONS,
          }
        : undefined,
  };
}

/**
 * The broker as sensors reach it when MQTT_PUBLIC_URL is not set: MQTT_URL's scheme and port
 * without its credentials, on PUBLIC_URL's host when MQTT_URL names a loopback one (the
 * server then shares a machine with the broker, and sensors reach that machine by its name).
 */
export function mqttPublicUrlOf(mqttUrl: string, publicUrl: string): string {
  const broker = new URL(mqttUrl);
  const host = isLoopbackHost(broker.hostname) ? new URL(publicUrl).hostname : broker.hostname;
  return `${broker.protocol}//${host}${broker.port ? `:${broker.port}` : ''}`;
}

/** An IPv6 literal needs brackets inside a URL. */
function hostInUrl(host: string): string {
  return net.isIPv6(host) ? `[${host}]` : host;
}
