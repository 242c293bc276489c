// Zone and sensor changes reach the shop's other open tabs: each write sends `{ type: 'zones' }`
// or `{ type: 'sensors' }` with the shop's id through NOTIFY once it commits, to every socket of
// the shop's members, and to no socket of another shop (tenant isolation).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { ownerWithMember, ownerWithSensor, type TestApp } from '../support/app';
import { postIngest } from '../support/ingest';
import { startHubServer, type HubServer } from '../support/liveHub';
import { openRecordingSocket, until, type RecordingSocket } from '../support/liveClient';
import { signInCookie } from '../support/sessionCookie';

let hubServer: HubServer;
let t: TestApp;
let wsUrl: string;

beforeAll(async () => {
  hubServer = await startHubServer();
  ({ t, wsUrl } = hubServer);
});
afterAll(() => hubServer.close());

type Owner = Awaited<ReturnType<typeof ownerWithSensor>>;

/** A shop whose owner has a second person in it as a member, each with a socket open. */
async function shopWithMemberSockets() {
  const { owner, member } = await ownerWithMember(t);
  const memberSocket = await openRecordingSocket(wsUrl, await signInCookie(t.app, member));
  return { owner, memberSocket };
}

const changes = (socket: RecordingSocket, type: 'zones' | 'sensors') =>
  socket.messages.filter((m) => m.type === type);

/** Runs `write` and waits for exactly one more `type` message on `socket`, for `shopId`. */
async function expectAnnounced(
  socket: RecordingSocket,
  type: 'zones' | 'sensors',
  shopId: string,
  write: () => Promise<unknown>,
) {
  const before = changes(socket, type).length;
  await write();
  await until(() => changes(socket, type).length > before);
  expect(changes(socket, type).at(-1)).toEqual({ type, shopId });
}

let outsider: { socket: RecordingSocket; owner: Owner };

describe('zone and sensor changes on the live socket', () => {
  beforeAll(async () => {
    // Another shop's owner with a socket open all along: it must never hear of the first shop.
    const owner = await ownerWithSensor(t);
    outsider = {
      owner,
      socket: await openRecordingSocket(wsUrl, await signInCookie(t.app, owner)),
    };
  });
  afterAll(() => outsider.socket.ws.close());

  it('tells a second member when a zone is created, renamed, its limits changed and deleted', async () => {
    const { owner, memberSocket } = await shopWithMemberSockets();
    const zones = `/api/v1/shops/${owner.shopId}/zones`;
    let zoneId = '';
    await expectAnnounced(memberSocket, 'zones', owner.shopId, async () => {
      zoneId = (await owner.agent.post(zones).send({ name: 'Lumber rack' }).expect(201)).body.id;
    });
    await expectAnnounced(memberSocket, 'zones', owner.shopId, () =>
      owner.agent.patch(`${zones}/${zoneId}`).send({ name: 'Lumber loft' }).expect(200),
    );
    await expectAnnounced(memberSocket, 'zones', owner.shopId, () =>
      owner.agent.patch(`${zones}/${zoneId}`).send({ cautionK: 4 }).expect(200),
    );
    await expectAnnounced(memberSocket, 'zones', owner.shopId, () =>
      owner.agent.delete(`${zones}/${zoneId}`).expect(204),
    );
    const list = await owner.agent.get(zones).expect(200);
    expect(list.body.zones.map((z: { id: string }) => z.id)).not.toContain(zoneId);
    memberSocket.ws.close();
  });

  it('tells a second member when a sensor is created, renamed, its token revoked and removed', async () => {
    const { owner, memberSocket } = await shopWithMemberSockets();
    const sensors = `/api/v1/shops/${owner.shopId}/sensors`;
    let sensorId = '';
    await expectAnnounced(memberSocket, 'sensors', owner.shopId, async () => {
      const body = { name: 'Jointer probe', zoneId: owner.zoneId };
      sensorId = (await owner.agent.post(sensors).send(body).expect(201)).body.id;
    });
    await expectAnnounced(memberSocket, 'sensors', owner.shopId, () =>
      owner.agent.patch(`${sensors}/${sensorId}`).send({ name: 'Jointer bed' }).expect(200),
    );
    await expectAnnounced(memberSocket, 'sensors', owner.shopId, () =>
      owner.agent.delete(`${sensors}/${sensorId}/token`).expect(204),
    );
    await expectAnnounced(memberSocket, 'sensors', owner.shopId, () =>
      owner.agent.delete(`${sensors}/${sensorId}`).expect(204),
    );
    memberSocket.ws.close();
  });

  it('sends nothing to a socket of another shop', async () => {
    const { owner, memberSocket } = await shopWithMemberSockets();
    await expectAnnounced(memberSocket, 'zones', owner.shopId, () =>
      owner.agent.post(`/api/v1/shops/${owner.shopId}/zones`).send({ name: 'Booth' }).expect(201),
    );
    await expectAnnounced(memberSocket, 'sensors', owner.shopId, () =>
      owner.agent
        .post(`/api/v1/shops/${owner.shopId}/sensors`)
        .send({ name: 'Booth probe', zoneId: owner.zoneId })
        .expect(201),
    );
    // The outsider's own shop changes do reach it, so silence about the first shop means
    // isolation, not a dead socket.
    await expectAnnounced(outsider.socket, 'zones', outsider.owner.shopId, () =>
      outsider.owner.agent
        .post(`/api/v1/shops/${outsider.owner.shopId}/zones`)
        .send({ name: 'Own zone' })
        .expect(201),
    );
    const foreign = outsider.socket.messages.filter(
      (m) => (m as { shopId?: string }).shopId === owner.shopId,
    );
    expect(foreign).toEqual([]);
    memberSocket.ws.close();
  });

  it('refuses to delete a zone that still holds a sensor or readings, and announces nothing', async () => {
    const { owner, memberSocket } = await shopWithMemberSockets();
    const zones = `/api/v1/shops/${owner.shopId}/zones`;
    const res = await owner.agent.delete(`${zones}/${owner.zoneId}`).expect(409);
    expect(res.body.error.code).toBe('zone_has_sensors');
    // Readings stay history even after their sensor is removed.
    await postIngest(t.app, owner.token, { air: 18, rh: 50, surface: 16 }).expect(202);
    await owner.agent.delete(`/api/v1/shops/${owner.shopId}/sensors/${owner.sensorId}`).expect(204);
    const again = await owner.agent.delete(`${zones}/${owner.zoneId}`).expect(409);
    expect(again.body.error.code).toBe('zone_has_readings');
    const zonesBefore = changes(memberSocket, 'zones').length;
    await new Promise((r) => setTimeout(r, 200));
    expect(changes(memberSocket, 'zones').length).toBe(zonesBefore);
    await owner.agent.delete(`${zones}/not-a-uuid`).expect(404);
    memberSocket.ws.close();
  });
});
