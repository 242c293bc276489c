/** What one bench run does; `npm run bench -- --help` lists the flags. */
import { parseArgs } from 'node:util';

import type { LiveClientsWhere } from './liveSockets';

// `chart` runs last: it stores 10 M readings, which would slow every insert phase after it.
// `web` exports the web app if its sources changed, then opens the overview in Chromium.
export const PHASES = [
  'bare',
  'raw',
  'ingest1',
  'ingest50',
  'live',
  'mqtt',
  'report',
  'web',
  // Stores a million readings: after the phases whose rates it would slow, before the chart's.
  'import',
  'chart',
  'chartLong',
] as const;
export type Phase = (typeof PHASES)[number];

export interface BenchOptions {
  pgPort: number;
  database: string;
  /** HTTP connections of the load generator, and connections of the raw INSERT baseline. */
  connections: number;
  /** Seconds measured per phase; a ratio's two sides alternate in `rounds` slices of it. */
  durationS: number;
  rounds: number;
  warmupS: number;
  batch: number;
  /**
   * Sensors the load rotates through, 5 to a zone: enough that none passes the per-sensor limit
   * of 10 requests a second at the rates this machine reaches, and the background load uses them
   * too (2 requests a second each).
   */
  fleetSensors: number;
  /** The probe rotates over these, so 20 probes a second stay inside the per-sensor limit. */
  probeSensors: number;
  wsClients: number;
  /**
   * Where the live phase's watching sockets and the loaded phase's background load run: each on
   * a worker thread of its own (the default), or the probe's thread as before 2026-12-03, to
   * compare (scripts/bench/liveSockets.ts, pacedLoadWorker.ts).
   */
  liveClients: LiveClientsWhere;
  probeIntervalMs: number;
  backgroundReadingsPerS: number;
  /** Readings per background request: 1, as real sensors post one reading at a time. */
  backgroundBatch: number;
  phases: Phase[];
  /** Lines of the logger file the import phase imports (and COPYs as its baseline). */
  importRows: number;
  /** COPY-then-import rounds of the import phase; the figures are their medians. */
  importRounds: number;
  /** Where the server writes a V8 CPU profile on exit (node --cpu-prof), if set. */
  cpuProfDir: string | null;
  /** Where to write pg_stat_statements' top statements of the measured phases, if set. */
  pgStatsFile: string | null;
  /** The exported web app the web phase serves; null: dist/, exported first if it changed. */
  webDir: string | null;
  /** Where the web phase writes a Chromium trace (main thread, V8) of its last run, if set. */
  webTraceDir: string | null;
}

export const DEFAULT_OPTIONS: BenchOptions = {
  pgPort: 54350,
  database: 'drybench_bench',
  connections: 10,
  durationS: 8,
  rounds: 4,
  warmupS: 2,
  batch: 50,
  fleetSensors: 500,
  probeSensors: 5,
  wsClients: 200,
  liveClients: 'worker',
  probeIntervalMs: 50,
  backgroundReadingsPerS: 1000,
  backgroundBatch: 1,
  phases: [...PHASES],
  importRows: 500_000,
  importRounds: 3,
  cpuProfDir: null,
  pgStatsFile: null,
  webDir: null,
  webTraceDir: null,
};

export const USAGE = `npm run bench [-- options]
  --connections N    load generator connections (default ${DEFAULT_OPTIONS.connections})
  --duration S       seconds measured per phase (default ${DEFAULT_OPTIONS.durationS})
  --phases LIST      some of ${PHASES.join(',')} (default all)
  --pg-port N        the bench's own PostgreSQL port (default ${DEFAULT_OPTIONS.pgPort}; a free one if taken)
  --import-rows N    lines of the import phase's logger file (default ${DEFAULT_OPTIONS.importRows})
  --import-rounds N  COPY-then-import rounds of the import phase (default ${DEFAULT_OPTIONS.importRounds})
  --background-rate N  loaded phase: background readings/s, one per request (default ${DEFAULT_OPTIONS.backgroundReadingsPerS});
                     the target is judged at the default; other rates draw the latency-by-load curve
  --live-clients W   where the live phase's 200 sockets and background load run: worker (each
                     on a thread of its own, default) or inline (the probe's thread, as before)
  --cpu-prof DIR     write the server's (and the MQTT broker's) CPU profile to DIR when it exits
  --pg-stats FILE    write PostgreSQL's top statements (pg_stat_statements) to FILE
  --web-dir DIR      web phase: serve this export instead of building dist/ (to compare builds)
  --web-trace DIR    web phase: write a Chromium trace of the last run to DIR (chrome://tracing,
                     or the DevTools performance panel)`;

export function readBenchOptions(argv: string[]): BenchOptions | 'help' {
  const { values } = parseArgs({
    args: argv,
    options: {
      'pg-port': { type: 'string' },
      connections: { type: 'string' },
      duration: { type: 'string' },
      phases: { type: 'string' },
      'import-rows': { type: 'string' },
      'import-rounds': { type: 'string' },
      'cpu-prof': { type: 'string' },
      'live-clients': { type: 'string' },
      'background-rate': { type: 'string' },
      'pg-stats': { type: 'string' },
      'web-dir': { type: 'string' },
      'web-trace': { type: 'string' },
      help: { type: 'boolean' },
    },
  });
  if (values.help) return 'help';
  const positive = (name: string, value: string | undefined, fallback: number) => {
    if (value === undefined) return fallback;
    const n = Number(value);
    if (!(Number.isInteger(n) && n > 0)) throw new Error(`--${name} must be a positive integer`);
    return n;
  };
  const phases = values.phases?.split(',').map((p) => p.trim()) ?? [...PHASES];
  const unknown = phases.filter((p) => !(PHASES as readonly string[]).includes(p));
  if (unknown.length > 0) throw new Error(`unknown phase ${unknown.join(', ')}`);
  const liveClients = values['live-clients'] ?? DEFAULT_OPTIONS.liveClients;
  if (liveClients !== 'worker' && liveClients !== 'inline') {
    throw new Error('--live-clients must be worker or inline');
  }
  return {
    ...DEFAULT_OPTIONS,
    pgPort: positive('pg-port', values['pg-port'], DEFAULT_OPTIONS.pgPort),
    connections: positive('connections', values.connections, DEFAULT_OPTIONS.connections),
    // Bounded so a run stays within a few minutes whatever is asked.
    durationS: Math.min(30, positive('duration', values.duration, DEFAULT_OPTIONS.durationS)),
    phases: phases as Phase[],
    importRows: positive('import-rows', values['import-rows'], DEFAULT_OPTIONS.importRows),
    importRounds: positive('import-rounds', values['import-rounds'], DEFAULT_OPTIONS.importRounds),
    liveClients,
    backgroundReadingsPerS: positive(
      'background-rate',
      values['background-rate'],
      DEFAULT_OPTIONS.backgroundReadingsPerS,
    ),
    cpuProfDir: values['cpu-prof'] ?? null,
    pgStatsFile: values['pg-stats'] ?? null,
    webDir: values['web-dir'] ?? null,
    webTraceDir: values['web-trace'] ?? null,
  };
}
