/** The printout: a table of the phases, the figures against their targets, then one JSON line. */
import type { Measured } from './interleave';
import type { BenchResult, LivePhase } from './run';
import { round } from './stats';
import type { CpuCores } from './usage';

/** The targets for this 2-core machine. */
export const TARGETS = {
  batchVsRawInsert: { atLeast: 0.8 },
  singleVsBareExpress: { atLeast: 0.6 },
  wsP99IdleMs: { atMost: 25 },
  wsP99LoadedMs: { atMost: 50 },
  mqttP99Ms: { atMost: 50 },
  rssMb: { atMost: 250 },
  chartQueryP95Ms: { atMost: 20 },
  // The week's chart target holds for 90 days too: a long range must not feel slower.
  chart90dP95Ms: { atMost: 20 },
  weekReportMs: { atMost: 300 },
  weekReportPdfMs: { atMost: 1000 },
  bundleKbGz: { atMost: 450 },
  firstRenderMs: { atMost: 1000 },
  // A logger file's rows/s end to end (upload → stored) over a bare COPY of it (issue 14).
  importVsCopy: { atLeast: 0.6 },
} as const;

export type Figures = Record<keyof typeof TARGETS, number | null> & Record<string, unknown>;

export function figuresOf(r: BenchResult): Figures {
  const ratio = (a: number | undefined, b: number | undefined) =>
    a === undefined || b === undefined ? null : round(a / b, 3);
  const batch = r.options.batch;
  const ingest50ReadingsPerS = r.ingest50 && r.ingest50.perS * batch;
  const bg = r.liveLoaded?.background;
  return {
    batchVsRawInsert: ratio(ingest50ReadingsPerS, r.raw?.perS),
    singleVsBareExpress: ratio(r.ingest1?.perS, r.bare?.perS),
    wsP99IdleMs: r.liveIdle ? round(r.liveIdle.delivery.p99Ms) : null,
    wsP99LoadedMs: r.liveLoaded ? round(r.liveLoaded.delivery.p99Ms) : null,
    // MQTT publish → WebSocket delivery at 200 readings/s (scripts/bench/mqttLatency.ts).
    mqttP99Ms: r.mqtt ? round(r.mqtt.delivery.p99Ms) : null,
    mqttP50Ms: r.mqtt ? round(r.mqtt.delivery.p50Ms) : null,
    mqttPubackP99Ms: r.mqtt ? round(r.mqtt.puback.p99Ms) : null,
    mqttMissing: r.mqtt ? r.mqtt.missing + r.mqtt.failedPublishes : null,
    rssMb: round(r.peakRssMb, 0),
    chartQueryP95Ms: r.chart ? round(r.chart.p95Ms) : null,
    chart90dP95Ms: r.chartLong ? round(r.chartLong.spans['90d'].p95Ms) : null,
    // p95 over HTTP: a 10-zone shop's week of 1-minute readings (scripts/bench/weekReport.ts).
    weekReportMs: r.weekReport ? round(r.weekReport.jsonP95Ms) : null,
    weekReportPdfMs: r.weekReport?.pdfP95Ms != null ? round(r.weekReport.pdfP95Ms) : null,
    weekReportPdfNote: r.weekReport?.pdfNote ?? null,
    bundleKbGz: r.web ? r.web.bundleKbGz : null,
    firstRenderMs: r.web ? round(r.web.firstRenderMs, 0) : null,
    firstAppCardMs: r.web ? round(r.web.appCardMs, 0) : null,
    bundleKbRaw: r.web ? r.web.bundleKbRaw : null,
    bundleFiles: r.web ? r.web.scripts.length : null,
    // Load-independent: what the first screen ran before its first card (one untimed run).
    firstRenderModules: r.web?.work?.modules ?? null,
    firstRenderCommits: r.web?.work?.commits ?? null,
    importVsCopy: r.import ? round(r.import.importRowsPerS / r.import.copyRowsPerS, 3) : null,
    importRowsPerS: r.import ? round(r.import.importRowsPerS, 0) : null,
    importCopyRowsPerS: r.import ? round(r.import.copyRowsPerS, 0) : null,
    // The import over the same rows COPYed into a readings-shaped table with its indexes.
    importVsStoreFloor: r.import
      ? round(r.import.importRowsPerS / r.import.floorRowsPerS, 3)
      : null,
    importStoreFloorRowsPerS: r.import ? round(r.import.floorRowsPerS, 0) : null,
    importPeakRssMb: r.import ? round(r.import.peakRssMb, 0) : null,
    rssAtStartMb: round(r.startRssMb, 0),
    // The same-run baseline for rssMb: the bare Express process's peak (scripts/bench/run.ts).
    bareRssMb: r.bareRssMb !== undefined ? round(r.bareRssMb, 0) : null,
    rssVsBareExpress: r.bareRssMb !== undefined ? round(r.peakRssMb / r.bareRssMb, 2) : null,
    date: r.startedAt.toISOString(),
    cpuCount: r.cpuCount,
    busyCoresBefore: round(r.busyCoresBefore, 2),
    connections: r.options.connections,
    phaseS: r.options.durationS,
    ingest1GroupMeanRows: r.ingest1Groups ? round(r.ingest1Groups.meanRows) : null,
    ingest1GroupP90Rows: r.ingest1Groups?.p90Rows ?? null,
    bareExpressReqPerS: r.bare ? round(r.bare.perS, 0) : null,
    rawInsertRowsPerS: r.raw ? round(r.raw.perS, 0) : null,
    ingestBatch1ReqPerS: r.ingest1 ? round(r.ingest1.perS, 0) : null,
    ingestBatch50ReadingsPerS: ingest50ReadingsPerS ? round(ingest50ReadingsPerS, 0) : null,
    wsP50IdleMs: r.liveIdle ? round(r.liveIdle.delivery.p50Ms) : null,
    wsP50LoadedMs: r.liveLoaded ? round(r.liveLoaded.delivery.p50Ms) : null,
    // The probe's POST → 202, whose tail the delivery carries, and where the sockets ran.
    wsPostP99IdleMs: r.liveIdle ? round(r.liveIdle.post.p99Ms) : null,
    wsPostP99LoadedMs: r.liveLoaded ? round(r.liveLoaded.post.p99Ms) : null,
    wsClientsThread: r.liveIdle?.clientsWhere ?? r.liveLoaded?.clientsWhere ?? null,
    backgroundReadingsPerS: bg ? round(bg.readingsPerS, 0) : null,
    // wsP99LoadedMs is judged at the default 1,000/s; --background-rate draws the curve.
    backgroundAskedPerS: bg ? bg.askedPerS : null,
    chartQueryP50Ms: r.chart ? round(r.chart.p50Ms) : null,
    chartQueryVsTarget: r.chart ? round(r.chart.p95Ms / TARGETS.chartQueryP95Ms.atMost, 3) : null,
    chartQueryBaselineP95Ms: r.chart ? round(r.chart.baselineP95Ms) : null,
    chartQueryVsBaseline: r.chart ? round(r.chart.p95Ms / r.chart.baselineP95Ms, 3) : null,
    chartStoredReadings: r.chart ? r.chart.rows : null,
    chartSeedS: r.chart ? round(r.chart.seedS) : null,
    chartQueryPages: r.chart ? round(r.chart.pages, 0) : null,
    chartQueryBaselinePages: r.chart ? round(r.chart.baselinePages, 0) : null,
    chart90dRawP95Ms: r.chartLong ? round(r.chartLong.spans['90d'].rawP95Ms) : null,
    chart30dP95Ms: r.chartLong ? round(r.chartLong.spans['30d'].p95Ms) : null,
    chart30dRawP95Ms: r.chartLong ? round(r.chartLong.spans['30d'].rawP95Ms) : null,
    chart90dRowsRead: r.chartLong ? r.chartLong.spans['90d'].rowsRead : null,
    chart90dRawRowsRead: r.chartLong ? r.chartLong.spans['90d'].rawRowsRead : null,
    rollupRowsPerS: r.chartLong ? round(r.chartLong.rows / r.chartLong.rollupS, 0) : null,
    failures:
      (r.bare?.failures ?? 0) +
      (r.ingest1?.failures ?? 0) +
      (r.ingest50?.failures ?? 0) +
      (r.liveIdle ? r.liveIdle.missing + r.liveIdle.failedPosts : 0) +
      (r.liveLoaded ? r.liveLoaded.missing + r.liveLoaded.failedPosts : 0) +
      (bg ? bg.failures + bg.skipped : 0),
  };
}

const int = (n: number) => Math.round(n).toLocaleString('en-US');
const ms = (n: number) => (Number.isFinite(n) ? n.toFixed(1) : '–');
const cores = (n: number) => n.toFixed(2);

function table(header: string[], rows: string[][]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  // The first column is text; the others are figures, right-aligned so digits line up.
  const line = (cells: string[]) =>
    cells
      .map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!)))
      .join('  ')
      .trimEnd();
  return [line(header), line(widths.map((w) => '-'.repeat(w))), ...rows.map(line)].join('\n');
}

function cpuCells(c: CpuCores): string[] {
  return [c.server, c.postgres, c.bench, c.other].map(cores);
}

export function formatReport(r: BenchResult): string {
  const o = r.options;
  const rows: string[][] = [];
  const row = (name: string, rate: string, p50Ms: number, p99Ms: number, cpu?: CpuCores) =>
    rows.push([name, rate, ms(p50Ms), ms(p99Ms), ...(cpu ? cpuCells(cpu) : [])]);
  // CPU per unit (µs per request, row or reading) moves much less with other people's load
  // than the rates do: it says what a dedicated core would buy.
  const m = (name: string, x: Measured | undefined, unit: string, perUnit = 1) => {
    if (!x) return;
    const unitsPerS = x.perS * perUnit;
    row(name, `${int(unitsPerS)} ${unit}/s`, x.latency.p50Ms, x.latency.p99Ms, x.cpu);
    const us = (cores: number) => int((cores / unitsPerS) * 1e6);
    rows.at(-1)!.push(us(x.cpu.server), us(x.cpu.postgres));
  };
  m('bare Express 5 POST', r.bare, 'req');
  m('ingest, 1 reading', r.ingest1, 'req');
  m(`raw INSERT, ${o.batch} rows`, r.raw, 'rows');
  m(`ingest, ${o.batch} readings`, r.ingest50, 'readings', o.batch);
  for (const [name, l] of [
    ['POST → WS, idle', r.liveIdle],
    ['POST → WS, under load', r.liveLoaded],
  ] as const) {
    if (l) row(name, `${int(l.delivery.count)} msgs`, l.delivery.p50Ms, l.delivery.p99Ms, l.cpu);
  }
  if (r.mqtt) {
    row(
      'MQTT publish → WS',
      `${int(r.mqtt.ratePerS)} readings/s`,
      r.mqtt.delivery.p50Ms,
      r.mqtt.delivery.p99Ms,
    );
    row(
      '  MQTT publish → PUBACK',
      `${int(r.mqtt.published)} msgs`,
      r.mqtt.puback.p50Ms,
      r.mqtt.puback.p99Ms,
    );
  }
  if (r.liveLoaded) {
    const b = r.liveLoaded.background;
    row(
      '  background ingest',
      `${int(b.readingsPerS)} readings/s`,
      b.request.p50Ms,
      b.request.p99Ms,
    );
  }

  const out: string[] = [];
  out.push(
    `Drybench bench, ${r.startedAt.toISOString().slice(0, 16)}Z: ${r.cpuCount} cores, ` +
      `${r.busyCoresBefore.toFixed(2)} cores busy before the run (others' work), ` +
      `Node ${process.versions.node}`,
  );
  out.push(
    `${o.connections} connections, ${o.durationS} s measured per phase after ${o.warmupS} s of ` +
      `warm-up, a ratio's two sides alternating in ${o.rounds} slices; readings carry a surface ` +
      `value (the probe path) and keep the iron dry, spread over ${o.fleetSensors} sensors ` +
      `in ${Math.ceil(o.fleetSensors / 5)} zones`,
  );
  out.push('');
  out.push(
    table(
      [
        'phase',
        'rate',
        'p50 ms',
        'p99 ms',
        'server',
        'postgres',
        'bench',
        'other',
        'server µs',
        'pg µs',
      ],
      rows,
    ),
  );
  out.push(
    `server/postgres/bench/other: CPU used during the phase, in cores (of ${r.cpuCount}). ` +
      'Latency is per request, per statement (commit included) for the raw INSERT, per message for WS.',
  );
  out.push(
    'server µs / pg µs: CPU time of the server and of PostgreSQL per request, row or reading.',
  );

  if (r.ingest1Groups) {
    const g = r.ingest1Groups;
    const buckets = Object.entries(g.buckets)
      .map(([k, n]) => `${k} ${int(n)}`)
      .join(', ');
    out.push(
      `ingest, 1 reading: the writer committed ${int(g.rows)} requests in ${int(g.groups)} groups ` +
        `(${o.connections} connections): mean ${g.meanRows.toFixed(1)}, p50 ${g.p50Rows}, ` +
        `p90 ${g.p90Rows}, max ${g.maxRows} per group; groups by size: ${buckets}`,
    );
  }

  const live: [string, LivePhase | undefined][] = [
    ['idle', r.liveIdle],
    ['under load', r.liveLoaded],
  ];
  for (const [name, l] of live) {
    if (!l) continue;
    out.push(
      `POST → WS ${name}: ${o.wsClients} clients, ${l.probes} probes every ${o.probeIntervalMs} ms, ` +
        `${l.missing} deliveries missing; the probe's POST → 202 p50 ${ms(l.post.p50Ms)} / ` +
        `p99 ${ms(l.post.p99Ms)} ms; event-loop delay p99 of the clients' thread (${l.clientsWhere}) ` +
        `${ms(l.clientLoopDelayP99Ms)} ms, of the probe's ${ms(l.probeLoopDelayP99Ms)} ms`,
    );
  }
  if (r.liveLoaded) {
    const b = r.liveLoaded.background;
    out.push(
      `background: ${int(o.backgroundReadingsPerS)} readings/s asked, ${o.backgroundBatch} per ` +
        `request from the fleet's sensors (not the watched shop); ${b.failures} failed, ` +
        `${b.skipped} not sent (server behind)`,
    );
  }

  if (r.chart) {
    const c = r.chart;
    out.push(
      `zone history: ${int(c.rows)} readings stored (${int(c.sensors)} sensors in ${int(c.zones)} ` +
        `zones, one a minute for a week), generated in SQL in ${c.seedS.toFixed(1)} s, indexes ` +
        `${c.indexS.toFixed(1)} s, vacuum analyze ${c.vacuumS.toFixed(1)} s, migration 0010 ` +
        `${c.coverS.toFixed(1)} s; ${c.queries} week queries (${c.pointsPerAnswer} points) over ` +
        `rotating zones: p50 ${ms(c.p50Ms)} / p95 ${ms(c.p95Ms)} ms covering index, p50 ` +
        `${ms(c.baselineP50Ms)} / p95 ${ms(c.baselineP95Ms)} ms plain (zone_id, at) index ` +
        `(baseline, same run); p95 / target ${(c.p95Ms / TARGETS.chartQueryP95Ms.atMost).toFixed(2)}, ` +
        `p95 / baseline ${(c.p95Ms / c.baselineP95Ms).toFixed(3)}; pages touched per query ` +
        `${int(c.pages)} covering vs ${int(c.baselinePages)} plain`,
    );
  }

  if (r.chartLong) {
    const c = r.chartLong;
    const span = (name: '30d' | '90d') => {
      const s = c.spans[name];
      return (
        `${name} (${s.points} points): p50 ${ms(s.rawP50Ms)} / p95 ${ms(s.rawP95Ms)} ms raw, ` +
        `p50 ${ms(s.p50Ms)} / p95 ${ms(s.p95Ms)} ms roll-ups (${int(s.rawRowsRead)} vs ` +
        `${int(s.rowsRead)} rows read)`
      );
    };
    out.push(
      `long-range history: ${int(c.rows)} readings (91 days) generated in ${c.seedS.toFixed(1)} s, ` +
        `rolled up into ${int(c.rollupRows)} hourly rows in ${c.rollupS.toFixed(1)} s; ` +
        `${c.rounds} interleaved rounds of ${c.queriesPerRound} queries each: ${span('30d')}; ` +
        `${span('90d')}; 90d p95 / target ` +
        `${(c.spans['90d'].p95Ms / TARGETS.chart90dP95Ms.atMost).toFixed(2)}`,
    );
  }

  if (r.weekReport) {
    const w = r.weekReport;
    out.push(
      `week report: ${int(w.readings)} readings (10 zones, 1 a minute, a week) inserted in ` +
        `${w.insertS.toFixed(1)} s; JSON p50 ${ms(w.jsonP50Ms)} / p95 ${ms(w.jsonP95Ms)} ms; ` +
        (w.pdfP95Ms === null ? `PDF not measured: ${w.pdfNote}` : `PDF p95 ${ms(w.pdfP95Ms)} ms`),
    );
  }

  if (r.web) {
    const w = r.web;
    out.push(
      `web: the overview at ${w.viewport.width}×${w.viewport.height} in a fresh Chromium over ` +
        `loopback, ${w.runs.length} runs, navigation start → first zone card ` +
        `${w.runs.map((x) => Math.round(x.firstRenderMs)).join(', ')} ms (median ` +
        `${Math.round(w.firstRenderMs)}); JavaScript loaded before it: ${w.scripts.length} files, ` +
        `${w.bundleKbRaw} KB raw, ${w.bundleKbGz} KB gzip -9 (` +
        w.scripts
          .map((s) => `${s.file.split('/').pop()} ${(s.gzBytes / 1024).toFixed(1)}`)
          .join(', ') +
        ')' +
        (w.work
          ? `; before the first card ${w.work.modules} module bodies ran and React committed ` +
            `${w.work.commits} times (${w.work.fibers} fibers)`
          : ''),
    );
  }

  if (r.import) {
    const im = r.import;
    const stage = (k: keyof (typeof im.imports)[number]) =>
      im.imports.map((x) => Math.round(Number(x[k]))).join('/');
    out.push(
      `import: ${int(im.rows)} lines (${(im.fileBytes / 2 ** 20).toFixed(1)} MB), ` +
        `${im.imports.length} rounds; import ${int(im.importRowsPerS)} rows/s end to end, bare COPY ` +
        `${int(im.copyRowsPerS)} rows/s, readings-shaped COPY (key and covering index) ` +
        `${int(im.floorRowsPerS)} rows/s (medians); per round, ms: total ${stage('totalMs')}, ` +
        `COPY ${im.copyMs.map(Math.round).join('/')}, readings-shaped ` +
        `${im.floorMs.map(Math.round).join('/')}; stages upload ${stage('uploadMs')}, start ` +
        `${stage('startMs')}, queued ${stage('queuedMs')}, read ${stage('readMs')}, store ` +
        `${stage('storeMs')}; server peak RSS after it ${int(im.peakRssMb)} MB`,
    );
  }

  const f = figuresOf(r);
  out.push('');
  const targetRows = (Object.keys(TARGETS) as (keyof typeof TARGETS)[]).map((key) => {
    const target: { atLeast?: number; atMost?: number } = TARGETS[key];
    const value = f[key];
    const met =
      value === null
        ? 'not run'
        : target.atLeast !== undefined
          ? value >= target.atLeast
            ? 'met'
            : 'MISSED'
          : value <= target.atMost!
            ? 'met'
            : 'MISSED';
    const goal = target.atLeast !== undefined ? `≥ ${target.atLeast}` : `≤ ${target.atMost}`;
    return [key, value === null ? '–' : String(value), goal, met];
  });
  out.push(table(['figure', 'measured', 'target', ''], targetRows));
  out.push(
    `server memory: ${int(r.startRssMb)} MB resident once started, ${int(r.peakRssMb)} MB at ` +
      'its peak (MB = 2^20 bytes; the server runs bundled on plain node, as npm start runs it)' +
      (r.bareRssMb !== undefined
        ? `; the bare Express process peaked at ${int(r.bareRssMb)} MB under the bare phase's load`
        : ''),
  );
  out.push(
    `failures: ${String(f.failures)} (non-2xx, socket errors, missing deliveries; should be 0)`,
  );
  out.push(JSON.stringify(f));
  return out.join('\n');
}
