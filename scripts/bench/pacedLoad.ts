/**
 * Open-loop background ingest: requests go out on a schedule (`readingsPerS`, spread over the
 * sensors round-robin) whether or not earlier ones have been answered, as independent sensors
 * would post. A closed loop would slow down with the server and hide the load it cannot take.
 */
import http from 'node:http';
import path from 'node:path';
import { Worker } from 'node:worker_threads';

import type { PacedLoadWorkerSpec } from './pacedLoadWorker';

import { summarize, type LatencySummary } from './stats';

export interface PacedLoadSpec {
  url: string;
  tokens: string[];
  readingsPerS: number;
  /** Readings per request. */
  batch: number;
  body: (batch: number) => string;
}

export interface PacedLoadResult {
  readingsPerS: number;
  failures: number;
  /** Requests not sent because too many were still unanswered: the server fell behind. */
  skipped: number;
  request: LatencySummary;
}

export interface PacedLoad {
  stop(): Promise<PacedLoadResult>;
}

const TICK_MS = 5;
// Past this many unanswered requests the server is not keeping up; more would only queue.
const MAX_IN_FLIGHT = 256;

export function startPacedLoad(spec: PacedLoadSpec): PacedLoad {
  const target = `${spec.url}/api/v1/ingest`;
  const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });
  const requestsPerS = spec.readingsPerS / spec.batch;
  const latenciesMs: number[] = [];
  let sent = 0;
  let okReadings = 0;
  let failures = 0;
  let skipped = 0;
  let inFlight = 0;
  let turn = 0;
  const idle: (() => void)[] = [];

  const send = () => {
    const body = spec.body(spec.batch);
    const token = spec.tokens[turn++ % spec.tokens.length]!;
    const t0 = performance.now();
    inFlight++;
    let settled = false;
    const settle = (ok: boolean) => {
      if (settled) return;
      settled = true;
      inFlight--;
      if (ok) {
        okReadings += spec.batch;
        latenciesMs.push(performance.now() - t0);
      } else failures++;
      if (inFlight === 0) idle.splice(0).forEach((done) => done());
    };
    const req = http.request(
      target,
      {
        method: 'POST',
        agent,
        headers: {
          authorization: `Bearer ${token}`,
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(body),
        },
      },
      (res) => {
        res.resume();
        res.on('end', () => settle(res.statusCode === 202));
        res.on('error', () => settle(false));
      },
    );
    // A request stuck past the phase must not keep the bench waiting.
    req.setTimeout(10_000, () => req.destroy());
    req.on('error', () => settle(false));
    req.end(body);
  };

  const startMs = performance.now();
  const timer = setInterval(() => {
    const due = Math.floor(((performance.now() - startMs) / 1000) * requestsPerS);
    while (sent + skipped < due) {
      if (inFlight >= MAX_IN_FLIGHT) skipped++;
      else {
        sent++;
        send();
      }
    }
  }, TICK_MS);

  return {
    async stop() {
      clearInterval(timer);
      const elapsedS = (performance.now() - startMs) / 1000;
      const readingsPerS = okReadings / elapsedS;
      if (inFlight > 0) await new Promise<void>((resolve) => idle.push(resolve));
      agent.destroy();
      return {
        readingsPerS,
        failures,
        skipped,
        request: summarize(latenciesMs),
      };
    },
  };
}

/**
 * The same load from a worker thread of its own (pacedLoadWorker.ts), its bodies from its own
 * reading source starting at `readingsStartMs`.
 */
export function startPacedLoadInWorker(spec: PacedLoadWorkerSpec): PacedLoad {
  // As in liveSockets.ts: a worker refuses a .ts entry, so it registers tsx's hook first.
  const entry = path.join(__dirname, 'pacedLoadWorker.ts');
  const worker = new Worker(`require('tsx/cjs'); require(${JSON.stringify(entry)});`, {
    eval: true,
    workerData: spec,
  });
  const failed = new Promise<never>((_, reject) => worker.once('error', reject));
  failed.catch(() => {});
  return {
    async stop() {
      const result = new Promise<PacedLoadResult>((resolve) => worker.once('message', resolve));
      worker.postMessage('stop');
      try {
        return await Promise.race([result, failed]);
      } finally {
        await worker.terminate();
      }
    },
  };
}
