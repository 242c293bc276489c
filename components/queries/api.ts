/**
 * The one place the app talks HTTP to /api/v1. Same origin, cookie session. Every failure
 * becomes an ApiError carrying the server's `{ error: { code, message, details } }` shape, so
 * screens can show the server's own sentence.
 */
import { earlyOk, takeEarlyAnswer } from './early';

export interface ApiErrorDetail {
  path: string;
  message: string;
}

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: ApiErrorDetail[];

  constructor(status: number, code: string, message: string, details: ApiErrorDetail[] = []) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.details = details;
  }
}

/** Status 0 stands for "no answer at all" (offline, server down, blocked). */
export const NETWORK_ERROR_STATUS = 0;

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

export function isSignedOut(error: unknown): boolean {
  return isApiError(error, 401);
}

/** The server's error body (or a plain one when the body is not the shared shape) as an ApiError. */
export function parseErrorBody(status: number, body: unknown): ApiError {
  if (typeof body === 'object' && body !== null && 'error' in body) {
    const error = (body as { error: unknown }).error;
    if (typeof error === 'object' && error !== null) {
      const { code, message, details } = error as Record<string, unknown>;
      if (typeof code === 'string' && typeof message === 'string') {
        return new ApiError(status, code, message, Array.isArray(details) ? details : []);
      }
    }
  }
  return new ApiError(
    status,
    'unexpected_response',
    `The server answered ${status}. Try again in a moment.`,
  );
}

interface RequestOptions {
  method?: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
}

export async function apiRequest<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const { method = 'GET', body, signal } = options;
  let response: Response;
  try {
    // The page may have asked already (early.ts); a GET's first call takes that answer.
    const early = method === 'GET' ? await earlyOk(takeEarlyAnswer(path)) : null;
    response =
      early ??
      (await fetch(path, {
        method,
        signal,
        credentials: 'same-origin',
        headers: {
          Accept: 'application/json',
          ...(body === undefined ? {} : { 'Content-Type': 'application/json' }),
        },
        body: body === undefined ? undefined : JSON.stringify(body),
      }));
  } catch (error) {
    // An abort is TanStack Query cancelling a stale request; let it through untouched.
    if (signal?.aborted) throw error;
    throw new ApiError(
      NETWORK_ERROR_STATUS,
      'network',
      'Drybench cannot be reached. Check the connection and try again.',
    );
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  let parsed: unknown = undefined;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parsed = undefined;
    }
  }
  if (!response.ok) throw parseErrorBody(response.status, parsed);
  if (parsed === undefined) {
    throw new ApiError(response.status, 'unexpected_response', 'The server sent an empty answer.');
  }
  return parsed as T;
}

/**
 * POSTs one file as a multipart field, with the session cookie. The browser sets the multipart
 * Content-Type with its boundary itself, so none is given here. A refusal comes back as the
 * server's own ApiError (413 too large, 415 not the right kind, 400 a file it cannot read).
 */
export async function apiUpload<T>(
  path: string,
  field: string,
  file: Blob,
  filename: string,
): Promise<T> {
  const body = new FormData();
  body.append(field, file, filename);
  let response: Response;
  try {
    response = await fetch(path, {
      method: 'POST',
      credentials: 'same-origin',
      headers: { Accept: 'application/json' },
      body,
    });
  } catch {
    throw new ApiError(
      NETWORK_ERROR_STATUS,
      'network',
      'Drybench cannot be reached. Check the connection and try again.',
    );
  }
  const parsed: unknown = await response.json().catch(() => undefined);
  if (!response.ok) throw parseErrorBody(response.status, parsed);
  return parsed as T;
}
