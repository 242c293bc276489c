// The ingest route as a sensor calls it, for API tests: POST /api/v1/ingest with the sensor's
// bearer token. The caller expects the status, so refusals can be tested with it too.
import request from 'supertest';

/** A sensor's request to an app or a base URL; the body is one reading or `{ readings }`. */
export function postIngest(app: Parameters<typeof request>[0], token: string, body: object) {
  return request(app).post('/api/v1/ingest').set('authorization', `Bearer ${token}`).send(body);
}
