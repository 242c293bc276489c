// The health probe on the real test database.
import request from 'supertest';
import { afterAll, beforeAll, describe, it } from 'vitest';

import { makeTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(() => {
  t = makeTestApp();
});
afterAll(() => t.pool.end());

describe('health', () => {
  it('answers ok when the database is reachable', async () => {
    await request(t.app).get('/api/v1/health').expect(200, { ok: true });
  });
});
