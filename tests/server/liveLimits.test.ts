// The live hub's limits: what one client may cost an instance (frame size, sockets per person,
// an unread send buffer), and when an open socket's access ends without a notice reaching it
// (its session expires, or a removal happened while the LISTEN connection was down).
import { randomUUID } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type net from 'node:net';

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import WebSocket from 'ws';

import { LIVE_CHANNEL } from '@/db/notify';
import { createSessionSigner, SESSION_COOKIE, SESSION_TTL_S } from '@/server/auth/session';
import { startLiveHub } from '@/server/live/hub';
import { startNotificationListener } from '@/db/listener';
import { silentLogger } from '@/server/logger';

import {
  makeTestApp,
  ownerWithMember,
  ownerWithSensor,
  TEST_SECRET,
  type TestApp,
} from '../support/app';
import { postIngest } from '../support/ingest';
import { openRecordingSocket, until, type RecordingSocket } from '../support/liveClient';
import { signInCookie } from '../support/sessionCookie';

/** Small enough to reach in a test; the production default is 10. */
const SOCKETS_PER_USER = 3;
// The listener's own connection carries this name, so the test can end it and no other's.
const LISTENER_NAME = `drybench-live-limits-${randomUUID().slice(0, 8)}`;

let t: TestApp;
let listener: ReturnType<typeof startNotificationListener>;
let server: http.Server;
let hub: ReturnType<typeof startLiveHub>;
let wsUrl: string;

beforeAll(async () => {
  t = makeTestApp();
  const url = new URL(process.env.DATABASE_URL!);
  url.searchParams.set('application_name', LISTENER_NAME);
  listener = startNotificationListener(url.toString(), silentLogger());
  hub = startLiveHub({
    listener,
    db: t.db,
    sessions: t.sessions,
    allowedHosts: t.allowedHosts,
    limits: { maxSocketsPerUser: SOCKETS_PER_USER },
  });
  await listener.ready;
  server = http.createServer(t.app);
  hub.attach(server);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  wsUrl = `ws://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1/live`;
});
afterAll(async () => {
  await hub.close();
  await listener.close();
  server.closeAllConnections();
  await new Promise((resolve) => server.close(resolve));
  await t.pool.end();
});

const cookieOf = (person: { email: string; password: string }) => signInCookie(t.app, person);

const open = (cookie: string) => openRecordingSocket(wsUrl, cookie);

/** The socket's close code, or 'open' if it is still open after `timeoutMs`. */
function closeCodeWithin(socket: RecordingSocket, timeoutMs: number): Promise<number | 'open'> {
  return Promise.race([
    socket.closed,
    new Promise<'open'>((r) => setTimeout(() => r('open'), timeoutMs)),
  ]);
}

const readings = (socket: RecordingSocket) =>
  socket.messages.filter((m) => m.type === 'reading').length;

/** An owner's shop with a second person in it as a member, through the invitation routes. */
async function shopWithMember() {
  const { owner: o, member: m } = await ownerWithMember(t);
  return { o, m };
}

describe('live hub limits', () => {
  it('closes a client that sends a frame over 4 KiB with 1009 and keeps serving others', async () => {
    const o = await ownerWithSensor(t);
    const big = await open(await cookieOf(o));
    const other = await open(await cookieOf(o));

    // A small frame is allowed (and ignored): clients have nothing to say beyond pings.
    big.ws.send('x'.repeat(100));
    big.ws.send('x'.repeat(5 * 1024));
    expect(await closeCodeWithin(big, 2000)).toBe(1009);

    await postIngest(t.app, o.token, { air: 19, rh: 55, surface: 15 }).expect(202);
    await until(() => readings(other) === 1);
    expect(other.ws.readyState).toBe(WebSocket.OPEN);
    other.ws.close();
  });

  it('refuses a person more than the cap of open sockets with 429, and frees a slot on close', async () => {
    const a = await ownerWithSensor(t);
    const b = await ownerWithSensor(t);
    const cookie = await cookieOf(a);
    const sockets: RecordingSocket[] = [];
    for (let i = 0; i < SOCKETS_PER_USER; i++) sockets.push(await open(cookie));
    await expect(open(cookie)).rejects.toThrow('refused 429');
    // Another session of the same person counts too: the cap is per account.
    await expect(open(await cookieOf(a))).rejects.toThrow('refused 429');

    // Someone else is not affected.
    const theirs = await open(await cookieOf(b));

    sockets[0]!.ws.close();
    await sockets[0]!.closed;
    let reopened: RecordingSocket | undefined;
    await until(async () => {
      reopened = await open(cookie).catch(() => undefined);
      return reopened !== undefined;
    });
    for (const s of [...sockets.slice(1), reopened!, theirs]) s.ws.close();
  });

  it('drops a client that stops reading while a burst goes out; a reading client gets it all', async () => {
    const o = await ownerWithSensor(t);
    const slow = await open(await cookieOf(o));
    const normal = await open(await cookieOf(o));
    // Stop reading: the kernel buffers fill, then the server's own send buffer grows.
    (slow.ws as unknown as { _socket: net.Socket })._socket.pause();

    // ~14 MB, far past the kernel buffers of both ends on loopback and the 1 MiB bound. Sent in
    // steps of ~350 KB that the reading client takes in before the next: it shares this process
    // with the server, so one burst could outrun its reads on a loaded machine and drop it too.
    const count = 2000;
    const step = 50;
    for (let sent = 0; sent < count; sent += step) {
      await t.pool.query(
        `select pg_notify($1, '{"type":"reading","shopId":"' || $2 || '","n":' || g
           || ',"pad":"' || repeat('x', 7000) || '"}')
         from generate_series($3::int + 1, $3::int + $4::int) as g`,
        [LIVE_CHANNEL, o.shopId, sent, step],
      );
      await until(() => readings(normal) === sent + step, 15_000);
    }
    expect(normal.ws.readyState).toBe(WebSocket.OPEN);

    // Reading again, the slow client finds what the kernel held, then the end of the socket.
    (slow.ws as unknown as { _socket: net.Socket })._socket.resume();
    expect(await closeCodeWithin(slow, 5000)).toBe(1006);
    expect(readings(slow)).toBeLessThan(count);
    normal.ws.close();
  });

  it('closes the socket with 4401 when its session token expires', async () => {
    const o = await ownerWithSensor(t);
    const state = await t.pool.query<{ session_version: number }>(
      'select session_version from users where id = $1',
      [o.user.id],
    );
    // A token signed (nearly) a whole lifetime ago: it expires in 2–3 s from now.
    const signedEarlier = createSessionSigner(
      TEST_SECRET,
      false,
      () => Date.now() - SESSION_TTL_S * 1000 + 3000,
    );
    const token = await signedEarlier.sign(o.user.id, state.rows[0]!.session_version);
    const cookie = `${SESSION_COOKIE}=${token}`;
    const socket = await open(cookie);
    await until(() => socket.messages.some((m) => m.type === 'hello'));

    expect(await closeCodeWithin(socket, 6000)).toBe(4401);
    await expect(open(cookie)).rejects.toThrow('refused 401');
  });

  it('re-checks every socket after the LISTEN connection comes back', async () => {
    const { o, m } = await shopWithMember();
    const member = await open(await cookieOf(m));
    const owner = await open(await cookieOf(o));
    const listening = async () =>
      (
        await t.pool.query(
          'select 1 from pg_stat_activity where application_name = $1 and state is not null',
          [LISTENER_NAME],
        )
      ).rowCount === 1;
    expect(await listening()).toBe(true);

    await t.pool.query(
      'select pg_terminate_backend(pid) from pg_stat_activity where application_name = $1',
      [LISTENER_NAME],
    );
    // Removed while nobody listens: no access notice, as if it had been lost with the connection.
    await t.pool.query('delete from memberships where user_id = $1 and shop_id = $2', [
      m.user.id,
      o.shopId,
    ]);
    await until(listening, 5000);

    await until(() => member.messages.some((x) => x.type === 'access'), 5000);
    expect(member.messages.at(-1)).toEqual({ type: 'access', shopIds: [] });
    await postIngest(t.app, o.token, { air: 19, rh: 55, surface: 15 }).expect(202);
    await until(() => readings(owner) === 1);
    await new Promise((r) => setTimeout(r, 200));
    expect(readings(member)).toBe(0);
    member.ws.close();
    owner.ws.close();
  });
});
