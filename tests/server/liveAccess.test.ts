// The live hub applies the same rules as the HTTP routes: a removed member stops receiving a
// shop's readings as soon as the removal commits, a signed-out session's socket closes, and a
// page on another site cannot open a socket with the cookie.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { ownerWithMember, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';
import { startHubServer, type HubServer } from '../support/liveHub';
import { openRecordingSocket, until } from '../support/liveClient';
import { signInCookie } from '../support/sessionCookie';

let hubServer: HubServer;
let t: TestApp;
let wsUrl: string;

beforeAll(async () => {
  hubServer = await startHubServer();
  ({ t, wsUrl } = hubServer);
});
afterAll(() => hubServer.close());

/** A fresh session of this account, as the Cookie header a browser would send. */
const cookieOf = (person: { email: string; password: string }) => signInCookie(t.app, person);

const open = (cookie: string, origin?: string) => openRecordingSocket(wsUrl, cookie, origin);

describe('live hub access', () => {
  it('stops sending a shop to a member once removed', async () => {
    const { owner: o, member: m } = await ownerWithMember(t);

    const socket = await open(await cookieOf(m));
    const readings = () => socket.messages.filter((x) => x.type === 'reading').length;
    const post = () => postIngest(t.app, o.token, { air: 19, rh: 55, surface: 15 }).expect(202);
    await post();
    await until(() => readings() === 1);

    await o.agent.delete(`/api/v1/shops/${o.shopId}/members/${m.user.id}`).expect(204);
    await until(() => socket.messages.some((x) => x.type === 'access'));
    expect(socket.messages.at(-1)).toEqual({ type: 'access', shopIds: [] });
    await post();
    await new Promise((r) => setTimeout(r, 300));
    expect(readings()).toBe(1);
    socket.ws.close();
  });

  it('closes the socket of a session that signed out', async () => {
    const o = await ownerWithSensor(t);
    const cookie = await cookieOf(o);
    const socket = await open(cookie);
    await o.agent.post('/api/v1/auth/sign-out').expect(204);
    expect(await socket.closed).toBe(4401);
    await expect(open(cookie)).rejects.toThrow('refused 401');
  });

  it('refuses a socket opened from another site', async () => {
    const o = await ownerWithSensor(t);
    await expect(open(await cookieOf(o), 'http://evil.example')).rejects.toThrow('refused 403');
  });
});
