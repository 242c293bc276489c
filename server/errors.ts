/**
 * The shared error shape `{ error: { code, message, details } }` and the middleware that turns
 * every failure into it. Nothing here ever sends a stack trace or SQL text.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import type { ZodError } from 'zod';

export interface ErrorDetail {
  path: string;
  message: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: ErrorDetail[] = [],
  ) {
    super(message);
  }
}

/** A 503 the caller should repeat after a pause; the answer carries `Retry-After`. */
export class RetryLaterError extends ApiError {
  constructor(
    code: string,
    message: string,
    readonly retryAfterS: number,
  ) {
    super(503, code, message);
  }
}

export function zodDetails(error: ZodError): ErrorDetail[] {
  return error.issues.map((issue) => ({ path: issue.path.join('.'), message: issue.message }));
}

// Error codes of node-postgres / PostgreSQL that mean "the database is not reachable now" or
// "too slow now": each passes by itself, so the caller is told to retry (503), not that we broke.
const UNAVAILABLE_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  // The database's host name does not resolve or its network is down (DNS or routing blips).
  'ENOTFOUND',
  'EAI_AGAIN',
  'EHOSTUNREACH',
  'ENETUNREACH',
  '53300', // too_many_connections
  '57014', // query_canceled: our statement_timeout fired (a lock or an overloaded database)
  '57P01', // admin_shutdown
  '57P02', // crash_shutdown
  '57P03', // cannot_connect_now
  '08000',
  '08003',
  '08006',
]);

/**
 * True when a database error is transient: the database is away, unreachable or too slow now
 * (also node-postgres's own "Query read timeout" of the pool's query_timeout). Retrying the same
 * statement later can succeed; nothing is wrong with the data.
 */
export function isDatabaseUnavailable(err: unknown): boolean {
  if (typeof err !== 'object' || err === null) return false;
  const e = err as { code?: unknown; message?: unknown; cause?: unknown };
  if (typeof e.code === 'string' && UNAVAILABLE_CODES.has(e.code)) return true;
  if (
    typeof e.message === 'string' &&
    /timeout exceeded when trying to connect|Query read timeout|Connection terminated|connection error and is not queryable|the database system is (starting up|shutting down)/i.test(
      e.message,
    )
  ) {
    return true;
  }
  return e.cause !== undefined && e.cause !== err && isDatabaseUnavailable(e.cause);
}

/** zlib and brotli failures (brotli's codes read ERR__ERROR_…) while inflating a body that is not what Content-Encoding says. */
function isCompressionError(err: unknown): boolean {
  const code =
    typeof err === 'object' && err !== null ? (err as { code?: unknown }).code : undefined;
  return typeof code === 'string' && /^(Z_|ERR_BROTLI|ERR_ZLIB|ERR__ERROR_)/.test(code);
}

/** body-parser's own error types, mapped to the contract's statuses. */
function fromBodyParser(err: { type?: string }): ApiError | null {
  switch (err.type) {
    case 'entity.parse.failed':
      return new ApiError(400, 'invalid_json', 'The body is not valid JSON.');
    case 'entity.too.large':
      return new ApiError(
        413,
        'body_too_large',
        'The body is larger than 1 MiB; send fewer readings per request.',
      );
    case 'encoding.unsupported':
    case 'charset.unsupported':
      return new ApiError(415, 'unsupported_encoding', 'Send the body as UTF-8 JSON.');
    case 'request.aborted':
      return new ApiError(
        400,
        'request_aborted',
        'The request was aborted before its body arrived.',
      );
    default:
      return null;
  }
}

export function toApiError(err: unknown): ApiError {
  if (err instanceof ApiError) return err;
  if (typeof err === 'object' && err !== null && 'type' in err) {
    const mapped = fromBodyParser(err as { type?: string });
    if (mapped) return mapped;
  }
  if (isCompressionError(err)) {
    return new ApiError(
      400,
      'invalid_encoding',
      'The body could not be decompressed; check Content-Encoding.',
    );
  }
  if (isDatabaseUnavailable(err)) {
    return new ApiError(
      503,
      'storage_unavailable',
      'Storage is unavailable right now; keep the data and retry shortly.',
    );
  }
  return new ApiError(500, 'internal', 'Something went wrong on our side; it has been logged.');
}

/**
 * For a 5xx the request's id goes into `details` (an operator handed the answer finds its log
 * line by it), and the error itself is attached as `res.err`, which the request's one log line
 * (server/requestLog.ts) carries with its stack — so nothing is logged twice.
 */
export function errorHandler(): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const apiError = toApiError(err);
    const failedHere = apiError.status >= 500;
    if (failedHere) (res as { err?: unknown }).err = err;
    if (res.headersSent) return;
    if (apiError instanceof RetryLaterError) {
      res.setHeader('Retry-After', String(apiError.retryAfterS));
    }
    const requestId = typeof req.id === 'string' ? req.id : undefined;
    const details =
      failedHere && requestId
        ? [...apiError.details, { path: 'requestId', message: requestId }]
        : apiError.details;
    res.status(apiError.status).json({
      error: { code: apiError.code, message: apiError.message, details },
    });
  };
}

export const notFound: RequestHandler = (req, _res, next) => {
  next(new ApiError(404, 'not_found', `Nothing at ${req.method} ${req.path}.`));
};
