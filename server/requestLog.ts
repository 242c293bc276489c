/**
 * One log line per request (pino-http) and the request id that ties a response to its line.
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

import type { Response } from 'express';
import type { Logger } from 'pino';
import { pinoHttp, type HttpLogger } from 'pino-http';

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

type RawRequest = IncomingMessage & { originalUrl?: string };

/** The ingest route stores the authenticated sensor here (server/routes/ingest.ts). */
function sensorIdOf(res: ServerResponse): string | undefined {
  const locals = (res as Partial<Response>).locals;
  return (locals?.sensor as { sensorId?: string } | undefined)?.sensorId;
}

/** `line` is pino-http's own fresh object for this request; adding to it avoids a copy. */
function withSensor(res: ServerResponse, line: Record<string, unknown>): object {
  const sensorId = sensorIdOf(res);
  if (sensorId) line.sensorId = sensorId;
  return line;
}

export function requestLogger(logger: Logger): HttpLogger {
  return pinoHttp({
    logger: logger.child({ component: 'http' }),
    genReqId: requestIdOf,
    wrapSerializers: false,
    serializers: {
      req: (req: RawRequest) => ({
        id: req.id,
        method: req.method,
        url: safeUrl(req.originalUrl ?? req.url ?? ''),
      }),
      res: (res: ServerResponse) => ({ statusCode: res.statusCode }),
    },
    customLogLevel: (_req, res, err) =>
      err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info',
    customSuccessObject: (_req, res, line) => withSensor(res, line as Record<string, unknown>),
    // pino-http invents an Error ("failed with status code 500") when none was attached; the
    // error handler attaches the real one as `res.err`, and only that is worth a stack trace.
    customErrorObject: (_req, res, err, line) => {
      const { err: _invented, ...rest } = line as Record<string, unknown>;
      const real =
        (res as { err?: unknown }).err ??
        (err.message.startsWith('failed with status code') ? undefined : err);
      return withSensor(res, real === undefined ? rest : { ...rest, err: real });
    },
  });
}
