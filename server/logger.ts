/**
 * The server's one logger (pino), created once in server/index.ts from LOG_LEVEL and passed
 * down; each module takes a child with its `component` (http, alarms, jobs, live, mail, server).
 * One JSON object per line, which a log shipper reads as is; pino-pretty only when a person
 * watches a terminal.
 *
 * What must never reach a log — bearer tokens, cookies, passwords, link tokens — is kept out in
 * two layers: the request serializers (server/requestLog.ts) log no headers and no bodies, and
 * `redact` below blanks the same fields wherever else an object carrying them is logged.
 */
import type { Writable } from 'node:stream';

import { pino, type DestinationStream, type LevelWithSilent, type Logger } from 'pino';
import PinoPretty from 'pino-pretty';

export type { Logger };

export const REDACTED = '[redacted]';

// Exact paths only: a wildcard (`*.password`) makes pino walk every key of every line, on the
// ingest path too, and the request lines never hold these fields anyway (their serializers leave
// headers and bodies out). A person's input, if ever logged, goes under `body`: blanked whole.
const REDACT_PATHS = [
  'headers.authorization',
  'headers.cookie',
  'headers["set-cookie"]',
  'req.headers.authorization',
  'req.headers.cookie',
  'res.headers["set-cookie"]',
  'body',
  'req.body',
  'password',
  'token',
];

export interface LoggerOptions {
  level: LevelWithSilent;
  /** Human-readable lines (pino-pretty) instead of JSON; index.ts sets it when stdout is a TTY. */
  pretty?: boolean;
  /** Where lines go; stdout when omitted. Tests pass a stream they read. */
  destination?: DestinationStream | Writable;
}

export function createLogger(options: LoggerOptions): Logger {
  const config = {
    level: options.level,
    redact: { paths: REDACT_PATHS, censor: REDACTED },
  };
  if (options.pretty) {
    const pretty = PinoPretty({
      destination: options.destination ?? 1,
      colorize: options.destination === undefined,
      ignore: 'pid,hostname',
      translateTime: 'SYS:HH:MM:ss.l',
      // The terminal is the only reader; a synchronous write keeps lines before process.exit.
      sync: true,
    });
    return pino(config, pretty);
  }
  if (options.destination) return pino(config, options.destination);
  // Asynchronous writes to stdout: lines that arrive while one write is in flight go out together
  // in the next. Synchronous writes to a pipe whose reader lags (a log shipper, the bench) cost
  // ~0.6 ms of CPU per request line in retries (npm run bench: 1,713 against 1,083 µs per
  // one-reading request). The price: a crash can lose the last lines; a normal exit flushes them.
  const stdout = pino.destination({ dest: 1, sync: false });
  process.on('exit', () => {
    try {
      stdout.flushSync();
    } catch {
      // A write still in flight at exit: what it holds is already on its way to the kernel.
    }
  });
  return pino(config, stdout);
}

/** For code paths (and tests) that must log nowhere. */
export function silentLogger(): Logger {
  return pino({ level: 'silent' });
}
