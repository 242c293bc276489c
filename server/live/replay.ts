/**
 * What a reconnecting client missed. The client sends the time of the last message it saw
 * (`/api/v1/live?since=…`); it gets, per zone, the newest reading since then with how many
 * arrived (its chart refetches when more than one did). Only the last 24 hours are replayed:
 * a client away longer reloads everything anyway.
 */
import type { Db } from '@/db';
import { latestPerZoneSince } from '@/db/queries/readings';

import type { ReadingMessage } from './messages';

export const REPLAY_WINDOW_MS = 24 * 60 * 60 * 1000;

export async function missedMessages(
  db: Db,
  shopIds: string[],
  sinceMs: number,
  nowMs: number,
): Promise<ReadingMessage[]> {
  const since = new Date(Math.max(sinceMs, nowMs - REPLAY_WINDOW_MS));
  const rows = await latestPerZoneSince(db, shopIds, since);
  return rows.map((row) => ({ type: 'reading', ...row }));
}
