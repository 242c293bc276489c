// Both ends of the broker ↔ server hand-over turn Nagle's algorithm off (TCP_NODELAY). The
// hand-over is a chain of small packets (the forwarded PUBLISH, the server's PUBACK, the
// sensor's PUBACK); with Nagle's algorithm (RFC 896) a small segment written while an earlier
// one is unacknowledged waits for that ACK, and the receiver may delay its ACK (RFC 1122
// 4.2.3.2: up to 500 ms; Linux's minimum is 40 ms, from memory of tcp(7)'s quickack notes).
// In the bench's stage trace the hand-over (broker.forward) outlasted the server's own store
// (mqtt.answer) by 32–38 ms at the p50 before, 2–14 ms after, in the calmest runs
// (scripts/bench/FINDINGS.md, "MQTT hand-over and Nagle's delay"). Node offers no getter for the
// option, so the calls that set it are watched.
import net from 'node:net';

import { afterAll, beforeAll, expect, it, vi } from 'vitest';

import type { MqttIngest, RunningBroker } from '@/server/mqtt';

import { makeTestApp, type TestApp } from '../support/app';
import { startTestBroker, startTestIngest } from '../support/mqtt';

let t: TestApp;
let broker: RunningBroker;
let ingest: MqttIngest;
const createServer = vi.spyOn(net, 'createServer');
const setNoDelay = vi.spyOn(net.Socket.prototype, 'setNoDelay');

beforeAll(async () => {
  t = makeTestApp();
  broker = await startTestBroker(t);
  ingest = startTestIngest(t, broker.port, 3);
  await ingest.ready;
});
afterAll(async () => {
  vi.restoreAllMocks();
  await ingest.close();
  await broker.close();
  await t.pool.end();
});

it('listens with noDelay on every accepted connection', () => {
  expect(createServer).toHaveBeenCalledWith({ noDelay: true }, expect.any(Function));
});

it('turns Nagle off on each of the server’s connections to the broker', () => {
  const sockets = new Set(
    setNoDelay.mock.contexts.filter((_, i) => setNoDelay.mock.calls[i]![0] === true),
  );
  // Three connections, each its own socket (the broker's accepted ends are set through their
  // handles, not Socket.prototype, so they are not counted here).
  expect(sockets.size).toBe(3);
});
