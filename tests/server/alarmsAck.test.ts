// Listing and acknowledging alarms: viewers read, members and owners acknowledge with a note,
// another shop's people get 404, and an acknowledgement is stored, returned and pushed live.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type { Alarm } from '@/ingest/wire/alarms';
import { addMember } from '@/db/queries/memberships';

import {
  alarmsOf,
  changeCounts,
  MINUTE_MS,
  onlyAlarm,
  postEach,
  seriesStartMs,
  withMargin,
} from '../support/alarms';
import { ownerWithSensor, verifiedPerson } from '../support/app';
import { connectLive } from '../support/liveClient';
import { startInstance } from '../support/liveServer';

let server: Awaited<ReturnType<typeof startInstance>>;
let o: Awaited<ReturnType<typeof ownerWithSensor>>;
let member: Awaited<ReturnType<typeof verifiedPerson>>;
let viewer: Awaited<ReturnType<typeof verifiedPerson>>;
let wet: Alarm;
const startMs = seriesStartMs();

beforeAll(async () => {
  server = await startInstance();
  o = await ownerWithSensor(server.app);
  member = await verifiedPerson(server.app, 'Mira Member');
  viewer = await verifiedPerson(server.app, 'Vic Viewer');
  await addMember(server.app.db, o.shopId, member.user.id, 'member');
  await addMember(server.app.db, o.shopId, viewer.user.id, 'viewer');
  // Three readings 0.5 K below the dew point confirm wet (ingest/hysteresis.ts: 3 readings).
  await postEach(
    server.app.app,
    o.token,
    [0, 1, 2].map((i) => withMargin(startMs + i * MINUTE_MS, -0.5)),
  );
  wet = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
});
afterAll(() => server?.close());

const ackPath = (shopId: string, alarmId: string) =>
  `/api/v1/shops/${shopId}/alarms/${alarmId}/ack`;

/** Every field of the wire shape, checked complete at compile time and against the answers. */
const ALARM_FIELDS = [
  'id',
  'kind',
  'state',
  'zone',
  'sensor',
  'sinceAt',
  'openedAt',
  'updatedAt',
  'clearedAt',
  'worstMarginK',
  'latestMarginK',
  'minutesToWet',
  'peakRhPct',
  'latestRhPct',
  'lowestBatteryV',
  'latestBatteryV',
  'acknowledgement',
] as const satisfies readonly (keyof Alarm)[];
const allFieldsListed: Exclude<keyof Alarm, (typeof ALARM_FIELDS)[number]> extends never
  ? true
  : false = true;

describe('listing alarms', () => {
  it('answers each alarm with exactly the fields of the wire shape', async () => {
    expect(allFieldsListed).toBe(true);
    const all = await alarmsOf(viewer.agent, o.shopId, { state: 'all' });
    expect(all.length).toBeGreaterThan(0);
    for (const alarm of all) {
      expect(Object.keys(alarm).sort()).toEqual([...ALARM_FIELDS].sort());
      expect(Object.keys(alarm.zone).sort()).toEqual(['id', 'name']);
    }
  });

  it('shows viewers the open alarms by default and all of them on request', async () => {
    const open = await viewer.agent.get(`/api/v1/shops/${o.shopId}/alarms`).expect(200);
    const kinds = (open.body.alarms as Alarm[]).map((a) => a.kind).sort();
    expect(kinds).toEqual(['dew_risk', 'wet_surface']);
    expect(await alarmsOf(viewer.agent, o.shopId, { state: 'all' })).toHaveLength(2);
  });

  it('refuses an unknown state with 400 and a stranger with 404', async () => {
    const bad = await viewer.agent.get(`/api/v1/shops/${o.shopId}/alarms?state=closed`).expect(400);
    expect(bad.body.error).toMatchObject({ code: 'invalid_input' });
    expect(bad.body.error.details[0].path).toBe('state');
    const stranger = await ownerWithSensor(server.app);
    await stranger.agent.get(`/api/v1/shops/${o.shopId}/alarms`).expect(404);
  });
});

describe('acknowledging an alarm', () => {
  it('refuses a viewer with 403 and changes nothing', async () => {
    const res = await viewer.agent
      .post(ackPath(o.shopId, wet.id))
      .send({ note: 'Looked at it' })
      .expect(403);
    expect(res.body.error.code).toBe('forbidden');
    expect((await onlyAlarm(o.agent, o.shopId, 'wet_surface')).acknowledgement).toBeNull();
  });

  it('answers 404 for another shop, an alarm of another shop and a malformed id', async () => {
    const stranger = await ownerWithSensor(server.app);
    const body = { note: 'Not my shop' };
    await stranger.agent.post(ackPath(o.shopId, wet.id)).send(body).expect(404);
    const crossed = await stranger.agent
      .post(ackPath(stranger.shopId, wet.id))
      .send(body)
      .expect(404);
    expect(crossed.body.error.code).toBe('not_found');
    await stranger.agent.post(ackPath(stranger.shopId, 'not-a-uuid')).send(body).expect(404);
    expect(await changeCounts(server.app.db, wet.id)).toMatchObject({ acknowledged: 0 });
  });

  it.each([
    ['no note', {}],
    ['an empty note', { note: '' }],
    ['a blank note', { note: '   ' }],
    ['a note of 501 characters', { note: 'x'.repeat(501) }],
    ['a number', { note: 42 }],
  ])('refuses %s with 400 in the shared shape', async (_label, body) => {
    const res = await member.agent.post(ackPath(o.shopId, wet.id)).send(body).expect(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message: expect.any(String) });
    expect(res.body.error.details[0].path).toBe('note');
    expect((await onlyAlarm(o.agent, o.shopId, 'wet_surface')).acknowledgement).toBeNull();
  });

  it('lets a member acknowledge once: stored, returned, in the history and pushed live', async () => {
    const live = await connectLive(server.baseUrl, o);
    try {
      const note = 'Wiped and covered the saw top';
      const res = await member.agent
        .post(ackPath(o.shopId, wet.id))
        .send({ note: `  ${note} ` })
        .expect(200);
      const acknowledgement = res.body.alarm.acknowledgement;
      expect(acknowledgement).toMatchObject({
        by: { id: member.user.id, name: 'Mira Member' },
        note,
      });
      expect(Date.now() - Date.parse(acknowledgement.at)).toBeLessThan(60_000);
      expect((await onlyAlarm(viewer.agent, o.shopId, 'wet_surface')).acknowledgement).toEqual(
        acknowledgement,
      );
      expect(await changeCounts(server.app.db, wet.id)).toMatchObject({ acknowledged: 1 });

      type Pushed = { type: 'alarm'; shopId: string; alarm: Alarm };
      const pushed = await live.next(
        (m): m is Pushed =>
          (m as Pushed).type === 'alarm' && (m as Pushed).alarm.acknowledgement !== null,
        2000,
      );
      expect(pushed).toMatchObject({ shopId: o.shopId, alarm: { id: wet.id, acknowledgement } });

      const again = await o.agent.post(ackPath(o.shopId, wet.id)).send({ note: 'Me too' });
      expect(again.status).toBe(409);
      expect(again.body.error.code).toBe('already_acknowledged');
      expect(again.body.error.message).toContain('Mira Member');
    } finally {
      live.close();
    }
  });

  it('keeps the acknowledgement when the engine updates the alarm, and takes 500 characters', async () => {
    await postEach(server.app.app, o.token, [withMargin(startMs + 3 * MINUTE_MS, -1.2)]);
    const updated = await onlyAlarm(o.agent, o.shopId, 'wet_surface');
    expect(updated.worstMarginK).toBeCloseTo(-1.2, 6);
    expect(updated.acknowledgement?.by?.name).toBe('Mira Member');

    const dewRisk = await onlyAlarm(o.agent, o.shopId, 'dew_risk');
    const note = 'n'.repeat(500);
    const res = await o.agent.post(ackPath(o.shopId, dewRisk.id)).send({ note }).expect(200);
    expect(res.body.alarm.acknowledgement).toMatchObject({ by: { name: 'Owner' }, note });
  });
});
