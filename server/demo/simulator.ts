/**
 * Demo sensors that post through the real ingest route, as hardware would: a backfill of the
 * last hours in batches, then one reading per sensor every interval. Readings that fail to
 * send stay queued and go out with the next post (a sensor's offline backlog). Sensors given
 * an MQTT sender (mqttSender.ts) publish the same bodies to the broker instead.
 */
import { demoAir, rhFromDewPoint, stepIron, type DemoProfile } from './dayModel';

/** What became of one batch: stored (or refused for good), or to be sent again later. */
export type SendResult = { done: true; dropped?: string } | { done: false };

/** One way in for a sensor's batches: HTTP (the default) or MQTT. */
export type BatchSender = (body: string) => Promise<SendResult>;

export interface SimulatedSensor {
  name: string;
  token: string;
  hasProbe: boolean;
  profile: DemoProfile;
  /** Sends this sensor's batches instead of POST /api/v1/ingest (e.g. over MQTT). */
  sender?: BatchSender;
}

export interface SimulatorOptions {
  baseUrl: string;
  sensors: SimulatedSensor[];
  intervalMs: number;
  /** Model time runs this many times faster than the clock (readings stay stamped "now"). */
  speed: number;
  backfillHours: number;
  /**
   * A simulated network outage: every `everyMs` the sensors stop reaching the server for
   * `forMs`, keep their readings, and send the backlog in batches when back. Null for none.
   */
  outage: { everyMs: number; forMs: number } | null;
  utcOffsetHours: number;
  log: (line: string) => void;
}

interface Reading {
  at: string;
  air: number;
  rh: number;
  surface?: number;
  battery: number;
}

const STEP_MS = 5 * 60 * 1000;
const round = (v: number, digits: number) => Number(v.toFixed(digits));

export function startSimulator(options: SimulatorOptions): { stop(): Promise<void> } {
  const startedAtMs = Date.now();
  const modelTime = (nowMs: number) => startedAtMs + (nowMs - startedAtMs) * options.speed;
  let stopped = false;

  const states = options.sensors.map((sensor) => {
    const firstMs =
      Math.floor((Date.now() - options.backfillHours * 3_600_000) / STEP_MS) * STEP_MS;
    const air = demoAir(sensor.profile, firstMs, options.utcOffsetHours);
    return {
      sensor,
      ironC: air.airC - 1,
      lastModelMs: firstMs,
      queue: [] as Reading[],
      battery: 3.1,
    };
  });

  function sample(state: (typeof states)[number], atMs: number, modelMs: number): Reading {
    const { airC, dewC } = demoAir(state.sensor.profile, modelMs, options.utcOffsetHours);
    state.ironC = stepIron(state.ironC, airC, Math.max(0, modelMs - state.lastModelMs));
    state.lastModelMs = modelMs;
    state.battery = Math.max(2.6, state.battery - 0.00001);
    const noise = () => (Math.random() - 0.5) * 0.2;
    return {
      at: new Date(atMs).toISOString(),
      air: round(airC + noise(), 2),
      rh: round(Math.min(100, rhFromDewPoint(airC, dewC) + noise() * 5), 1),
      ...(state.sensor.hasProbe ? { surface: round(state.ironC + noise(), 2) } : {}),
      battery: round(state.battery, 3),
    };
  }

  const offline = (nowMs: number) =>
    options.outage !== null &&
    (nowMs - startedAtMs) % options.outage.everyMs > options.outage.everyMs - options.outage.forMs;
  let wasOffline = false;

  const httpSender =
    (token: string): BatchSender =>
    async (body) => {
      try {
        const res = await fetch(`${options.baseUrl}/api/v1/ingest`, {
          method: 'POST',
          headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
          body,
        });
        if (res.status === 202) return { done: true };
        // 4xx other than 429 will not get better by retrying: drop the batch and say so.
        if (res.status >= 400 && res.status < 500 && res.status !== 429) {
          return { done: true, dropped: `HTTP ${res.status}` };
        }
        return { done: false };
      } catch {
        return { done: false }; // server away: keep the backlog for the next tick
      }
    };

  async function flush(state: (typeof states)[number]): Promise<void> {
    const send = state.sensor.sender ?? httpSender(state.sensor.token);
    while (state.queue.length > 0 && !stopped) {
      const batch = state.queue.slice(0, 1000);
      const result = await send(JSON.stringify({ unit: 'C', readings: batch }));
      if (!result.done) return;
      if (result.dropped) {
        options.log(`${state.sensor.name}: dropped ${batch.length} (${result.dropped})`);
      }
      state.queue.splice(0, batch.length);
    }
  }

  // Backfill at the model's 5-minute grid so restarts re-send the same instants (duplicates).
  for (const state of states) {
    for (let t = state.lastModelMs + STEP_MS; t < Date.now(); t += STEP_MS)
      state.queue.push(sample(state, t, t));
  }
  let running = Promise.all(states.map(flush)).then(() =>
    options.log(`demo sensors: backfilled ${options.backfillHours} h for ${states.length} sensors`),
  );

  const timer = setInterval(() => {
    const nowMs = Date.now();
    const isOffline = offline(nowMs);
    if (isOffline !== wasOffline) {
      const waiting = states.reduce((n, s) => n + s.queue.length, 0);
      options.log(
        isOffline
          ? 'demo sensors: simulated outage, queueing readings'
          : `demo sensors: back online, sending ${waiting} queued readings`,
      );
      wasOffline = isOffline;
    }
    running = running.then(() =>
      Promise.all(
        states.map((state) => {
          state.queue.push(sample(state, nowMs, Math.max(modelTime(nowMs), state.lastModelMs)));
          return isOffline ? undefined : flush(state);
        }),
      ).then(() => undefined),
    );
  }, options.intervalMs);

  return {
    async stop() {
      stopped = true;
      clearInterval(timer);
      await running.catch(() => {});
    },
  };
}
