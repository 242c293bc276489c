/**
 * Each figure that is a ratio is measured against its baseline in alternating slices (A B B A
 * A B …) rather than one after the other, so a burst of someone else's work on this 2-core
 * machine lands on both sides of the ratio instead of on whichever phase it happened to hit.
 */
import { summarize, type LatencySummary } from './stats';
import { addCpu, coresOf, NO_CPU, startCpuMeter, type CpuCores, type CpuSeconds } from './usage';

export interface Slice {
  count: number;
  failures: number;
  durationS: number;
  latenciesMs: number[];
}

export interface Contender<K extends string> {
  key: K;
  /** The process whose CPU counts as "server" for this contender. */
  serverPid: number;
  slice(durationS: number): Promise<Slice>;
}

export interface Measured {
  /** Requests, or rows for the raw INSERT, per second. */
  perS: number;
  failures: number;
  latency: LatencySummary;
  cpu: CpuCores;
}

export async function interleave<K extends string>(
  contenders: Contender<K>[],
  opts: { rounds: number; sliceS: number; warmupS: number; pgPort: number },
): Promise<Record<K, Measured>> {
  for (const c of contenders) if (opts.warmupS > 0) await c.slice(opts.warmupS);
  const totals = new Map<K, { slice: Slice; cpu: CpuSeconds }>(
    contenders.map((c) => [
      c.key,
      { slice: { count: 0, failures: 0, durationS: 0, latenciesMs: [] }, cpu: NO_CPU },
    ]),
  );
  for (let round = 0; round < opts.rounds; round++) {
    const order = round % 2 === 0 ? contenders : [...contenders].reverse();
    for (const c of order) {
      const meter = startCpuMeter(c.serverPid, opts.pgPort);
      const s = await c.slice(opts.sliceS);
      const cpu = meter.stop();
      const total = totals.get(c.key)!;
      total.slice.count += s.count;
      total.slice.failures += s.failures;
      total.slice.durationS += s.durationS;
      for (const ms of s.latenciesMs) total.slice.latenciesMs.push(ms);
      total.cpu = addCpu(total.cpu, cpu);
    }
  }
  const result = {} as Record<K, Measured>;
  for (const [key, { slice, cpu }] of totals) {
    result[key] = {
      perS: slice.count / slice.durationS,
      failures: slice.failures,
      latency: summarize(slice.latenciesMs),
      cpu: coresOf(cpu),
    };
  }
  return result;
}
