/** A shop's alarms: list open (or open and recent) ones, and acknowledge one with a note. */
import { Router } from 'express';
import type pg from 'pg';
import { z } from 'zod';

import type { Db } from '@/db';
import { acknowledgeAlarm, listAlarms } from '@/db/queries/alarms';
import type { AlarmAckResponse, AlarmsResponse } from '@/ingest/wire/alarms';

import { isUuid, shopIdOf, userIdOf } from '../auth/middleware';
import { ApiError } from '../errors';
import { alarmOf } from '../alarms/wire';
import { alarmMessageJson } from '../live/messages';
import { parseInput } from '../validate';

const listQuery = z.object({ state: z.enum(['open', 'all']).default('open') });
const ackBody = z.object({
  note: z
    .string()
    .trim()
    .min(1, 'Say in a few words what was done')
    .max(500, 'Keep the note to 500 characters'),
});

/**
 * Mounted at /shops/:shopId/alarms. Who may call it is in server/auth/policy.ts: viewers list,
 * members and owners acknowledge.
 */
export function alarmsRouter(db: Db, pool: pg.Pool, now: () => number): Router {
  const router = Router({ mergeParams: true });

  router.get('/', async (req, res) => {
    const { state } = parseInput(listQuery, req.query, 'query');
    const rows = await listAlarms(db, shopIdOf(res), state);
    res.json({ alarms: rows.map(alarmOf) } satisfies AlarmsResponse);
  });

  router.post('/:alarmId/ack', async (req, res) => {
    const notFound = new ApiError(404, 'not_found', 'No such alarm in this shop.');
    const alarmId = req.params.alarmId;
    if (!isUuid(alarmId)) throw notFound;
    const { note } = parseInput(ackBody, req.body);
    const shopId = shopIdOf(res);
    const outcome = await acknowledgeAlarm(
      pool,
      { shopId, alarmId, userId: userIdOf(res), note, at: new Date(now()) },
      (row) => alarmMessageJson(shopId, alarmOf(row)),
    );
    if (outcome.ok)
      return void res.json({ alarm: alarmOf(outcome.alarm) } satisfies AlarmAckResponse);
    if (outcome.reason === 'not_found') throw notFound;
    throw new ApiError(
      409,
      'already_acknowledged',
      `${(outcome.alarm && alarmOf(outcome.alarm))?.acknowledgement?.by?.name ?? 'Someone'} has already acknowledged this alarm.`,
    );
  });

  return router;
}
