// The group writer's array parameters are built as PostgreSQL array literals by hand
// (db/arrayLiteral.ts). The reference is node-postgres's own serializer of the same JavaScript
// arrays: PostgreSQL must read both into the same values, at the edges of float8's text form
// (exponents, negative zero, the extremes, NULL) and for the uuids, enum labels and ISO times.
import pg from 'pg';
import { afterAll, describe, expect, it } from 'vitest';

import { numberArray, plainArray } from '@/db/arrayLiteral';

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1 });
afterAll(() => pool.end());

async function readBack(type: string, literal: string, values: readonly unknown[]) {
  const { rows } = await pool.query<{ ours: string; theirs: string }>(
    `select ($1::${type}[])::text as ours, ($2::${type}[])::text as theirs`,
    [literal, values],
  );
  return rows[0]!;
}

describe('array literals built by hand', () => {
  it('read as the same float8 values as node-postgres sends', async () => {
    const values = [
      0,
      -0,
      1.5,
      -273.15,
      0.1 + 0.2,
      1e-7,
      5e-324,
      1.7976931348623157e308,
      1e21,
      -1e-21,
      12.379999999999999,
      null,
      42,
    ];
    const { ours, theirs } = await readBack('float8', numberArray(values), values);
    expect(ours).toBe(theirs);
    expect(ours).toContain('NULL');
    expect(ours).toContain('1e-07');
  });

  it('read as the same uuids, enum labels and times', async () => {
    const uuids = [
      '0b5c6f1e-8e0a-4c51-9d8e-1234567890ab',
      null,
      '7d1a2c3e-0000-4000-8000-000000000001',
    ];
    const u = await readBack('uuid', plainArray(uuids), uuids);
    expect(u.ours).toBe(u.theirs);
    const levels = ['dry', 'close', 'wet', 'unknown', null];
    const l = await readBack('level', plainArray(levels), levels);
    expect(l.ours).toBe(l.theirs);
    const times = [
      new Date(Date.UTC(2026, 11, 3, 0, 0, 0, 5)).toISOString(),
      '1970-01-01T00:00:00.000Z',
    ];
    const t = await readBack('timestamptz', plainArray(times), times);
    expect(t.ours).toBe(t.theirs);
    expect(plainArray([])).toBe('{}');
  });
});
