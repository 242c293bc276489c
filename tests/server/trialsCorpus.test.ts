// Bad input to the trials routes: each a 400 in the shared error shape, never a 500.
import { randomUUID } from 'node:crypto';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { makeTestApp, verifiedPerson, type TestApp } from '../support/app';
import { errorShape } from '../support/errorShape';

let t: TestApp;
let base: string;
let trialPath: string;
let ranksPath: string;
let treatmentIds: string[];
let foreignTreatmentId: string;
let agent: Awaited<ReturnType<typeof verifiedPerson>>['agent'];

const names = (n: number) => Array.from({ length: n }, (_v, i) => `Treatment ${i + 1}`);
const goodTest = {
  name: 'Cold morning',
  kind: 'condensation',
  from: '2026-01-12T06:00:00Z',
  to: '2026-01-12T10:00:00Z',
};

beforeAll(async () => {
  t = makeTestApp();
  agent = (await verifiedPerson(t, 'Owner')).agent;
  const shopId = (
    await agent
      .post('/api/v1/shops')
      .send({ name: 'Tamarack', timeZone: 'America/Chicago' })
      .expect(201)
  ).body.id as string;
  base = `/api/v1/shops/${shopId}/trials`;
  const trial = (
    await agent
      .post(base)
      .send({ name: 'Top protection', treatments: ['Paste wax', 'Camellia oil', 'Bare'] })
      .expect(201)
  ).body;
  treatmentIds = trial.treatments.map((x: { id: string }) => x.id);
  trialPath = `${base}/${trial.id}`;
  const test = (await agent.post(`${trialPath}/tests`).send(goodTest).expect(201)).body;
  ranksPath = `${trialPath}/tests/${test.id}/ranks`;
  const other = (
    await agent
      .post(base)
      .send({ name: 'Other', treatments: ['A', 'B', 'C'] })
      .expect(201)
  ).body;
  foreignTreatmentId = other.treatments[0].id;
});
afterAll(() => t.pool.end());

interface ErrorBody {
  error: { code: string; details: { path: string }[] };
}

function expect400(res: { status: number; text: string; body: ErrorBody }, detailPath: string) {
  expect(res.status, res.text).toBe(400);
  expect(res.body).toMatchObject(errorShape);
  expect(res.body.error.code).toBe('invalid_input');
  expect(res.body.error.details.map((d) => d.path)).toContain(detailPath);
}

describe('trial corpus', () => {
  it.each([
    ['one treatment', { name: 'T', treatments: names(1) }, 'treatments'],
    ['13 treatments', { name: 'T', treatments: names(13) }, 'treatments'],
    ['duplicate names', { name: 'T', treatments: ['Wax', 'Oil', 'Wax'] }, 'treatments'],
    ['duplicate names in other case', { name: 'T', treatments: ['Wax', 'wax'] }, 'treatments'],
    ['an empty treatment name', { name: 'T', treatments: ['Wax', '  '] }, 'treatments.1'],
    ['treatments not a list', { name: 'T', treatments: 'Wax, Oil' }, 'treatments'],
    ['no name', { treatments: names(2) }, 'name'],
    ['a name with a direction override', { name: 'Wax\u202eliO', treatments: names(2) }, 'name'],
    ['an unknown field', { name: 'T', treatments: names(2), winner: 'Wax' }, ''],
  ])('POST trial with %s → 400', async (_name, body, detailPath) => {
    expect400(await agent.post(base).send(body), detailPath);
  });

  it.each([
    ['from ≥ to', { ...goodTest, to: goodTest.from }, 'to'],
    ['to before from', { ...goodTest, from: '2026-01-13T00:00:00Z' }, 'to'],
    ['an unknown kind', { ...goodTest, kind: 'salt_spray' }, 'kind'],
    ['a time without offset', { ...goodTest, from: '2026-01-12T06:00:00' }, 'from'],
    ['a time before 2000', { ...goodTest, from: '1999-12-31T00:00:00Z' }, 'from'],
    ['a zone id that is not a uuid', { ...goodTest, zoneId: 'zone-1' }, 'zoneId'],
    ['a zone of no shop of ours', { ...goodTest, zoneId: randomUUID() }, 'zoneId'],
    ['no name', { ...goodTest, name: '' }, 'name'],
    ['an unknown field', { ...goodTest, sensor: 'x' }, ''],
  ])('POST test with %s → 400', async (_name, body, detailPath) => {
    expect400(await agent.post(`${trialPath}/tests`).send(body), detailPath);
  });

  const ranksOf = (values: number[]) =>
    values.map((rank, i) => ({ treatmentId: treatmentIds[i], rank }));
  it.each<[string, () => object, string]>([
    ['rank 0', () => ({ ranks: ranksOf([0, 1, 2]) }), 'ranks.0.rank'],
    ['rank > N', () => ({ ranks: ranksOf([1, 2, 4]) }), 'ranks'],
    ['a rank of 1.3', () => ({ ranks: ranksOf([1.3, 2, 3]) }), 'ranks.0.rank'],
    [
      'a rank as text',
      () => ({
        ranks: ranksOf([1, 2]).concat({ treatmentId: treatmentIds[2]!, rank: '3' as never }),
      }),
      'ranks.2.rank',
    ],
    ['a missing treatment', () => ({ ranks: ranksOf([1, 2]) }), 'ranks'],
    [
      'a treatment twice',
      () => ({ ranks: [...ranksOf([1, 2]), { treatmentId: treatmentIds[0], rank: 3 }] }),
      'ranks',
    ],
    [
      "another trial's treatment",
      () => ({ ranks: [...ranksOf([1, 2]), { treatmentId: foreignTreatmentId, rank: 3 }] }),
      'ranks',
    ],
    [
      'a treatment id that is not a uuid',
      () => ({ ranks: [...ranksOf([1, 2]), { treatmentId: 'x', rank: 3 }] }),
      'ranks.2.treatmentId',
    ],
    ['ranks not a list', () => ({ ranks: { a: 1 } }), 'ranks'],
    ['an unknown field', () => ({ ranks: ranksOf([1, 2, 3]), note: 'x' }), ''],
    [
      'an unknown field in a rank',
      () => ({ ranks: ranksOf([1, 2, 3]).map((r) => ({ ...r, why: 'x' })) }),
      'ranks.0',
    ],
  ])('PUT ranks with %s → 400', async (_name, body, detailPath) => {
    expect400(await agent.put(ranksPath).send(body()), detailPath);
  });

  it('answers 404 for a trial or test id that is not ours or not an id', async () => {
    for (const path of [`${base}/${randomUUID()}`, `${base}/nope`]) {
      const res = await agent.get(path);
      expect(res.status).toBe(404);
      expect(res.body).toMatchObject(errorShape);
    }
    const res = await agent
      .put(`${trialPath}/tests/${randomUUID()}/ranks`)
      .send({ ranks: ranksOf([1, 2, 3]) });
    expect(res.status).toBe(404);
  });

  it('takes good ranks with a tie (the check that the corpus is not refusing everything)', async () => {
    const res = await agent
      .put(ranksPath)
      .send({ ranks: ranksOf([1, 1, 3]) })
      .expect(200);
    expect(res.body.ranks).toHaveLength(3);
  });
});
