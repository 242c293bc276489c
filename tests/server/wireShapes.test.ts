// What each route answers has exactly the keys of its shape in ingest/wire, nested shapes too:
// the app is typed against those shapes, so a key the server adds, drops or renames must fail
// here rather than on a screen. Each key list below is a Record over the shape's keys, so the
// compiler refuses a list that misses a key or names one the shape lacks.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import type {
  AlarmWeekFigures,
  CreatedSensor,
  Invitation,
  InvitationAccepted,
  InvitationLink,
  InvitationsResponse,
  IssuedToken,
  LatestReading,
  Me,
  Member,
  MemberRole,
  MembersResponse,
  ReadingPoint,
  ReadingsResponse,
  Sensor,
  ShopWeekFigures,
  SilentPeriod,
  TimeOfWetnessFigures,
  WeekReport,
  ZoneWeekFigures,
  SensorInterval,
  SensorPlacement,
  SensorsResponse,
  Shop,
  ShopSummary,
  User,
  UserResponse,
  VerificationSent,
  Zone,
  ZoneSettings,
  ZonesResponse,
} from '@/ingest/wire';

import { makeTestApp, ownerWithSensor, uniqueEmail, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';
import { linkToken, waitForMail } from '../support/mail';

type Keys<T> = Record<keyof T, true>;

const ZONES_RESPONSE: Keys<ZonesResponse> = { zones: true };
const ZONE_SETTINGS: Keys<ZoneSettings> = {
  id: true,
  name: true,
  cautionK: true,
  wetK: true,
  humidRhPct: true,
  purpose: true,
  emcRegion: true,
};
const ZONE: Keys<Zone> = { ...ZONE_SETTINGS, latest: true, staleAfterS: true };
const LATEST_READING: Keys<LatestReading> = {
  at: true,
  air: true,
  rh: true,
  surface: true,
  dewPoint: true,
  margin: true,
  emc: true,
  level: true,
  surfaceSource: true,
  sensorId: true,
};
const READINGS_RESPONSE: Keys<ReadingsResponse> = {
  from: true,
  to: true,
  firstAt: true,
  bucketSeconds: true,
  points: true,
};
const READING_POINT: Keys<ReadingPoint> = {
  at: true,
  air: true,
  rh: true,
  surface: true,
  dewPoint: true,
  margin: true,
  marginMin: true,
  marginMax: true,
  emc: true,
  level: true,
  count: true,
};
const SENSORS_RESPONSE: Keys<SensorsResponse> = { sensors: true, mqtt: true };
const SENSOR: Keys<Sensor> = {
  id: true,
  name: true,
  zoneId: true,
  zoneName: true,
  lastSeenAt: true,
  batteryV: true,
  revokedAt: true,
  createdAt: true,
  interval: true,
};
const SENSOR_INTERVAL: Keys<SensorInterval> = {
  setS: true,
  learnedS: true,
  effectiveS: true,
  source: true,
  silentAfterS: true,
  silentFrom: true,
};
const SENSOR_PLACEMENT: Keys<SensorPlacement> = { id: true, name: true, zoneId: true };
const ISSUED_TOKEN: Keys<IssuedToken> = { id: true, token: true };
const CREATED_SENSOR: Keys<CreatedSensor> = { ...SENSOR_PLACEMENT, ...ISSUED_TOKEN };
const USER: Keys<User> = {
  id: true,
  email: true,
  name: true,
  unitPref: true,
  alarmMail: true,
  weekReportMail: true,
  emailVerified: true,
};
const USER_RESPONSE: Keys<UserResponse> = { user: true };
const VERIFICATION_SENT: Keys<VerificationSent> = { status: true, email: true };
const SHOP: Keys<Shop> = { id: true, name: true, timeZone: true };
const SHOP_SUMMARY: Keys<ShopSummary> = { ...SHOP, role: true, paperSize: true };
const ME: Keys<Me> = { user: true, shops: true };
const MEMBERS_RESPONSE: Keys<MembersResponse> = { members: true };
const MEMBER: Keys<Member> = { userId: true, name: true, email: true, role: true, since: true };
const MEMBER_ROLE: Keys<MemberRole> = { userId: true, role: true };
const INVITATIONS_RESPONSE: Keys<InvitationsResponse> = { invitations: true };
const INVITATION: Keys<Invitation> = {
  id: true,
  email: true,
  role: true,
  expiresAt: true,
  createdAt: true,
};
const INVITATION_LINK: Keys<InvitationLink> = {
  shopName: true,
  email: true,
  role: true,
  expiresAt: true,
  accountExists: true,
};
const INVITATION_ACCEPTED: Keys<InvitationAccepted> = { shop: true, role: true };
const INVITATION_ACCEPTED_SHOP: Keys<InvitationAccepted['shop']> = { id: true, name: true };

const WEEK_REPORT: Keys<WeekReport> = {
  shop: true,
  week: true,
  unit: true,
  generatedAt: true,
  shopWide: true,
  zones: true,
};
const WEEK_REPORT_SHOP: Keys<WeekReport['shop']> = {
  id: true,
  name: true,
  timeZone: true,
  paperSize: true,
};
const WEEK_REPORT_WEEK: Keys<WeekReport['week']> = {
  start: true,
  from: true,
  to: true,
  hours: true,
  periodEnd: true,
  note: true,
};
const SHOP_WEEK: Keys<ShopWeekFigures> = {
  zones: true,
  coveragePct: true,
  lowestMargin: true,
  zonesWet: true,
  wetHours: true,
  closeHours: true,
  alarmsOpened: true,
  medianAckMinutes: true,
  unacknowledged: true,
  verdict: true,
};
const ZONE_WEEK: Keys<ZoneWeekFigures> = {
  zoneId: true,
  name: true,
  purpose: true,
  readings: true,
  coveragePct: true,
  airC: true,
  rhPct: true,
  emcPct: true,
  lowestMargin: true,
  levelHours: true,
  timeOfWetness: true,
  alarms: true,
  silentPeriods: true,
  verdict: true,
};
const MIN_MEAN_MAX = { min: true, mean: true, max: true };
const LEVEL_HOURS = { dry: true, close: true, wet: true, unknown: true };
const TOW: Keys<TimeOfWetnessFigures> = { hours: true, annualHours: true, category: true };
const ALARM_WEEK: Keys<AlarmWeekFigures> = {
  opened: true,
  openedByKind: true,
  acknowledged: true,
  medianAckMinutes: true,
  longestAckMinutes: true,
  unacknowledged: true,
};
const SILENT_PERIOD: Keys<SilentPeriod> = { from: true, to: true, hours: true };

/** Asserts an answer's own keys are exactly the shape's, whatever their order. */
function expectKeys(value: unknown, shape: object, what: string) {
  expect(value, what).toBeTypeOf('object');
  expect(value, what).not.toBeNull();
  expect(Object.keys(value as object).sort(), what).toEqual(Object.keys(shape).sort());
}

const isIso = (value: unknown) =>
  typeof value === 'string' && new Date(value).toISOString() === value;

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

describe('the API answers the shapes of ingest/wire', () => {
  it('zones: the list, a zone with and without a reading, create and change', async () => {
    const o = await ownerWithSensor(t);
    const path = `/api/v1/shops/${o.shopId}/zones`;
    const empty = await o.agent.get(path).expect(200);
    expectKeys(empty.body, ZONES_RESPONSE, 'zones');
    expectKeys(empty.body.zones[0], ZONE, 'zone');
    expect(empty.body.zones[0].latest).toBeNull();

    const at = new Date(Date.now() - 60_000).toISOString();
    await postIngest(t.app, o.token, { at, air: 12, rh: 80, surface: 9 }).expect(202);
    const listed = await o.agent.get(path).expect(200);
    const latest = listed.body.zones[0].latest;
    expectKeys(latest, LATEST_READING, 'zone.latest');
    expect(latest).toMatchObject({ at, air: 12, rh: 80, surface: 9, surfaceSource: 'probe' });
    // One sensor, nothing learnt or set yet: the default 15 minutes (ingest/postingInterval.ts).
    expect(listed.body.zones[0].staleAfterS).toBe(900);

    const created = await o.agent.post(path).send({ name: 'Paint bay' }).expect(201);
    expectKeys(created.body, ZONE_SETTINGS, 'created zone');
    const changed = await o.agent
      .patch(`${path}/${created.body.id}`)
      .send({ cautionK: 4 })
      .expect(200);
    expectKeys(changed.body, ZONE_SETTINGS, 'changed zone');
    expect(changed.body.cautionK).toBe(4);
  });

  it('readings: the series and its points, raw and bucketed', async () => {
    const o = await ownerWithSensor(t);
    const nowMs = Date.now();
    const readings = [3, 2, 1].map((minutes) => ({
      at: new Date(nowMs - minutes * 60_000).toISOString(),
      air: 12,
      rh: 80,
      surface: 9 + minutes,
    }));
    await postIngest(t.app, o.token, { readings }).expect(202);
    const path = `/api/v1/shops/${o.shopId}/zones/${o.zoneId}/readings`;
    for (const points of [500, 2]) {
      const res = await o.agent.get(path).query({ points }).expect(200);
      expectKeys(res.body, READINGS_RESPONSE, `readings (${points})`);
      expect(res.body.points.length).toBeGreaterThan(0);
      for (const point of res.body.points) expectKeys(point, READING_POINT, 'reading point');
      expect(isIso(res.body.points[0].at)).toBe(true);
    }
  });

  it('sensors: the list, create, rotate and move', async () => {
    const o = await ownerWithSensor(t);
    const path = `/api/v1/shops/${o.shopId}/sensors`;
    await postIngest(t.app, o.token, { air: 12, rh: 80, battery: 3 }).expect(202);
    const listed = await o.agent.get(path).expect(200);
    expectKeys(listed.body, SENSORS_RESPONSE, 'sensors');
    const sensor = listed.body.sensors[0];
    expectKeys(sensor, SENSOR, 'sensor');
    expectKeys(sensor.interval, SENSOR_INTERVAL, 'sensor interval');
    expect(isIso(sensor.interval.silentFrom)).toBe(true);
    expect(isIso(sensor.lastSeenAt) && isIso(sensor.createdAt)).toBe(true);
    expect(sensor).toMatchObject({ batteryV: 3, revokedAt: null });

    const created = await o.agent.post(path).send({ name: 'Door', zoneId: o.zoneId }).expect(201);
    expectKeys(created.body, CREATED_SENSOR, 'created sensor');
    const rotated = await o.agent.post(`${path}/${created.body.id}/token`).expect(201);
    expectKeys(rotated.body, ISSUED_TOKEN, 'rotated token');
    const moved = await o.agent
      .patch(`${path}/${created.body.id}`)
      .send({ name: 'Back door' })
      .expect(200);
    // A change answers the sensor as the list shows it.
    expectKeys(moved.body, SENSOR, 'moved sensor');
    expectKeys(moved.body.interval, SENSOR_INTERVAL, 'moved sensor interval');
  });

  it('people: me, profile, shops, members, invitations and sign-in', async () => {
    const o = await ownerWithSensor(t);
    const me = await o.agent.get('/api/v1/me').expect(200);
    expectKeys(me.body, ME, 'me');
    expectKeys(me.body.user, USER, 'me.user');
    expectKeys(me.body.shops[0], SHOP_SUMMARY, 'me.shops[0]');

    const profile = await o.agent.patch('/api/v1/me').send({ unitPref: 'F' }).expect(200);
    expectKeys(profile.body, USER_RESPONSE, 'profile');
    expectKeys(profile.body.user, USER, 'profile.user');

    const shop = await o.agent
      .post('/api/v1/shops')
      .send({ name: 'Second shop', timeZone: 'UTC' })
      .expect(201);
    expectKeys(shop.body, SHOP, 'created shop');
    const read = await o.agent.get(`/api/v1/shops/${shop.body.id}`).expect(200);
    expectKeys(read.body, SHOP_SUMMARY, 'shop');
    const renamed = await o.agent
      .patch(`/api/v1/shops/${shop.body.id}`)
      .send({ name: 'Renamed shop' })
      .expect(200);
    expectKeys(renamed.body, SHOP_SUMMARY, 'renamed shop');

    const shopPath = `/api/v1/shops/${o.shopId}`;
    const email = uniqueEmail('invitee');
    const invited = await o.agent
      .post(`${shopPath}/invitations`)
      .send({ email, role: 'viewer' })
      .expect(201);
    expectKeys(invited.body, INVITATION, 'created invitation');
    const open = await o.agent.get(`${shopPath}/invitations`).expect(200);
    expectKeys(open.body, INVITATIONS_RESPONSE, 'invitations');
    expectKeys(open.body.invitations[0], INVITATION, 'invitation');

    const token = linkToken(await waitForMail(t.outbox, email), 'invite');
    const link = await request(t.app).get(`/api/v1/invitations/${token}`).expect(200);
    expectKeys(link.body, INVITATION_LINK, 'invitation link');
    const newcomer = request.agent(t.app);
    const password = 'a good long password';
    const accepted = await newcomer
      .post(`/api/v1/invitations/${token}/accept`)
      .send({ name: 'New Hand', password })
      .expect(201);
    expectKeys(accepted.body, INVITATION_ACCEPTED, 'accepted');
    expectKeys(accepted.body.shop, INVITATION_ACCEPTED_SHOP, 'accepted.shop');

    const members = await o.agent.get(`${shopPath}/members`).expect(200);
    expectKeys(members.body, MEMBERS_RESPONSE, 'members');
    for (const member of members.body.members) expectKeys(member, MEMBER, 'member');
    const userId = (await newcomer.get('/api/v1/me').expect(200)).body.user.id;
    const role = await o.agent
      .patch(`${shopPath}/members/${userId}`)
      .send({ role: 'member' })
      .expect(200);
    expectKeys(role.body, MEMBER_ROLE, 'role change');

    const signIn = await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email, password })
      .expect(200);
    expectKeys(signIn.body, USER_RESPONSE, 'sign-in');
    expectKeys(signIn.body.user, USER, 'sign-in.user');
    const resend = await newcomer.post('/api/v1/me/verification').send({});
    // Accepting the e-mailed link proved the address: nothing to send again.
    expect(resend.status).toBe(409);
    const signUp = await request(t.app)
      .post('/api/v1/auth/sign-up')
      .send({ email: uniqueEmail('new'), password, name: 'Newer Hand' })
      .expect(202);
    expectKeys(signUp.body, VERIFICATION_SENT, 'sign-up');
  });

  it('reports: the week report, its shop line and a zone with readings', async () => {
    const o = await ownerWithSensor(t);
    // Monday 2026-03-02, Europe/Oslo (the helper's shop): a reading on the Tuesday.
    await postIngest(t.app, o.token, {
      at: '2026-03-03T06:10:00Z',
      air: 12,
      rh: 80,
      surface: 9,
    }).expect(202);
    const res = await o.agent
      .get(`/api/v1/shops/${o.shopId}/reports/week?start=2026-03-02`)
      .expect(200);
    const r = res.body;
    expectKeys(r, WEEK_REPORT, 'week report');
    expectKeys(r.shop, WEEK_REPORT_SHOP, 'report.shop');
    expectKeys(r.week, WEEK_REPORT_WEEK, 'report.week');
    expectKeys(r.shopWide, SHOP_WEEK, 'report.shopWide');
    expectKeys(r.shopWide.lowestMargin, { zoneId: 1, zoneName: 1, marginK: 1, at: 1 }, 'shop low');
    const zone = r.zones[0];
    expectKeys(zone, ZONE_WEEK, 'report zone');
    for (const key of ['airC', 'rhPct', 'emcPct']) expectKeys(zone[key], MIN_MEAN_MAX, key);
    expectKeys(zone.lowestMargin, { marginK: 1, at: 1 }, 'zone low');
    expectKeys(zone.levelHours, LEVEL_HOURS, 'levelHours');
    expectKeys(zone.timeOfWetness, TOW, 'timeOfWetness');
    expectKeys(zone.alarms, ALARM_WEEK, 'alarms');
    expect(Object.keys(zone.alarms.openedByKind).sort()).toEqual([
      'battery_low',
      'dew_risk',
      'humid_air',
      'sensor_silent',
      'wet_surface',
    ]);
    for (const p of zone.silentPeriods) expectKeys(p, SILENT_PERIOD, 'silent period');
    expect(isIso(r.week.from) && isIso(r.generatedAt) && isIso(zone.lowestMargin.at)).toBe(true);
  });
});
