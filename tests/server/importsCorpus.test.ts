// Bad-input corpus for CSV imports (the imports contract): every malformed file and every bad
// choice of columns answers its own code in the shared error shape, never a 500, and stores
// nothing — no import row and no object for a refused file, the import still "uploaded" and no
// reading for a refused start. Then cancel: before the job runs and while it runs, nothing lands.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { ownerWithSensor } from '../support/app';
import { errorShape } from '../support/errorShape';
import {
  importsPath,
  ISO_MAPPING as MAPPING,
  startImportWorld,
  upload,
  waitForEnd,
  type ImportWorld,
} from '../support/imports';

let w: ImportWorld;
let o: Awaited<ReturnType<typeof ownerWithSensor>>;
let base: string;
beforeAll(async () => {
  // The queue is not worked until the cancel tests: refused starts must queue nothing.
  w = await startImportWorld('pgboss_imports_corpus', { work: false });
  o = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
  base = importsPath(o.shopId, o.sensorId);
});
afterAll(() => w.close());

async function importRows() {
  const { rows } = await w.t.pool.query(
    'select count(*)::int as n from imports where sensor_id = $1',
    [o.sensorId],
  );
  return rows[0].n as number;
}

const GOOD =
  'time,air,rh,surface\n2025-06-01T00:00:00Z,14.2,71,11.9\n2025-06-01T00:10:00Z,14.1,72,\n';

// [what, file bytes, status, code]
const BAD_FILES: [string, Buffer, number, string][] = [
  ['an empty file', Buffer.alloc(0), 400, 'file_empty'],
  ['blank lines only', Buffer.from('\n\r\n  \n'), 400, 'file_empty'],
  [
    'a PNG',
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]),
    400,
    'file_binary',
  ],
  ['UTF-16 text (NUL bytes)', Buffer.from('time,air\n1,2\n', 'utf16le'), 400, 'file_binary'],
  [
    'not UTF-8 (Latin-1 bytes)',
    Buffer.from([0x74, 0x2c, 0xb0, 0x43, 0x0a, 0xff, 0xfe, 0x0a]),
    400,
    'file_binary',
  ],
  [
    'a NUL past the head',
    Buffer.concat([Buffer.from(GOOD), Buffer.alloc(70_000, 0x20), Buffer.from([0])]),
    400,
    'file_binary',
  ],
  [
    'numbers in the first line',
    Buffer.from('1748736000,14.2,71\n1748736600,14.1,72\n'),
    400,
    'no_header',
  ],
  ['times in the first line', Buffer.from('2025-06-01T00:00:00Z;14.2;71\n'), 400, 'no_header'],
  [
    'one column (spaces between)',
    Buffer.from('time air rh\n2025-06-01 14.2 71\n'),
    400,
    'one_column',
  ],
  ['one column only', Buffer.from('time\n2025-06-01T00:00:00Z\n'), 400, 'one_column'],
];

describe('refused files store nothing', () => {
  it.each(BAD_FILES)('%s', async (_what, bytes, status, code) => {
    const res = await upload(o.agent, base, bytes);
    expect(res.status, res.text).toBe(status);
    expect(res.body).toEqual(errorShape);
    expect(res.body.error.code).toBe(code);
    expect(await importRows()).toBe(0);
    expect(await w.s3.keys(`shops/${o.shopId}/imports/`)).toEqual([]);
  });

  it('no file field → 400 file_missing', async () => {
    const res = await o.agent.post(base).field('note', 'no file');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('file_missing');
    expect(await importRows()).toBe(0);
  });

  it('a file over 50 MB → 413 file_too_large', async () => {
    const big = Buffer.alloc(50 * 1024 * 1024 + 1, 0x41);
    const res = await upload(o.agent, base, big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('file_too_large');
    expect(await importRows()).toBe(0);
  });

  it("another shop's sensor → 404, and a viewer is refused by the policy", async () => {
    const other = await ownerWithSensor({ app: w.baseUrl, outbox: w.t.outbox });
    const res = await upload(o.agent, importsPath(o.shopId, other.sensorId), GOOD);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('sensor_not_found');
  });
});

describe('the upload', () => {
  it('answers the preview and keeps the file in storage', async () => {
    const res = await upload(o.agent, base, `\uFEFF${GOOD}`, 'cellar logger.csv').expect(201);
    expect(res.body.preview).toEqual({
      delimiter: ',',
      columns: ['time', 'air', 'rh', 'surface'],
      rows: [
        ['2025-06-01T00:00:00Z', '14.2', '71', '11.9'],
        ['2025-06-01T00:10:00Z', '14.1', '72', ''],
      ],
      lineCount: 3,
    });
    expect(res.body.suggested).toBeNull();
    expect(res.body.import).toMatchObject({ status: 'uploaded', fileName: 'cellar logger.csv' });
    expect(await w.s3.keys(`shops/${o.shopId}/imports/${res.body.import.id}`)).toHaveLength(1);
  });

  it.each([
    [';', 'time;air;rh\n01.06.2025 00:00;14,2;71\n'],
    ['\t', 'time\tair\trh\n2025-06-01 00:00\t14.2\t71\n'],
    ['|', 'time|air|rh\n2025-06-01 00:00|14.2|71\n'],
  ])('finds the delimiter %j', async (delimiter, text) => {
    const res = await upload(o.agent, base, text).expect(201);
    expect(res.body.preview.delimiter).toBe(delimiter);
    expect(res.body.preview.columns).toEqual(['time', 'air', 'rh']);
  });
});

async function uploaded(text = GOOD): Promise<string> {
  const res = await upload(o.agent, base, text).expect(201);
  return res.body.import.id as string;
}

// [what, file, body, status, code]
const BAD_STARTS: [string, string, () => unknown, number, string][] = [
  ['no body', GOOD, () => ({}), 400, 'invalid_body'],
  ['no remember', GOOD, () => ({ mapping: MAPPING }), 400, 'invalid_body'],
  [
    'an unknown format',
    GOOD,
    () => ({ mapping: { ...MAPPING, timeFormat: 'ymd' }, remember: false }),
    400,
    'invalid_body',
  ],
  [
    'an unknown unit',
    GOOD,
    () => ({ mapping: { ...MAPPING, temperatureUnit: 'K' }, remember: false }),
    400,
    'invalid_body',
  ],
  [
    'no time zone of IANA',
    GOOD,
    () => ({ mapping: { ...MAPPING, timeZone: 'Chicago' }, remember: false }),
    400,
    'invalid_body',
  ],
  [
    'an unknown field',
    GOOD,
    () => ({ mapping: { ...MAPPING, battery: 'b' }, remember: false }),
    400,
    'invalid_body',
  ],
  [
    'a column the file lacks',
    GOOD,
    () => ({ mapping: { ...MAPPING, rhColumn: 'humidity' }, remember: false }),
    400,
    'column_missing',
  ],
  [
    'the same column twice',
    GOOD,
    () => ({ mapping: { ...MAPPING, surfaceColumn: 'air' }, remember: false }),
    400,
    'columns_repeated',
  ],
  [
    'times of another format',
    GOOD,
    () => ({ mapping: { ...MAPPING, timeFormat: 'day-first' }, remember: false }),
    400,
    'times_unreadable',
  ],
  // Epoch milliseconds read as seconds land some 50,000 years ahead.
  [
    'milliseconds read as seconds',
    'time,air,rh\n1748736000000,14.2,71\n',
    () => ({
      mapping: { ...MAPPING, surfaceColumn: null, timeFormat: 'epoch-s' },
      remember: false,
    }),
    400,
    'times_out_of_range',
  ],
  [
    'seconds read as milliseconds (1970)',
    'time,air,rh\n1748736000,14.2,71\n',
    () => ({
      mapping: { ...MAPPING, surfaceColumn: null, timeFormat: 'epoch-ms' },
      remember: false,
    }),
    400,
    'times_out_of_range',
  ],
  // A logger's °F air (e.g. 95 °F) read as °C is past 85 °C on every line.
  [
    '°F read as °C',
    'time,air,rh\n2025-06-01T00:00:00Z,95,71\n2025-06-01T00:10:00Z,96,70\n',
    () => ({ mapping: { ...MAPPING, surfaceColumn: null }, remember: false }),
    400,
    'values_out_of_range',
  ],
  [
    'air and RH swapped, yet plausible (each line is checked later)',
    'time,air,rh\n2025-06-01T00:00:00Z,14,3.1\n',
    () => ({
      mapping: { ...MAPPING, surfaceColumn: null, rhColumn: 'air', airColumn: 'rh' },
      remember: false,
    }),
    202,
    '',
  ],
];

describe('refused starts change nothing', () => {
  it.each(BAD_STARTS)('%s', async (_what, file, body, status, code) => {
    const id = await uploaded(file);
    const res = await o.agent.post(`${base}/${id}/start`).send(body() as object);
    expect(res.status, res.text).toBe(status);
    if (status === 202) return;
    expect(res.body).toEqual(errorShape);
    expect(res.body.error.code).toBe(code);
    const after = await o.agent.get(`${base}/${id}`).expect(200);
    expect(after.body.import.status).toBe('uploaded');
  });

  it('names the missing column in details', async () => {
    const id = await uploaded();
    const res = await o.agent
      .post(`${base}/${id}/start`)
      .send({ mapping: { ...MAPPING, airColumn: 'Temp' }, remember: false })
      .expect(400);
    expect(res.body.error.details).toEqual([{ path: 'column', message: 'Temp' }]);
  });

  it('a second start → 409 import_not_pending; remember saves the choices for the next file', async () => {
    const id = await uploaded();
    await o.agent
      .post(`${base}/${id}/start`)
      .send({ mapping: MAPPING, remember: true })
      .expect(202);
    const again = await o.agent
      .post(`${base}/${id}/start`)
      .send({ mapping: MAPPING, remember: true })
      .expect(409);
    expect(again.body.error.code).toBe('import_not_pending');
    const next = await upload(o.agent, base, GOOD).expect(201);
    expect(next.body.suggested).toEqual(MAPPING);
    // A file without those columns gets no suggestion.
    const other = await upload(o.agent, base, 'when,t,h\n2025-06-01T00:00:00Z,1,2\n').expect(201);
    expect(other.body.suggested).toBeNull();
  });

  it('an unknown import → 404 import_not_found', async () => {
    const res = await o.agent.get(`${base}/00000000-0000-4000-8000-000000000000`).expect(404);
    expect(res.body.error.code).toBe('import_not_found');
    await o.agent.get(`${base}/not-a-uuid/rejected.csv`).expect(404);
  });
});

describe('cancel stores nothing', () => {
  async function readingCount() {
    const { rows } = await w.t.pool.query(
      'select count(*)::int as n from readings where sensor_id = $1',
      [o.sensorId],
    );
    return rows[0].n as number;
  }

  it('before the job runs: cancelled, the job finds nothing to do', async () => {
    // Times of their own, so the jobs queued by the tests above cannot be mistaken for this one.
    const id = await uploaded(
      'time,air,rh\n2023-03-01T00:00:00Z,14.2,71\n2023-03-01T00:10:00Z,14,70\n',
    );
    await o.agent
      .post(`${base}/${id}/start`)
      .send({ mapping: { ...MAPPING, surfaceColumn: null }, remember: false })
      .expect(202);
    const res = await o.agent.post(`${base}/${id}/cancel`).expect(200);
    expect(res.body.import.status).toBe('cancelled');
    await w.work();
    // The job has run when the file is gone from storage.
    await expect
      .poll(() => w.s3.keys(`shops/${o.shopId}/imports/${id}`), { timeout: 15_000 })
      .toEqual([]);
    const end = await waitForEnd(o.agent, `${base}/${id}`);
    expect(end).toMatchObject({ status: 'cancelled', rowsStored: 0 });
    const { rows } = await w.t.pool.query(
      `select count(*)::int as n from readings where sensor_id = $1
       and at >= '2023-03-01' and at < '2023-03-02'`,
      [o.sensorId],
    );
    expect(rows[0].n).toBe(0);
  });

  it('while it runs: rolled back whole, nothing stored', async () => {
    await w.work();
    // Every job queued above has ended once a fresh import of the plain file is done.
    const settled = await uploaded();
    await o.agent.post(`${base}/${settled}/start`).send({ mapping: MAPPING, remember: false });
    await waitForEnd(o.agent, `${base}/${settled}`);
    const before = await readingCount();
    const startMs = Date.UTC(2024, 0, 1);
    const lines = ['time,air,rh'];
    for (let i = 0; i < 300_000; i++) {
      lines.push(`${new Date(startMs + i * 60_000).toISOString()},${14 + (i % 50) / 10},70`);
    }
    const id = await uploaded(lines.join('\n'));
    await o.agent
      .post(`${base}/${id}/start`)
      .send({ mapping: { ...MAPPING, surfaceColumn: null }, remember: false })
      .expect(202);
    await expect
      .poll(async () => (await o.agent.get(`${base}/${id}`)).body.import.status, {
        timeout: 30_000,
        interval: 20,
      })
      .toBe('running');
    const res = await o.agent.post(`${base}/${id}/cancel`).expect(200);
    expect(res.body.import.status).toBe('cancelled');
    const end = await waitForEnd(o.agent, `${base}/${id}`, 60_000);
    expect(end.status).toBe('cancelled');
    // The job rolls back and lets go of the file; then nothing of it is stored.
    await expect
      .poll(() => w.s3.keys(`shops/${o.shopId}/imports/${id}`), { timeout: 60_000 })
      .toEqual([]);
    expect(await readingCount()).toBe(before);
    const finished = await o.agent.post(`${base}/${id}/cancel`).expect(200);
    expect(finished.body.import.status).toBe('cancelled');
    // Its own waits add up to 150 s: the default 20 s was too short on a busy machine.
  }, 150_000);

  it('a finished import → 409 import_finished', async () => {
    await w.work();
    const id = await uploaded();
    await o.agent
      .post(`${base}/${id}/start`)
      .send({ mapping: MAPPING, remember: false })
      .expect(202);
    const end = await waitForEnd(o.agent, `${base}/${id}`);
    expect(end.status).toBe('done');
    const res = await o.agent.post(`${base}/${id}/cancel`).expect(409);
    expect(res.body.error.code).toBe('import_finished');
  });
});
