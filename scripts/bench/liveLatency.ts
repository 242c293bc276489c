/**
 * POST → WebSocket latency: signed-in browsers hold live sockets to the shop (liveSockets.ts);
 * the shop's probe sensors, in turn, post one reading every `intervalMs`; the latency of a
 * delivery is from just before the POST is sent to the moment that socket's message handler
 * runs, so it covers the request (the alarm step included), the commit, the hub's fan-out and
 * the client's own event loop. Both ends read one clock (liveSockets.ts `clockMs`), whichever
 * thread the sockets run on.
 */
import { monitorEventLoopDelay } from 'node:perf_hooks';

import type { LiveClients, LiveClientsWhere } from './liveSockets';
import { clockMs } from './liveSockets';
import type { ReadingSource } from './readings';
import { summarize, type LatencySummary } from './stats';

export interface LiveLatencyResult {
  probes: number;
  /** Deliveries that did not arrive within the grace period after the phase. */
  missing: number;
  /** Probe POSTs that were not answered 202. */
  failedPosts: number;
  delivery: LatencySummary;
  /** The probe's own POST → 202. */
  post: LatencySummary;
  /** Where the watching sockets ran: their own worker thread, or the probe's. */
  clientsWhere: LiveClientsWhere;
  /** Event-loop delay p99 of the sockets' thread: how much of the latency is the clients' own. */
  clientLoopDelayP99Ms: number;
  /** Event-loop delay p99 of the probe's thread (the bench's main one). */
  probeLoopDelayP99Ms: number;
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
  const postMs: number[] = [];
  let failures = 0;
  await opts.clients.record();

  const loopDelay = monitorEventLoopDelay({ resolution: 1 });
  loopDelay.enable();
  const posts: Promise<void>[] = [];
  let turn = 0;
  const probe = async () => {
    const token = opts.probeTokens[turn++ % opts.probeTokens.length]!;
    const reading = opts.readings.next();
    const t0 = clockMs();
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
    if (res.status === 202) postMs.push(clockMs() - t0);
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
  loopDelay.disable();
  const expected = (probes - failures) * opts.clients.count;
  const arrivals = await opts.clients.collect(expected, 2000);
  const deliveryMs: number[] = [];
  arrivals.at.forEach((at, i) => {
    const t0 = sentAtMs.get(at);
    if (t0 !== undefined) deliveryMs.push(arrivals.receivedMs[i]! - t0);
  });
  return {
    probes,
    missing: expected - deliveryMs.length,
    failedPosts: failures,
    delivery: summarize(deliveryMs),
    post: summarize(postMs),
    clientsWhere: opts.clients.where,
    clientLoopDelayP99Ms: arrivals.loopDelayP99Ms,
    probeLoopDelayP99Ms: loopDelay.percentile(99) / 1e6,
  };
}
