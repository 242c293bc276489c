/**
 * Where the machine's CPU went during a phase: the server under test, its PostgreSQL, this
 * bench process (load generator and WebSocket clients), and everything else — on 2 cores the
 * last is mostly other people's tests, and it is why the baselines run in the same minute.
 */
import { cpuSecondsOf, machineCpuSeconds, postgresPids } from './processes';

/** CPU seconds used over `wallS` seconds; several slices of one phase add up. */
export interface CpuSeconds {
  wallS: number;
  serverS: number;
  postgresS: number;
  benchS: number;
  machineS: number;
}

export const NO_CPU: CpuSeconds = { wallS: 0, serverS: 0, postgresS: 0, benchS: 0, machineS: 0 };

export const addCpu = (a: CpuSeconds, b: CpuSeconds): CpuSeconds => ({
  wallS: a.wallS + b.wallS,
  serverS: a.serverS + b.serverS,
  postgresS: a.postgresS + b.postgresS,
  benchS: a.benchS + b.benchS,
  machineS: a.machineS + b.machineS,
});

/** CPU in cores (1.0 = one core busy for the whole phase). */
export interface CpuCores {
  server: number;
  postgres: number;
  bench: number;
  other: number;
}

export function coresOf(c: CpuSeconds): CpuCores {
  const per = (s: number) => (c.wallS > 0 ? s / c.wallS : Number.NaN);
  return {
    server: per(c.serverS),
    postgres: per(c.postgresS),
    bench: per(c.benchS),
    other: Math.max(0, per(c.machineS - c.serverS - c.postgresS - c.benchS)),
  };
}

export interface CpuMeter {
  /** Call at the end of the slice, before closing its database connections. */
  stop(): CpuSeconds;
}

export function startCpuMeter(serverPid: number, pgPort: number): CpuMeter {
  const startMs = performance.now();
  const server0 = cpuSecondsOf(serverPid);
  const pg0 = new Map(postgresPids(pgPort).map((pid) => [pid, cpuSecondsOf(pid)]));
  const bench0 = process.cpuUsage();
  const machine0 = machineCpuSeconds().busyS;
  return {
    stop() {
      // A backend that started during the slice counts from zero; one that ended is missed,
      // which is why the phases keep their connections open until this is read.
      let postgresS = 0;
      for (const pid of postgresPids(pgPort)) postgresS += cpuSecondsOf(pid) - (pg0.get(pid) ?? 0);
      const bench = process.cpuUsage(bench0);
      return {
        wallS: (performance.now() - startMs) / 1000,
        serverS: cpuSecondsOf(serverPid) - server0,
        postgresS,
        benchS: (bench.user + bench.system) / 1e6,
        machineS: machineCpuSeconds().busyS - machine0,
      };
    },
  };
}
