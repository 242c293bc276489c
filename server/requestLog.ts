/**
 * One log line per request and the request id that ties a response to its line.
 *
 * The id comes from the caller's `X-Request-Id` when it is a short safe token (a proxy or a
 * sensor can then follow its own id through our logs), else a fresh UUID; it is sent back on
 * every response and put in 5xx error bodies (server/errors.ts), so an operator handed an error
 * finds its line.
 *
 * The line carries method, path, status, response time, the id and, for ingest, the sensor —
 * never headers or bodies (tokens, cookies, passwords), and never the secret parts of a URL:
 * link tokens in paths (/reset-password/…, /invite/…, /api/v1/invitations/…) and query values
 * whose names suggest a secret. The serializers take the raw objects (no wrapping) and do only
 * string work, because ingest, the hottest route, passes through here too.
 */
import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';

import type { RequestHandler, Response } from 'express';
import type { Logger } from 'pino';

import { REDACTED } from './logger';

export const REQUEST_ID_HEADER = 'X-Request-Id';

/** What we accept from a caller: short, and nothing that could forge or break a log line. */
const SAFE_REQUEST_ID = /^[A-Za-z0-9._-]{1,64}$/;

/** The segment after these is a link token (reset and invitation links, the invitation API). */
const TOKEN_SEGMENT = /(\/(?:reset-password|invite|invitations)\/)[^/?#]+/gi;
/** Query names that may carry a secret; their values are blanked. */
const SECRET_QUERY_NAME = /token|pass|secret|key|code|sig|auth|session/i;
// Routes under a shop name invitations by their id, which is not a secret.
const SHOP_INVITATION = /^\/api\/v1\/shops\/[^/]+\/invitations\/[^/?#]+$/i;

export function requestIdOf(req: IncomingMessage, res: ServerResponse): string {
  const given = req.headers['x-request-id'];
  const id = typeof given === 'string' && SAFE_REQUEST_ID.test(given) ? given : randomUUID();
  res.setHeader(REQUEST_ID_HEADER, id);
  return id;
}

function safeQuery(query: string): string {
  return query
    .split('&')
    .map((pair) => {
      const eq = pair.indexOf('=');
      const rawName = eq === -1 ? pair : pair.slice(0, eq);
      let name: string;
      try {
        name = decodeURIComponent(rawName.replace(/\+/g, ' '));
      } catch {
        return `${rawName.slice(0, 32)}=${REDACTED}`; // undecodable: blank it rather than guess
      }
      return SECRET_QUERY_NAME.test(name) && eq !== -1 ? `${rawName}=${REDACTED}` : pair;
    })
    .join('&');
}

/** The URL as it may be logged: link tokens in the path and secret query values blanked. */
export function safeUrl(url: string): string {
  const q = url.indexOf('?');
  const path = q === -1 ? url : url.slice(0, q);
  const safePath = SHOP_INVITATION.test(path) ? path : path.replace(TOKEN_SEGMENT, `$1${REDACTED}`);
  return q === -1 ? safePath : `${safePath}?${safeQuery(url.slice(q + 1))}`;
}

declare module 'node:http' {
  interface IncomingMessage {
    /** This request's id (requestIdOf), set before any route runs. */
    id?: string;
  }
}

/** The ingest route stores the authenticated sensor here (server/routes/ingest.ts). */
function sensorIdOf(res: ServerResponse): string | undefined {
  const locals = (res as Partial<Response>).locals;
  return (locals?.sensor as { sensorId?: string } | undefined)?.sensorId;
}

/**
 * The request's line when its response ends (or its connection closes first): what pino-http
 * wrote, without the two child loggers pino-http makes for every request to carry `req` (one
 * serialises and redacts the request's fields up front, for a `req.log` nothing here uses).
 * Under `npm run bench`'s loaded phase (1,000 one-reading requests a second) pino-http's own
 * functions took ~4.9 % of the server's thread (scripts/bench/FINDINGS.md, "The loaded live
 * latency").
 */
export function requestLogger(logger: Logger): RequestHandler {
  const log = logger.child({ component: 'http' });
  return (req, res, next) => {
    const startMs = Date.now();
    req.id = requestIdOf(req, res);
    let logged = false;
    const done = (err?: unknown) => {
      if (logged) return;
      logged = true;
      res.off('finish', done);
      res.off('close', done);
      res.off('error', done);
      const line: Record<string, unknown> = {
        req: { id: req.id, method: req.method, url: safeUrl(req.originalUrl ?? req.url ?? '') },
        res: { statusCode: res.statusCode },
      };
      // The error handler attaches the real error as `res.err` (server/errors.ts): a 5xx
      // without one logs no invented error, only the status.
      const real = (res as { err?: unknown }).err ?? err;
      const failed = real !== undefined || res.statusCode >= 500;
      if (real !== undefined) line.err = real;
      line.responseTime = Date.now() - startMs;
      const sensorId = sensorIdOf(res);
      if (sensorId) line.sensorId = sensorId;
      if (failed) return void log.error(line, 'request errored');
      log[res.statusCode >= 400 ? 'warn' : 'info'](
        line,
        !req.readableAborted && res.writableEnded ? 'request completed' : 'request aborted',
      );
    };
    res.on('finish', done);
    res.on('close', done);
    res.on('error', done);
    next();
  };
}
