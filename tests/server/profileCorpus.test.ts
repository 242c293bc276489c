// Bad-input corpus for PATCH /me's mail switches (alarm e-mails, the Monday week report): only a
// JSON true or false is taken; anything else answers 400 in the shared error shape with a field
// error on the switch, and the stored account does not change.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, verifiedPerson, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';

let t: TestApp;
let person: Awaited<ReturnType<typeof verifiedPerson>>;
beforeAll(async () => {
  t = makeTestApp();
  person = await verifiedPerson(t, 'Corpus Person');
});
afterAll(() => t.pool.end());

async function stored() {
  const { rows } = await t.pool.query(
    'select alarm_mail, week_report_mail, name, unit_pref from users where id = $1',
    [person.user.id],
  );
  return rows[0] as { alarm_mail: boolean; week_report_mail: boolean };
}

// Values that look like a yes or no but are not a JSON boolean: a form's text, a number, null.
const NOT_BOOLEANS: [what: string, value: unknown][] = [
  ['the text "false"', 'false'],
  ['the text "no"', 'no'],
  ['the text "off"', 'off'],
  ['zero', 0],
  ['one', 1],
  ['null', null],
  ['an empty text', ''],
  ['an array', [false]],
  ['an object', { on: false }],
];

describe('PATCH /me weekReportMail', () => {
  it('is on by default for a new account, as the column says (users.week_report_mail)', async () => {
    const me = await person.agent.get('/api/v1/me').expect(200);
    expect(me.body.user.weekReportMail).toBe(true);
    expect((await stored()).week_report_mail).toBe(true);
  });

  it.each(NOT_BOOLEANS)('refuses %s and changes nothing', async (_what, value) => {
    for (const field of ['weekReportMail', 'alarmMail']) {
      const before = await stored();
      const res = await person.agent.patch('/api/v1/me').send({ [field]: value });
      expect(res.status).toBe(400);
      expect(res.body).toEqual(errorShape);
      expect(res.body.error.code).toBe('invalid_input');
      expect(res.body.error.details).toContainEqual({
        path: field,
        message: 'Send true or false',
      });
      expect(await stored()).toEqual(before);
    }
  });

  it.each([
    ['an unknown field beside it', { weekReportMail: false, weeklyMail: false }],
    ['the column’s own name', { week_report_mail: false }],
    ['an empty body', {}],
  ])('refuses %s and changes nothing', async (_what, body) => {
    const before = await stored();
    const res = await person.agent.patch('/api/v1/me').send(body);
    expect(res.status).toBe(400);
    expect(res.body).toEqual(errorShape);
    expect(await stored()).toEqual(before);
  });

  it('turns off and on again by itself, leaving alarm e-mails as they were', async () => {
    const off = await person.agent.patch('/api/v1/me').send({ weekReportMail: false }).expect(200);
    expect(off.body.user).toMatchObject({ weekReportMail: false, alarmMail: true });
    expect(await stored()).toMatchObject({ week_report_mail: false, alarm_mail: true });
    const me = await person.agent.get('/api/v1/me').expect(200);
    expect(me.body.user.weekReportMail).toBe(false);
    await person.agent.patch('/api/v1/me').send({ weekReportMail: true }).expect(200);
    expect(await stored()).toMatchObject({ week_report_mail: true, alarm_mail: true });
  });

  it('needs a session: no cookie answers 401 and nobody changes', async () => {
    const res = await request(t.app).patch('/api/v1/me').send({ weekReportMail: false });
    expect(res.status).toBe(401);
    expect(res.body).toEqual(errorShape);
    expect((await stored()).week_report_mail).toBe(true);
  });
});
