// toApiError: which failures tell the caller to retry (503 storage_unavailable) and which are
// ours (500). The errors carry the codes node-postgres and Node's resolver really use.
import { describe, expect, it } from 'vitest';

import { ApiError, isDatabaseUnavailable, RetryLaterError, toApiError } from '@/server/errors';

/** An error as node-postgres hands it over: a message and PostgreSQL's SQLSTATE or Node's code. */
function failure(message: string, code?: string): Error {
  return Object.assign(new Error(message), code ? { code } : {});
}

describe('toApiError', () => {
  it.each<[string, Error]>([
    // PostgreSQL's SQLSTATE 57014 query_canceled, as our statement_timeout raises it.
    ['57014 statement timeout', failure('canceling statement due to statement timeout', '57014')],
    // node-postgres's client-side query_timeout has no code, only this message.
    ['node-postgres query_timeout', failure('Query read timeout')],
    ['53300 too_many_connections', failure('sorry, too many clients already', '53300')],
    ['ENOTFOUND', failure('getaddrinfo ENOTFOUND db.internal', 'ENOTFOUND')],
    ['EAI_AGAIN', failure('getaddrinfo EAI_AGAIN db.internal', 'EAI_AGAIN')],
    ['EHOSTUNREACH', failure('connect EHOSTUNREACH 10.0.0.5:5432', 'EHOSTUNREACH')],
    ['ENETUNREACH', failure('connect ENETUNREACH 10.0.0.5:5432', 'ENETUNREACH')],
    ['ECONNREFUSED', failure('connect ECONNREFUSED 127.0.0.1:5432', 'ECONNREFUSED')],
    [
      '57P01 admin_shutdown',
      failure('terminating connection due to administrator command', '57P01'),
    ],
    [
      'a cause that is transient',
      Object.assign(new Error('wrapped'), { cause: failure('x', '57014') }),
    ],
  ])('%s → 503 storage_unavailable', (_name, err) => {
    expect(toApiError(err)).toMatchObject({ status: 503, code: 'storage_unavailable' });
    expect(isDatabaseUnavailable(err)).toBe(true);
  });

  it.each<[string, Error]>([
    ['22008 datetime out of range', failure('date/time field value out of range', '22008')],
    ['23505 unique violation', failure('duplicate key value', '23505')],
    ['42P01 undefined table', failure('relation "x" does not exist', '42P01')],
    ['a plain bug', new TypeError("Cannot read properties of undefined (reading 'at')")],
  ])('%s → 500 internal, and not transient', (_name, err) => {
    expect(toApiError(err)).toMatchObject({ status: 500, code: 'internal' });
    expect(isDatabaseUnavailable(err)).toBe(false);
  });

  it('keeps an ApiError as it is, Retry-After included', () => {
    const busy = new RetryLaterError('busy', 'Busy; retry in 1 s.', 1);
    expect(toApiError(busy)).toBe(busy);
    expect(busy).toBeInstanceOf(ApiError);
    expect(busy).toMatchObject({ status: 503, code: 'busy', retryAfterS: 1 });
  });
});
