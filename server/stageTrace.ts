/**
 * Stage timings for the bench (STAGE_TRACE=1 in the environment of `npm run bench`, which its
 * server and broker inherit): how long a reading waits at each step of the live path, printed
 * to stderr as count, sum, p50/p99/max every 5 s with the process's event-loop delay. A diagnostic switch,
 * not configuration: read here once rather than through server/config.ts so the broker process
 * (which has its own config) gets it too. Off, each call is one comparison.
 *
 * Stages: broker.token (token check), broker.forward (hand-over to the server until its
 * PUBACK), broker.chosenOpen (forwards already open on the connection chosen), mqtt.identity,
 * mqtt.answer (a message's whole store on the server), writer.queue, writer.statement,
 * writer.groupRows, notify.lag (statement returned → notification heard), hub.fanout,
 * ingest.http (an ingest request from its route's first step to the 202 written),
 * ingest.prepare (checks, derivation and the surface estimate), and gc.minor / gc.major /
 * gc.incremental / gc.weakcb (each collection's pause, by kind).
 */
import { constants, monitorEventLoopDelay, PerformanceObserver } from 'node:perf_hooks';

export const stageTraceOn = process.env.STAGE_TRACE === '1';
const samples = new Map<string, number[]>();

/** When each live message's statement returned, until the hub hears its notification. */
const committedAtMs = new Map<string, number>();

export function markCommitted(payloads: readonly string[]): void {
  if (!stageTraceOn) return;
  const t = performance.now();
  for (const p of payloads) committedAtMs.set(p, t);
}

/** Commit → notification heard (the LISTEN connection and this event loop), for one payload. */
export function markHeard(payload: string): void {
  if (!stageTraceOn) return;
  const t = committedAtMs.get(payload);
  if (t === undefined) return;
  committedAtMs.delete(payload);
  stageMs('notify.lag', performance.now() - t);
}

export function stageMs(name: string, ms: number): void {
  if (!stageTraceOn) return;
  const list = samples.get(name);
  if (list) list.push(ms);
  else samples.set(name, [ms]);
}

const GC_KINDS: Record<number, string> = {
  [constants.NODE_PERFORMANCE_GC_MINOR]: 'minor',
  [constants.NODE_PERFORMANCE_GC_MAJOR]: 'major',
  [constants.NODE_PERFORMANCE_GC_INCREMENTAL]: 'incremental',
  [constants.NODE_PERFORMANCE_GC_WEAKCB]: 'weakcb',
};

if (stageTraceOn) {
  // Collections pause the event loop; their lengths tell a GC tail from a queueing one.
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) {
      const kind = (entry as { detail?: { kind?: number } }).detail?.kind;
      stageMs(`gc.${GC_KINDS[kind ?? 0] ?? kind}`, entry.duration);
    }
  }).observe({ entryTypes: ['gc'] });
  const loop = monitorEventLoopDelay({ resolution: 1 });
  loop.enable();
  setInterval(() => {
    const pick = (s: number[], q: number) => s[Math.min(s.length - 1, Math.floor(q * s.length))]!;
    const parts = [...samples].map(([name, s]) => {
      s.sort((a, b) => a - b);
      const sum = s.reduce((a, b) => a + b, 0);
      return `${name} n=${s.length} sum=${sum.toFixed(0)} p50=${pick(s, 0.5).toFixed(1)} p99=${pick(s, 0.99).toFixed(1)} max=${s.at(-1)!.toFixed(1)}`;
    });
    parts.push(
      `loopDelay p99=${(loop.percentile(99) / 1e6).toFixed(1)} max=${(loop.max / 1e6).toFixed(1)}`,
    );
    loop.reset();
    samples.clear();
    process.stderr.write(`stage[${process.pid}] ${parts.join(' | ')}\n`);
  }, 5000).unref();
}
