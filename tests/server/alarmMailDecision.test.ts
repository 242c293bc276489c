// Alarm e-mail through the real ingest route, database, pg-boss queue and SMTP server: who gets
// it, what it says in whose unit, once per alarm, the per-zone-and-kind cap of 30 min (our own
// rule, server/alarms/mailDecision.ts) and humid air's 2 h wait. The job runs by hand here with an
// injected clock; alarmMailJob.test.ts runs it through pg-boss while the SMTP server is down.
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { findAlarmMail } from '@/db/queries/alarmMailRecords';
import { ALARM_MAIL_QUEUE } from '@/server/jobs';

import {
  alarmsOf,
  changeCounts,
  iso,
  MINUTE_MS,
  onlyAlarm,
  postEach,
  seriesStartMs,
  withMargin,
} from '../support/alarms';
import {
  clockIn,
  deliverAt,
  mailsTo,
  openWetAlarm,
  SHOP_NAME,
  SHOP_TIME_ZONE,
  shopWithPeople,
  startMailTestApp,
} from '../support/alarmMailApp';
import { verifiedPerson, TEST_PUBLIC_URL, type TestApp } from '../support/app';

let boss: PgBoss;
let t: TestApp;
beforeAll(async () => void ({ boss, t } = await startMailTestApp('pgboss_mail_by_hand')));
afterAll(async () => {
  await boss?.stop({ graceful: false });
  await t?.pool.end();
});

const HOUR_MS = 60 * MINUTE_MS;
// °F of a °C value and of a K difference (exact by the scale's definition), one decimal.
const f = (c: number) => ((c * 9) / 5 + 32).toFixed(1);
const fDelta = (k: number) => ((k * 9) / 5).toFixed(1);

describe('the alarm e-mail preference', () => {
  it('is on by default, turns off and on through PATCH /me, and refuses anything but a boolean', async () => {
    const { agent } = await verifiedPerson(t, 'Someone');
    expect((await agent.get('/api/v1/me').expect(200)).body.user.alarmMail).toBe(true);
    const off = await agent.patch('/api/v1/me').send({ alarmMail: false }).expect(200);
    expect(off.body.user).toMatchObject({ alarmMail: false, unitPref: 'C' });
    expect((await agent.get('/api/v1/me').expect(200)).body.user.alarmMail).toBe(false);
    const bad = await agent.patch('/api/v1/me').send({ alarmMail: 'no' }).expect(400);
    expect(bad.body.error.details[0].path).toBe('alarmMail');
    await agent.patch('/api/v1/me').send({ alarmMail: true }).expect(200);
    expect((await agent.get('/api/v1/me').expect(200)).body.user.alarmMail).toBe(true);
  });
});

describe('an alarm opening', () => {
  it('mails owners and members, not viewers, those who turned it off nor unverified addresses, with the alarm’s numbers in each unit', async () => {
    const p = await shopWithPeople(t);
    const startMs = seriesStartMs();
    const { posted, wet } = await openWetAlarm(t, p.owner, startMs);
    expect(wet.openedAt).toBe(iso(startMs + 2 * MINUTE_MS));
    // The job was queued with the alarm, under the alarm's id.
    const job = await boss.getJobById<{ alarmId: string }>(ALARM_MAIL_QUEUE, wet.id);
    expect(job?.data).toEqual({ alarmId: wet.id });

    const report = await deliverAt(t, wet.id, Date.parse(wet.openedAt) + 30_000);
    expect(report).toEqual({ outcome: 'sent', sent: 3 });
    expect(mailsTo(t, p.viewer.email)).toEqual([]);
    expect(mailsTo(t, p.quiet.email)).toEqual([]);
    // Signed up, never opened the link: the address may not be theirs.
    expect(mailsTo(t, p.unverified.email)).toEqual([]);
    const [toOwner] = mailsTo(t, p.owner.email);
    const [toMember] = mailsTo(t, p.member.email);
    const [toMemberF] = mailsTo(t, p.memberF.email);

    // The reading that opened it, as ingest answered it.
    const reading = posted[2]!.results[0]! as unknown as { dewPoint: number; margin: number };
    expect(reading.margin).toBeCloseTo(wet.latestMarginK!, 9);
    const surfaceC = reading.dewPoint + reading.margin;
    expect(toOwner!.subject).toBe(`Machine room: wet, margin -0.5 °C — ${SHOP_NAME}`);
    expect(toMember!.subject).toBe(toOwner!.subject);
    for (const text of [toOwner!.text, toMember!.text]) {
      expect(text).toMatch(/Dew margin +-0\.5 °C\n/);
      expect(text).toMatch(new RegExp(`Dew point +${reading.dewPoint.toFixed(1)} °C\\n`));
      expect(text).toMatch(new RegExp(`Surface +${surfaceC.toFixed(1)} °C\\n`));
      expect(text).toMatch(/Air +20\.0 °C\n +Relative humidity +50 %\n/);
    }
    expect(toMemberF!.subject).toBe(`Machine room: wet, margin -${fDelta(0.5)} °F — ${SHOP_NAME}`);
    expect(toMemberF!.text).toMatch(new RegExp(`Dew point +${f(reading.dewPoint)} °F\\n`));
    expect(toMemberF!.text).toMatch(new RegExp(`Surface +${f(surfaceC)} °F\\n`));
    expect(toMemberF!.text).toMatch(/Air +68\.0 °F\n/);
    expect(toMemberF!.text).not.toContain('°C');

    // When, in the shop's zone; where to look; what to do; the caution; how to stop these mails.
    const text = toOwner!.text;
    expect(text).toContain(`Measured at ${clockIn(wet.openedAt, SHOP_TIME_ZONE)} on `);
    expect(text).toContain(`(${SHOP_TIME_ZONE})`);
    const shopUrl = `${TEST_PUBLIC_URL}/shops/${p.owner.shopId}`;
    expect(text).toContain(`See the alarm and acknowledge it: ${shopUrl}/alarms`);
    expect(text).toContain(`turn them off under Profile: ${shopUrl}/profile`);
    expect(text).toContain('What to do now:\n- Wipe the water off the iron and dry it');
    expect(text).toContain('- Once the iron is dry, re-apply its protective coating');
    // The safety cautions that go with wiping, coating, warming and drying, in both parts.
    const safety = text.slice(text.indexOf('\nSafety:\n'));
    expect(safety).toMatch(
      /^\nSafety:\n- Switch off and unplug the machine before wiping near a blade/,
    );
    for (const caution of [
      /label and safety data sheet/,
      /Ventilate when spraying: aerosols are flammable/,
      /Oily rags can self-heat and catch fire/,
      /closed metal container with water/,
      /Unvented fuel-burning heaters \(propane, kerosene\) add moisture and carbon monoxide/,
      /local electrical and fire codes; new circuits or wiring are work for a licensed electrician/,
    ]) {
      expect(safety).toMatch(caution);
      expect(toOwner!.html).toMatch(caution);
    }
    expect(toOwner!.html).toMatch(
      />Safety<\/p><ul[^>]*><li[^>]*>Switch off and unplug the machine/,
    );
    expect(toOwner!.html).toContain(`href="${shopUrl}/alarms"`);
    expect(toOwner!.html).toContain(`<strong>${SHOP_NAME}: Machine room: wet, margin -0.5 °C`);
    expect((await findAlarmMail(t.db, wet.id))?.sentTo.sort()).toEqual(
      [p.owner.user.id, p.member.user.id, p.memberF.user.id].sort(),
    );
  });

  it('says how soon the iron will be wet, and sends nothing more while the alarm updates', async () => {
    const p = await shopWithPeople(t);
    const startMs = seriesStartMs();
    // The falling margin of alarms.test.ts: 0.05 K/min from 6.05 K, so the 22nd reading
    // (3.95 K) is wet in (3.95 − 1) / 0.05 = 59 min, shown in 5-min steps as "about 60 min".
    const falling = Array.from({ length: 36 }, (_, i) =>
      withMargin(startMs + i * 2 * MINUTE_MS, 6.05 - 0.1 * i),
    );
    await postEach(t.app, p.owner.token, falling.slice(0, 22));
    const risk = await onlyAlarm(p.owner.agent, p.owner.shopId, 'dew_risk');
    expect(risk.minutesToWet).toBeCloseTo(59, 6);
    expect(await deliverAt(t, risk.id, Date.parse(risk.openedAt) + 5_000)).toEqual({
      outcome: 'sent',
      sent: 3,
    });
    const [mail] = mailsTo(t, p.owner.email);
    expect(mail!.subject).toBe(`Machine room: wet in about 60 min — ${SHOP_NAME}`);
    expect(mail!.text).toContain(`Dew margin         +${risk.latestMarginK!.toFixed(1)} °C\n`);
    expect(mail!.text).toContain('- Warm the shop slowly');
    expect(mail!.text).toMatch(/\nSafety:\n- Unvented fuel-burning heaters[^\n]*carbon monoxide/);
    expect(mail!.html).toContain('carbon monoxide');

    // The margin keeps falling: the alarm is updated again and again, but has one job only.
    await postEach(t.app, p.owner.token, falling.slice(22));
    expect((await changeCounts(t.db, risk.id)).updated).toBeGreaterThanOrEqual(10);
    const alarms = await alarmsOf(p.owner.agent, p.owner.shopId);
    expect(alarms.map((a) => a.id)).toEqual([risk.id]);
    const jobs = await t.pool.query(
      `select id from pgboss_mail_by_hand.job where name = $1 and data->>'alarmId' = $2`,
      [ALARM_MAIL_QUEUE, risk.id],
    );
    expect(jobs.rowCount).toBe(1);
    // Were the job run again (an expired worker, another instance), it would send nothing.
    expect(await deliverAt(t, risk.id, Date.parse(risk.openedAt) + 60_000)).toEqual({
      outcome: 'sent',
      sent: 0,
    });
    expect(mailsTo(t, p.owner.email)).toHaveLength(1);
  });
});

describe('the rule in the mail', () => {
  // The zone's own limits (wet 2 K, caution 4 K), the engine's band 0.5 K and hold of 3 readings
  // or 5 min (ALARM_RULE_NUMBERS, rules of thumb of ours): 2 K = 3.6 °F and 2.5 K = 4.5 °F, a
  // difference scaling by 1.8 with no 32 °F offset.
  it('says when the alarm opens and clears, in each recipient’s unit, from the zone’s limits', async () => {
    const p = await shopWithPeople(t);
    await p.owner.agent
      .patch(`/api/v1/shops/${p.owner.shopId}/zones/${p.owner.zoneId}`)
      .send({ cautionK: 4, wetK: 2 })
      .expect(200);
    const startMs = seriesStartMs();
    await postEach(
      t.app,
      p.owner.token,
      [0, 1, 2].map((i) => withMargin(startMs + i * MINUTE_MS, 1.5)),
    );
    const wet = await onlyAlarm(p.owner.agent, p.owner.shopId, 'wet_surface');
    await deliverAt(t, wet.id, Date.parse(wet.openedAt) + 30_000);
    const [toMember] = mailsTo(t, p.member.email);
    const [toMemberF] = mailsTo(t, p.memberF.email);

    expect(toMember!.text).toContain(
      'When it opens and clears:\n' +
        '- Opens when the dew margin is at or below 2 °C (the wet limit) for 3 readings or 5 min, whichever comes first.\n' +
        '- Clears when the dew margin stays above 2.5 °C for 3 readings or 5 min, whichever comes first.\n',
    );
    expect(toMemberF!.text).toContain(
      '- Opens when the dew margin is at or below 3.6 °F (the wet limit) for 3 readings or 5 min, whichever comes first.\n' +
        '- Clears when the dew margin stays above 4.5 °F for 3 readings or 5 min, whichever comes first.\n',
    );
    expect(toMemberF!.subject).toBe(`Machine room: wet, margin +${fDelta(1.5)} °F — ${SHOP_NAME}`);
    expect(toMemberF!.html).toContain('Clears when the dew margin stays above 4.5 °F');
    for (const part of [toMemberF!.subject, toMemberF!.text, toMemberF!.html]) {
      expect(part).not.toContain('°C');
    }
  });
});

describe('a flapping alarm', () => {
  it('mails at most once per zone and kind in 30 min', async () => {
    const p = await shopWithPeople(t);
    const startMs = seriesStartMs();
    // Seven times: 3 wet readings (open), then 3 at 2 K (past the 1 K wet limit + 0.5 K band:
    // cleared), one a minute — a wet alarm opening every 6 min, at minutes 2, 8, 14, … 38. Each
    // job runs 10 s after its alarm opened, as a live worker would.
    const outcomes: string[] = [];
    let riskOutcome = '';
    for (let cycle = 0; cycle < 7; cycle++) {
      const minutes = [0, 1, 2, 3, 4, 5].map((i) => cycle * 6 + i);
      await postEach(
        t.app,
        p.owner.token,
        minutes.slice(0, 3).map((m) => withMargin(startMs + m * MINUTE_MS, -0.5)),
      );
      const open = await alarmsOf(p.owner.agent, p.owner.shopId, {
        state: 'open',
        kind: 'wet_surface',
      });
      expect(open.map((a) => a.openedAt)).toEqual([iso(startMs + minutes[2]! * MINUTE_MS)]);
      if (cycle === 0) {
        const risk = await onlyAlarm(p.owner.agent, p.owner.shopId, 'dew_risk');
        riskOutcome = (await deliverAt(t, risk.id, Date.parse(risk.openedAt) + 10_000)).outcome;
      }
      outcomes.push(
        (await deliverAt(t, open[0]!.id, Date.parse(open[0]!.openedAt) + 10_000)).outcome,
      );
      await postEach(
        t.app,
        p.owner.token,
        minutes.slice(3).map((m) => withMargin(startMs + m * MINUTE_MS, 2)),
      );
    }
    // Minute 32 is 30 min after minute 2: the cap has passed.
    expect(outcomes).toEqual(['sent', 'capped', 'capped', 'capped', 'capped', 'sent', 'capped']);
    const subjects = mailsTo(t, p.owner.email).map((m) => m.subject);
    expect(subjects).toEqual(Array(2).fill(`Machine room: wet, margin -0.5 °C — ${SHOP_NAME}`));
    // Dew risk opened with the first wet alarm (its job ran then) and stayed open: covered.
    expect(riskOutcome).toBe('covered');
  });

  it('sends once when two instances run the same job at the same moment', async () => {
    const p = await shopWithPeople(t);
    const { wet } = await openWetAlarm(t, p.owner, seriesStartMs());
    const atMs = Date.parse(wet.openedAt) + 10_000;
    const both = await Promise.all([deliverAt(t, wet.id, atMs), deliverAt(t, wet.id, atMs)]);
    expect(both.map((r) => r.sent).sort()).toEqual([0, 3]);
    expect(mailsTo(t, p.owner.email)).toHaveLength(1);
    expect(mailsTo(t, p.memberF.email)).toHaveLength(1);
  });
});

describe('humid air', () => {
  it('is mailed only once it has lasted 2 h, and not at all when it cleared sooner', async () => {
    const p = await shopWithPeople(t);
    const startMs = seriesStartMs();
    const reading = (min: number, rh: number) => ({
      at: iso(startMs + min * MINUTE_MS),
      air: 20,
      rh,
      surface: 30, // far above the dew point: only the air is humid
    });
    // RH 71 % above the 60 % limit from minute 0: the alarm opens after the 30-min hold.
    await postEach(
      t.app,
      p.owner.token,
      [0, 10, 20, 30].map((m) => reading(m, 71)),
    );
    const humid = await onlyAlarm(p.owner.agent, p.owner.shopId, 'humid_air');
    const sinceMs = Date.parse(humid.sinceAt);
    expect(sinceMs).toBe(startMs);
    const job = await boss.getJobById(ALARM_MAIL_QUEUE, humid.id);
    expect(job?.startAfter.getTime()).toBe(sinceMs + 2 * HOUR_MS);

    expect(await deliverAt(t, humid.id, sinceMs + HOUR_MS)).toEqual({
      outcome: 'not_due',
      sent: 0,
    });
    expect(await findAlarmMail(t.db, humid.id)).toBeNull();
    expect(await deliverAt(t, humid.id, sinceMs + 2 * HOUR_MS)).toMatchObject({ outcome: 'sent' });
    const [mail] = mailsTo(t, p.owner.email);
    expect(mail!.subject).toBe(
      `Machine room: humid air since ${clockIn(humid.sinceAt, SHOP_TIME_ZONE)}, 71 % RH — ${SHOP_NAME}`,
    );
    expect(mail!.text).toMatch(/Peak RH +71 %\n/);

    // Another shop's humid spell clears after 45 min: nobody hears of it by mail.
    const q = await shopWithPeople(t);
    await postEach(t.app, q.owner.token, [
      ...[0, 10, 20, 30].map((m) => reading(m, 71)),
      ...[40, 50, 60].map((m) => reading(m, 50)), // ≤ 55 % for 15 min: cleared (ours)
    ]);
    const short = await onlyAlarm(q.owner.agent, q.owner.shopId, 'humid_air');
    expect(short.state).toBe('cleared');
    expect(await deliverAt(t, short.id, sinceMs + 2 * HOUR_MS)).toEqual({
      outcome: 'cleared',
      sent: 0,
    });
    expect(mailsTo(t, q.owner.email)).toEqual([]);
  });
});

describe('below freezing', () => {
  it('names the frost point, not the dew point, in the mail', async () => {
    const p = await shopWithPeople(t);
    const startMs = seriesStartMs();
    // Air −5 °C at 80 % RH (over water, the sensors' convention): the vapour saturates over ice
    // at about −7.0 °C, a frost point (ASHRAE Handbook — Fundamentals 2017, ch. 1, eq. 5,
    // Hyland–Wexler, in ingest/psychrometrics.ts). Three readings 0.5 K below it confirm wet.
    const frostC = -7.0248;
    const posted = await postEach(
      t.app,
      p.owner.token,
      [0, 1, 2].map((i) => ({
        at: iso(startMs + i * MINUTE_MS),
        air: -5,
        rh: 80,
        surface: frostC - 0.5,
      })),
    );
    const reading = posted[2]!.results[0]! as unknown as { dewPoint: number };
    expect(reading.dewPoint).toBeCloseTo(frostC, 3);
    const wet = await onlyAlarm(p.owner.agent, p.owner.shopId, 'wet_surface');
    expect(await deliverAt(t, wet.id, Date.parse(wet.openedAt) + 30_000)).toMatchObject({
      outcome: 'sent',
    });
    const [toOwner] = mailsTo(t, p.owner.email);
    const [toMemberF] = mailsTo(t, p.memberF.email);
    expect(toOwner!.text).toMatch(/\n +Frost point +-7\.0 °C\n/);
    expect(toOwner!.text).toContain('so frost may be forming on the machine tops');
    expect(toOwner!.text).not.toContain('Dew point');
    expect(toOwner!.html).toContain('>Frost point</td>');
    expect(toMemberF!.text).toMatch(new RegExp(`\\n +Frost point +${f(frostC)} °F\\n`));
  });
});

describe('a silent sensor and a backlog', () => {
  it('mails what to check when the sweep finds a sensor silent', async () => {
    const p = await shopWithPeople(t);
    const lastMs = seriesStartMs();
    await postEach(t.app, p.owner.token, [withMargin(lastMs, 6)]);
    // One reading: a 5-min interval assumed, silent after 15 min (server/alarms/rules.ts).
    const sweepMs = lastMs + 20 * MINUTE_MS;
    await t.alarms.sweepSilent({ nowMs: sweepMs, shopId: p.owner.shopId });
    const silent = await onlyAlarm(p.owner.agent, p.owner.shopId, 'sensor_silent');
    expect(await deliverAt(t, silent.id, sweepMs + 5_000)).toMatchObject({ outcome: 'sent' });
    const [mail] = mailsTo(t, p.owner.email);
    expect(mail!.subject).toBe(
      `Saw probe silent since ${clockIn(iso(lastMs), SHOP_TIME_ZONE)} — ${SHOP_NAME}`,
    );
    expect(mail!.text).toContain('A silent sensor looks like a dry shop');
    expect(mail!.text).toContain('- Check the sensor’s power: batteries, or the plug');
    expect(mail!.text).toContain('- Check its network');
  });

  it('does not mail an alarm first decided more than 6 h after it opened (ours)', async () => {
    const p = await shopWithPeople(t);
    const { wet } = await openWetAlarm(t, p.owner, seriesStartMs());
    const openedMs = Date.parse(wet.openedAt);
    expect(await deliverAt(t, wet.id, openedMs + 6 * HOUR_MS + MINUTE_MS)).toEqual({
      outcome: 'stale',
      sent: 0,
    });
    expect(mailsTo(t, p.owner.email)).toEqual([]);
  });
});
