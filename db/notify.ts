/**
 * Every PostgreSQL notification channel the server uses, and the one way to send on them.
 * Notifications are how server instances tell each other things without sharing memory: each
 * instance LISTENs on one connection (db/listener.ts) and reacts.
 *
 * - LIVE_CHANNEL: the live hub's messages (readings, alarms) for browsers of a shop, and the
 *   access notices (`{ type: 'access', userIds }`) that make every hub re-check those people's
 *   sockets. One channel for both keeps their order: a removal is never overtaken by a message
 *   the removed member should no longer get.
 * - TOKEN_CHANNEL: sensor-token hashes every instance must forget (revoke, rotate, removal).
 *
 * Sent inside a transaction, a notification is delivered only when it commits, so a message is
 * never sent for a change that was rolled back.
 */
import { sql } from 'drizzle-orm';
import type pg from 'pg';

import type { Db } from './index';

export const LIVE_CHANNEL = 'drybench_live';
export const TOKEN_CHANNEL = 'drybench_tokens';

export type NotifyChannel = typeof LIVE_CHANNEL | typeof TOKEN_CHANNEL;

/**
 * pg_notify refuses a payload of 8,000 bytes or more (PostgreSQL's default build); whoever
 * builds a payload keeps it at or below this, which leaves a margin for the channel name.
 */
export const NOTIFY_MAX_BYTES = 7_900;

/** A Drizzle handle (pool or transaction), or a node-postgres pool or client. */
export type NotifyExecutor = Pick<Db, 'execute'> | Pick<pg.Pool, 'query'>;

/** Sends each payload on `channel`, in order, in one statement. */
export async function notify(
  executor: NotifyExecutor,
  channel: NotifyChannel,
  payloads: string | readonly string[],
): Promise<void> {
  const list = typeof payloads === 'string' ? [payloads] : [...payloads];
  if (list.length === 0) return;
  if ('execute' in executor) {
    await executor.execute(
      sql`select pg_notify(${channel}, p) from unnest(${sql.param(list)}::text[]) as p`,
    );
  } else {
    await executor.query('select pg_notify($1, p) from unnest($2::text[]) as p', [channel, list]);
  }
}
