// Helpers for the alarm tests: readings with a chosen dew margin, posted through the real
// ingest route, and the alarms and their history read back through the API and the database.
import type request from 'supertest';
import { expect } from 'vitest';

import type { Db } from '@/db';
import { alarmEventsOf } from '@/db/queries/alarms';
import type { Alarm } from '@/ingest/wire/alarms';
import type { AlarmKind } from '@/db/schema';
import { dewPoint } from '@/ingest';

import type { TestApp } from './app';
import { postIngest } from './ingest';

type Agent = ReturnType<typeof request.agent>;

export const MINUTE_MS = 60_000;

/** A minute-aligned start a few hours back, so a whole series stays in the past. */
export function seriesStartMs(hoursBack = 5): number {
  return Math.floor((Date.now() - hoursBack * 3_600_000) / MINUTE_MS) * MINUTE_MS;
}

// Air 20 °C at 50 % RH: dew point 9.26 °C (ASHRAE via psychrolib, checked in tests/server/ingest.test.ts).
const AIR_C = 20;
const RH_PCT = 50;
const dew = dewPoint(AIR_C, RH_PCT);
if (!dew.ok) throw new Error('dew point of 20 °C / 50 % must be computable');
const DEW_C = dew.dewPointC;

/** A reading whose surface sits `marginK` above the dew point of 20 °C / 50 % air. */
export function withMargin(atMs: number, marginK: number, extra: Record<string, unknown> = {}) {
  return {
    at: new Date(atMs).toISOString(),
    air: AIR_C,
    rh: RH_PCT,
    surface: DEW_C + marginK,
    ...extra,
  };
}

export interface PostResult {
  stored: number;
  results: { at: string; margin: number | null; level: string }[];
}

/** Posts readings as a sensor would, one request each (live), and checks each was stored. */
export async function postEach(
  app: TestApp['app'],
  token: string,
  readings: Record<string, unknown>[],
): Promise<PostResult[]> {
  const out: PostResult[] = [];
  for (const reading of readings) out.push(await postBatch(app, token, [reading]));
  return out;
}

/** Posts readings in one request (a sensor's backlog). */
export async function postBatch(
  app: TestApp['app'],
  token: string,
  readings: Record<string, unknown>[],
): Promise<PostResult> {
  const res = await postIngest(app, token, { readings }).expect(202);
  expect(res.body.stored).toBe(readings.length);
  return res.body as PostResult;
}

/** A shop's alarms through the API, optionally of one kind. */
export async function alarmsOf(
  agent: Agent,
  shopId: string,
  options: { state?: 'open' | 'all'; kind?: AlarmKind } = {},
): Promise<Alarm[]> {
  const res = await agent
    .get(`/api/v1/shops/${shopId}/alarms?state=${options.state ?? 'all'}`)
    .expect(200);
  const alarms = res.body.alarms as Alarm[];
  return options.kind ? alarms.filter((a) => a.kind === options.kind) : alarms;
}

/** The only alarm of a kind in a shop (failing when there are none or several). */
export async function onlyAlarm(agent: Agent, shopId: string, kind: AlarmKind) {
  const alarms = await alarmsOf(agent, shopId, { kind });
  expect(alarms, `alarms of kind ${kind}`).toHaveLength(1);
  return alarms[0]!;
}

/** How many of each change an alarm's history holds. */
export async function changeCounts(db: Db, alarmId: string) {
  const counts = { opened: 0, updated: 0, acknowledged: 0, cleared: 0 };
  for (const event of await alarmEventsOf(db, alarmId)) counts[event.change] += 1;
  return counts;
}

export const iso = (ms: number) => new Date(ms).toISOString();
