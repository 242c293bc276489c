/**
 * POST → WebSocket latency: signed-in browsers hold live sockets to the shop; the shop's probe
 * sensors, in turn, post one reading every `intervalMs`; the latency of a delivery is from just
 * before the POST is sent to the moment that socket's message handler runs, so it covers the
 * request (the alarm step included), the commit, pg_notify, the hub's fan-out and the client's
 * own event loop.
 */
import { monitorEventLoopDelay } from 'node:perf_hooks';

import { WebSocket } from 'ws';

import { LIVE_PATH, type ReadingMessage } from '@/ingest/wire/live';

import type { ReadingSource } from './readings';
import { summarize, type LatencySummary } from './stats';

// Connecting all at once would measure the upgrade stampede, not the steady state.
const CONNECT_WAVE = 25;

export interface LiveClients {
  count: number;
  onMessage(handler: (data: string) => void): void;
  close(): void;
}

export async function connectLiveClients(opts: {
  url: string;
  cookie: string;
  count: number;
}): Promise<LiveClients> {
  const wsUrl = `${opts.url.replace(/^http/, 'ws')}${LIVE_PATH}`;
  const sockets: WebSocket[] = [];
  let handler: (data: string) => void = () => {};
  const connectOne = () =>
    new Promise<WebSocket>((resolve, reject) => {
      const socket = new WebSocket(wsUrl, { headers: { cookie: opts.cookie } });
      socket.once('error', reject);
      socket.once('message', (data) => {
        const hello = JSON.parse(String(data)) as { type: string };
        if (hello.type !== 'hello') return reject(new Error(`expected hello, got ${hello.type}`));
        socket.on('message', (message) => handler(String(message)));
        resolve(socket);
      });
    });
  try {
    while (sockets.length < opts.count) {
      const wave = Math.min(CONNECT_WAVE, opts.count - sockets.length);
      sockets.push(...(await Promise.all(Array.from({ length: wave }, connectOne))));
    }
  } catch (err) {
    for (const s of sockets) s.terminate();
    throw err;
  }
  return {
    count: sockets.length,
    onMessage: (h) => (handler = h),
    close: () => sockets.forEach((s) => s.terminate()),
  };
}

export interface LiveLatencyResult {
  probes: number;
  /** Deliveries that did not arrive within the grace period after the phase. */
  missing: number;
  /** Probe POSTs that were not answered 202. */
  failedPosts: number;
  delivery: LatencySummary;
  /** The probe's own POST → 202. */
  post: LatencySummary;
  /** The bench process's event-loop delay p99: how much of the latency is the clients' own. */
  clientLoopDelayP99Ms: number;
}

export async function measureLiveLatency(opts: {
  url: string;
  clients: LiveClients;
  probeTokens: string[];
  intervalMs: number;
  durationS: number;
  readings: ReadingSource;
}): Promise<LiveLatencyResult> {
  const sentAtMs = new Map<string, number>();
  const deliveryMs: number[] = [];
  const postMs: number[] = [];
  let failures = 0;
  opts.clients.onMessage((data) => {
    const receivedMs = performance.now();
    // The hub also sends alarm and access messages; only the probe's readings are timed.
    const message = JSON.parse(data) as { type: string };
    if (message.type !== 'reading') return;
    const t0 = sentAtMs.get((message as ReadingMessage).reading.at);
    if (t0 !== undefined) deliveryMs.push(receivedMs - t0);
  });

  const loopDelay = monitorEventLoopDelay({ resolution: 1 });
  loopDelay.enable();
  const posts: Promise<void>[] = [];
  let turn = 0;
  const probe = async () => {
    const token = opts.probeTokens[turn++ % opts.probeTokens.length]!;
    const reading = opts.readings.next();
    const t0 = performance.now();
    sentAtMs.set(reading.at, t0);
    const res = await fetch(`${opts.url}/api/v1/ingest`, {
      method: 'POST',
      headers: {
        authorization: `Bearer ${token}`,
        'content-type': 'application/json',
      },
      body: JSON.stringify(reading),
      signal: AbortSignal.timeout(10_000),
    });
    await res.arrayBuffer();
    if (res.status === 202) postMs.push(performance.now() - t0);
    else failures++;
  };

  const startMs = performance.now();
  const probes = Math.floor((opts.durationS * 1000) / opts.intervalMs);
  for (let i = 0; i < probes; i++) {
    // A fixed schedule, so a slow answer does not space the next probes out.
    const dueMs = startMs + i * opts.intervalMs;
    await new Promise((resolve) => setTimeout(resolve, Math.max(0, dueMs - performance.now())));
    posts.push(probe().catch(() => void failures++));
  }
  await Promise.all(posts);
  const expected = (probes - failures) * opts.clients.count;
  const graceEndMs = performance.now() + 2000;
  while (deliveryMs.length < expected && performance.now() < graceEndMs) {
    await new Promise((resolve) => setTimeout(resolve, 20));
  }
  loopDelay.disable();
  opts.clients.onMessage(() => {});
  return {
    probes,
    missing: expected - deliveryMs.length,
    failedPosts: failures,
    delivery: summarize(deliveryMs),
    post: summarize(postMs),
    clientLoopDelayP99Ms: loopDelay.percentile(99) / 1e6,
  };
}
