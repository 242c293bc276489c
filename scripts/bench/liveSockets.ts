/**
 * The live phase's watching browsers: signed-in sockets to one shop, which note when each reading
 * message arrives. They run on a worker thread of their own by default (liveSocketsWorker.ts), so
 * parsing 200 copies of every message does not delay the probe's schedule and POSTs on the main
 * thread, nor the probe the messages; `inline` keeps them on the main thread, as the bench did
 * before, to compare the two.
 */
import path from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { Worker } from 'node:worker_threads';

import { WebSocket } from 'ws';

import { LIVE_PATH, type ReadingMessage } from '@/ingest/wire/live';

/**
 * One clock for both threads: CLOCK_MONOTONIC, the same in every thread of the process, where
 * each thread's performance.now() counts from its own start.
 */
export const clockMs = () => Number(process.hrtime.bigint()) / 1e6;

// Connecting all at once would measure the upgrade stampede, not the steady state.
const CONNECT_WAVE = 25;

/** A reading message's `at` (the probe's key) and when one socket received it. */
export interface Arrivals {
  at: string[];
  receivedMs: number[];
}

export interface ArrivalsReport extends Arrivals {
  /** Event-loop delay p99 of the thread the sockets run on, over the recording. */
  loopDelayP99Ms: number;
}

export type LiveClientsWhere = 'worker' | 'inline';

export interface LiveClients {
  count: number;
  where: LiveClientsWhere;
  /** Forgets earlier arrivals and starts recording. */
  record(): Promise<void>;
  /**
   * Stops recording once `expected` messages have arrived or `graceMs` has passed, and hands
   * over what was recorded.
   */
  collect(expected: number, graceMs: number): Promise<ArrivalsReport>;
  close(): Promise<void>;
}

export interface LiveClientsSpec {
  url: string;
  cookie: string;
  count: number;
}

/** The sockets on this thread; also what the worker runs. */
export async function connectHere(spec: LiveClientsSpec): Promise<LiveClients> {
  const wsUrl = `${spec.url.replace(/^http/, 'ws')}${LIVE_PATH}`;
  const sockets: WebSocket[] = [];
  let arrivals: Arrivals = { at: [], receivedMs: [] };
  let recording = false;
  const onMessage = (data: string) => {
    if (!recording) return;
    const receivedMs = clockMs();
    // The hub also sends alarm and access messages; only the probe's readings are timed.
    const message = JSON.parse(data) as { type: string };
    if (message.type !== 'reading') return;
    arrivals.at.push((message as ReadingMessage).reading.at);
    arrivals.receivedMs.push(receivedMs);
  };
  const connectOne = () =>
    new Promise<WebSocket>((resolve, reject) => {
      const socket = new WebSocket(wsUrl, { headers: { cookie: spec.cookie } });
      socket.once('error', reject);
      socket.once('message', (data) => {
        const hello = JSON.parse(String(data)) as { type: string };
        if (hello.type !== 'hello') return reject(new Error(`expected hello, got ${hello.type}`));
        socket.on('message', (message) => onMessage(String(message)));
        resolve(socket);
      });
    });
  try {
    while (sockets.length < spec.count) {
      const wave = Math.min(CONNECT_WAVE, spec.count - sockets.length);
      sockets.push(...(await Promise.all(Array.from({ length: wave }, connectOne))));
    }
  } catch (err) {
    for (const s of sockets) s.terminate();
    throw err;
  }
  const loopDelay = monitorEventLoopDelay({ resolution: 1 });
  return {
    count: sockets.length,
    where: 'inline',
    async record() {
      arrivals = { at: [], receivedMs: [] };
      loopDelay.reset();
      loopDelay.enable();
      recording = true;
    },
    async collect(expected, graceMs) {
      const endMs = clockMs() + graceMs;
      while (arrivals.at.length < expected && clockMs() < endMs) {
        await new Promise((resolve) => setTimeout(resolve, 20));
      }
      recording = false;
      loopDelay.disable();
      return { ...arrivals, loopDelayP99Ms: loopDelay.percentile(99) / 1e6 };
    },
    async close() {
      sockets.forEach((s) => s.terminate());
    },
  };
}

/** What the main thread asks of the worker, and what it answers (liveSocketsWorker.ts). */
type WorkerOp =
  { op: 'record' } | { op: 'collect'; expected: number; graceMs: number } | { op: 'close' };
export type WorkerRequest = WorkerOp & { id: number };
/** Id 0 says the sockets are connected (`ready` of them); the others answer a request. */
export interface WorkerReply {
  id: number;
  ready?: number;
  report?: ArrivalsReport;
  error?: string;
}

/** The sockets on a worker thread of their own: the default. */
export async function connectInWorker(spec: LiveClientsSpec): Promise<LiveClients> {
  // A worker given a .ts file refuses it (tsx's loader hooks are the main thread's): it starts
  // from a line that registers tsx's require hook, then loads the entry through it.
  const entry = path.join(__dirname, 'liveSocketsWorker.ts');
  const worker = new Worker(`require('tsx/cjs'); require(${JSON.stringify(entry)});`, {
    eval: true,
    workerData: spec,
  });
  const waiting = new Map<number, (reply: WorkerReply) => void>();
  let nextId = 1;
  let failed: Error | null = null;
  const count = await new Promise<number>((resolve, reject) => {
    worker.on('message', (reply: WorkerReply) => {
      if (reply.id === 0) return resolve(reply.ready ?? 0);
      waiting.get(reply.id)?.(reply);
      waiting.delete(reply.id);
    });
    worker.on('error', (err) => {
      failed = err;
      reject(err);
      for (const done of waiting.values()) done({ id: -1, error: err.message });
    });
  });
  const ask = (op: WorkerOp) =>
    new Promise<ArrivalsReport | undefined>((resolve, reject) => {
      if (failed) return reject(failed);
      const id = nextId++;
      waiting.set(id, (reply) =>
        reply.error !== undefined ? reject(new Error(reply.error)) : resolve(reply.report),
      );
      worker.postMessage({ ...op, id } satisfies WorkerRequest);
    });
  return {
    count,
    where: 'worker',
    record: async () => void (await ask({ op: 'record' })),
    collect: async (expected, graceMs) => (await ask({ op: 'collect', expected, graceMs }))!,
    async close() {
      await ask({ op: 'close' }).catch(() => {});
      await worker.terminate();
    },
  };
}

export function connectLiveClients(
  spec: LiveClientsSpec & { where: LiveClientsWhere },
): Promise<LiveClients> {
  return spec.where === 'worker' ? connectInWorker(spec) : connectHere(spec);
}
