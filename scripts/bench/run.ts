/**
 * One bench run, start to finish: its own PostgreSQL, the servers under test as child processes,
 * the fixtures, each phase for a fixed time, then everything stopped again — also on failure.
 */
import { execFileSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';

import { measureChartQuery, type ChartQueryResult } from './chartHistory';
import { measureLongChart, type LongChartResult } from './chartLongRange';
import { createFixtures, type BenchFixtures } from './fixtures';
import { loggerCsv, measureImportSpeed, type ImportSpeedResult } from './importSpeed';
import { runHttpSlice } from './httpLoad';
import { interleave, type Contender, type Measured } from './interleave';
import { measureLiveLatency, type LiveLatencyResult } from './liveLatency';
import { connectLiveClients, type LiveClients } from './liveSockets';
import { createMqttShop, measureMqttLatency, type MqttLatencyResult } from './mqttLatency';
import type { BenchOptions, Phase } from './options';
import { startPacedLoad, startPacedLoadInWorker, type PacedLoadResult } from './pacedLoad';
import {
  PG_STATS_SERVER_OPTS,
  readGroupSizes,
  resetPgStats,
  writePgStats,
  type GroupSizes,
} from './pgStats';
import { startBenchDatabase } from './postgres';
import {
  freePort,
  machineCpuSeconds,
  memoryOf,
  serverNodeFlags,
  startNodeChild,
  type Child,
} from './processes';
import { openRawInserter } from './rawInsert';
import { createReadingSource, type ReadingSource } from './readings';
import { coresOf, startCpuMeter, type CpuCores } from './usage';
import { benchWeekReport, type WeekReportBench } from './weekReport';
import { measureWeb, type WebResult } from './webFirstRender';

export interface LivePhase extends LiveLatencyResult {
  cpu: CpuCores;
}

export interface BenchResult {
  startedAt: Date;
  options: BenchOptions;
  /** Cores busy in the second before the run: other work on the machine skews everything. */
  busyCoresBefore: number;
  cpuCount: number;
  bare?: Measured;
  raw?: Measured;
  ingest1?: Measured;
  /** How the writer grouped the single-reading requests (rows per committed statement). */
  ingest1Groups?: GroupSizes;
  ingest50?: Measured;
  liveIdle?: LivePhase;
  mqtt?: MqttLatencyResult;
  liveLoaded?: LivePhase & { background: PacedLoadResult & { askedPerS: number } };
  /** One zone's 7-day history with 10 M readings stored (scripts/bench/chartHistory.ts). */
  chart?: ChartQueryResult;
  /** One zone's 30- and 90-day history, raw and from roll-ups (scripts/bench/chartLongRange.ts). */
  chartLong?: LongChartResult;
  weekReport?: WeekReportBench;
  /** The overview in a fresh Chromium: its first render and the JavaScript it loaded. */
  web?: WebResult;
  /** A logger file imported end to end against a bare COPY of it (scripts/bench/importSpeed.ts). */
  import?: ImportSpeedResult & { peakRssMb: number };
  /** The Drybench server's resident memory once started and set up, before any load. */
  startRssMb: number;
  /** The Drybench server's peak resident memory over the whole run. */
  peakRssMb: number;
  /**
   * The bare Express process's peak resident memory once it has carried its share of the bare
   * phase's load: what node, Express and that load cost without Drybench, so `peakRssMb` reads
   * as a ratio to it. Absent when the bare phase does not run.
   */
  bareRssMb?: number;
}

export async function runBench(
  options: BenchOptions,
  progress: (line: string) => void,
): Promise<BenchResult> {
  const result: BenchResult = {
    startedAt: new Date(),
    options,
    busyCoresBefore: await busyCores(1000),
    cpuCount: os.cpus().length,
    startRssMb: Number.NaN,
    peakRssMb: Number.NaN,
  };
  const has = (phase: Phase) => options.phases.includes(phase);
  const readings = createReadingSource();
  // The import phase's logger file, ending a day ago, made before any connection is open.
  const importFile = has('import') ? loggerCsv(options.importRows, Date.now() - 86_400_000) : null;

  progress(`starting PostgreSQL on 127.0.0.1:${options.pgPort}…`);
  const database = await startBenchDatabase({
    port: options.pgPort,
    database: options.database,
    onPortTaken: (wanted, used) => progress(`port ${wanted} is taken; PostgreSQL uses ${used}`),
    serverOpts: options.pgStatsFile ? PG_STATS_SERVER_OPTS : undefined,
  });
  const children: Child[] = [];
  const closers: (() => Promise<void>)[] = [];
  let stopping = false;
  const cleanUp = async () => {
    if (stopping) return;
    stopping = true;
    for (const close of closers.reverse()) await close().catch(() => {});
    // A profiled server writes its profile on exit, which on a busy machine can take longer
    // than the usual grace before SIGKILL (and a killed server writes none).
    await Promise.all(children.map((c) => c.stop(options.cpuProfDir ? 120_000 : undefined)));
    database.stop();
  };
  const onSignal = () => void cleanUp().then(() => process.exit(130));
  // A throw in a socket handler would otherwise end the process with PostgreSQL still running.
  const onCrash = (err: unknown) => {
    console.error(err);
    void cleanUp().then(() => process.exit(1));
  };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  process.once('uncaughtException', onCrash);

  try {
    const serverPort = await freePort();
    // The mqtt phase: our broker as npm start runs it, and the server subscribed to it.
    const mqttEnv: Record<string, string> = {};
    if (has('mqtt')) {
      const mqttPort = await freePort();
      Object.assign(mqttEnv, {
        MQTT_URL: `mqtt://127.0.0.1:${mqttPort}`,
        MQTT_PASSWORD: randomBytes(24).toString('hex'),
      });
      children.push(
        await startNodeChild({
          entry: 'scripts/broker.ts',
          nodeArgs: options.cpuProfDir
            ? ['--cpu-prof', `--cpu-prof-dir=${options.cpuProfDir}`]
            : [],
          env: {
            ...process.env,
            DATABASE_URL: database.url,
            MQTT_PORT: String(mqttPort),
            MQTT_PASSWORD: mqttEnv.MQTT_PASSWORD,
            LOG_LEVEL: 'info',
          },
          ready: /listening on/,
        }),
      );
    }
    // The import phase: the uploaded files go to the S3 fake, as under npm start.
    const storageEnv: Record<string, string> = {};
    if (has('import')) {
      const s3Port = await freePort();
      const s3Dir = `.data/s3-bench-${randomBytes(4).toString('hex')}`;
      Object.assign(storageEnv, {
        S3_ENDPOINT: `http://127.0.0.1:${s3Port}`,
        S3_BUCKET: 'drybench-bench',
        S3_ACCESS_KEY_ID: 'S3RVER',
        S3_SECRET_ACCESS_KEY: 'S3RVER',
      });
      children.push(
        await startNodeChild({
          entry: 'scripts/s3-fake.ts',
          args: ['--port', String(s3Port), '--dir', s3Dir, '--bucket', 'drybench-bench'],
          env: process.env,
          ready: /S3 fake on/,
        }),
      );
      closers.push(async () => fs.rmSync(s3Dir, { recursive: true, force: true }));
    }
    // The server as npm start runs it: bundled, on plain node.
    execFileSync('bash', ['scripts/build-server.sh'], { stdio: 'inherit' });
    const server = await startNodeChild({
      entry: '.build/server.mjs',
      nodeArgs: [
        ...serverNodeFlags(),
        ...(options.cpuProfDir ? ['--cpu-prof', `--cpu-prof-dir=${options.cpuProfDir}`] : []),
      ],
      env: {
        ...serverEnv(database.url, serverPort, options.wsClients),
        ...mqttEnv,
        ...storageEnv,
      },
      ready: /listening on/,
    });
    children.push(server);
    const url = `http://127.0.0.1:${serverPort}`;

    progress('creating the shops, sensors and owners through the API…');
    // The web and import phases make their own small shops: no fleet to set up for them.
    const webOnly = options.phases.every((p) => p === 'web' || p === 'import');
    const fixtures = await createFixtures(url, {
      probeSensors: options.probeSensors,
      fleetSensors: webOnly ? 0 : options.fleetSensors,
    });
    const fleetTokens = fixtures.fleet.map((s) => s.token);
    // The profile covers the measured phases, not the fixtures' set-up.
    if (options.pgStatsFile) await resetPgStats(database.url);
    result.startRssMb = memoryOf(server.pid).rssMb;
    const timing = {
      rounds: options.rounds,
      sliceS: options.durationS / options.rounds,
      warmupS: options.warmupS,
      pgPort: database.port,
    };
    const ingest = (batch: number): Contender<Phase> => ({
      key: batch === 1 ? 'ingest1' : 'ingest50',
      serverPid: server.pid,
      slice: (durationS) =>
        runHttpSlice(
          {
            url,
            path: '/api/v1/ingest',
            connections: options.connections,
            tokens: fleetTokens,
            body: batch === 1 ? readings.singleBody : () => readings.batchBody(batch),
          },
          durationS,
        ).then((s) => ({ ...s, count: s.ok })),
    });

    // HTTP overhead: the bare route against one reading per request.
    const httpPair: Contender<Phase>[] = [];
    let bareServer: Child | undefined;
    if (has('bare')) {
      const barePort = await freePort();
      // Bundled and on plain node like the server, so its memory is a like-for-like baseline.
      execFileSync(
        'npx',
        [
          'esbuild',
          'scripts/bench/bareExpressMain.ts',
          '--bundle',
          '--platform=node',
          '--target=node20',
          '--format=esm',
          '--packages=external',
          '--outfile=.build/bareExpress.mjs',
          '--log-level=warning',
        ],
        { stdio: 'inherit' },
      );
      const bare = await startNodeChild({
        entry: '.build/bareExpress.mjs',
        env: { ...process.env, PORT: String(barePort) },
        ready: /listening on/,
      });
      children.push(bare);
      bareServer = bare;
      httpPair.push({
        key: 'bare',
        serverPid: bare.pid,
        slice: (durationS) =>
          runHttpSlice(
            {
              url: `http://127.0.0.1:${barePort}`,
              path: '/bare',
              connections: options.connections,
              tokens: fleetTokens,
              body: readings.singleBody,
            },
            durationS,
          ).then((s) => ({ ...s, count: s.ok })),
      });
    }
    if (has('ingest1')) httpPair.push(ingest(1));
    if (httpPair.length > 0) {
      progress(`${httpPair.map((c) => c.key).join(' and ')}, interleaved…`);
      Object.assign(result, await interleave(httpPair, timing));
      if (bareServer) result.bareRssMb = memoryOf(bareServer.pid).peakRssMb;
      // Only ingest1 has stored readings yet (the bare route stores none).
      if (has('ingest1')) result.ingest1Groups = await readGroupSizes(database.url);
    }

    // The database: raw INSERTs against batches through the ingest route.
    const dbPair: Contender<Phase>[] = [];
    if (has('raw')) {
      const raw = await openRawInserter({
        databaseUrl: database.url,
        connections: options.connections,
        batch: options.batch,
        sensors: fixtures.fleet,
        readings,
      });
      closers.push(() => raw.close());
      dbPair.push({
        key: 'raw',
        serverPid: server.pid,
        slice: (durationS) =>
          raw.slice(durationS).then((s) => ({ ...s, count: s.rows, failures: 0 })),
      });
    }
    if (has('ingest50')) dbPair.push(ingest(options.batch));
    if (dbPair.length > 0) {
      progress(`${dbPair.map((c) => c.key).join(' and ')}, interleaved…`);
      Object.assign(result, await interleave(dbPair, timing));
    }

    // Before the live phases, so the report is timed without 200 sockets and background load.
    if (has('report')) {
      result.weekReport = await benchWeekReport({
        url,
        databaseUrl: database.url,
        cookie: fixtures.cookie,
        progress,
      });
    }

    if (has('mqtt')) {
      progress('mqtt: 25 sensors publishing 200 readings/s to our broker, one socket watching…');
      const shop = await createMqttShop(url, 25);
      result.mqtt = await measureMqttLatency({
        brokerUrl: mqttEnv.MQTT_URL!,
        url,
        cookie: shop.cookie,
        sensors: shop.sensors,
        ratePerS: 200,
        durationS: options.durationS,
      });
    }

    if (has('live')) {
      progress(
        `connecting ${options.wsClients} signed-in WebSocket clients (${options.liveClients} thread)…`,
      );
      const clients = await connectLiveClients({
        url,
        cookie: fixtures.cookie,
        count: options.wsClients,
        where: options.liveClients,
      });
      closers.push(() => clients.close());
      Object.assign(
        result,
        await measureLive(
          { ...options, pgPort: database.port },
          url,
          server.pid,
          fixtures,
          readings,
          clients,
          progress,
        ),
      );
    }

    result.peakRssMb = memoryOf(server.pid).peakRssMb;

    // After the peak is read: the second server serving the web app is not the one measured.
    if (has('web')) {
      progress('exporting the web app if it changed, then the overview in a fresh Chromium…');
      const webDir = options.webDir ?? 'dist';
      if (!options.webDir) execFileSync('bash', ['scripts/build-web.sh'], { stdio: 'inherit' });
      const webPort = await freePort();
      const webServer = await startNodeChild({
        entry: '.build/server.mjs',
        nodeArgs: serverNodeFlags(),
        env: { ...serverEnv(database.url, webPort, options.wsClients), WEB_DIR: webDir },
        ready: /listening on/,
      });
      children.push(webServer);
      result.web = await measureWeb({
        url: `http://127.0.0.1:${webPort}`,
        distDir: webDir,
        traceDir: options.webTraceDir,
        progress,
      });
    }

    // After the peak is read: holding a file's rows is the import's own memory, shown apart.
    if (has('import')) {
      progress(
        `import: ${options.importRows.toLocaleString('en-US')}-line logger file, upload → stored, ` +
          `against a bare COPY of it, ${options.importRounds} rounds…`,
      );
      const speed = await measureImportSpeed({
        url,
        databaseUrl: database.url,
        file: importFile!,
        rounds: options.importRounds,
        progress,
      });
      result.import = { ...speed, peakRssMb: memoryOf(server.pid).peakRssMb };
    }

    if (has('chart')) {
      progress("the zone history's week query over 10 M stored readings…");
      result.chart = await measureChartQuery(database.url, progress);
    }
    if (has('chartLong')) {
      progress("the zone history's 30- and 90-day queries, raw readings and hourly roll-ups…");
      result.chartLong = await measureLongChart(database.url, progress);
    }
    if (options.pgStatsFile) {
      await writePgStats(database.url, options.pgStatsFile);
      progress(`pg_stat_statements' top statements written to ${options.pgStatsFile}`);
    }
    progress('stopping…');
    return result;
  } finally {
    await cleanUp();
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
    process.off('uncaughtException', onCrash);
  }
}

async function measureLive(
  options: BenchOptions,
  url: string,
  serverPid: number,
  fixtures: BenchFixtures,
  readings: ReadingSource,
  clients: LiveClients,
  progress: (line: string) => void,
): Promise<Pick<BenchResult, 'liveIdle' | 'liveLoaded'>> {
  const live = {
    url,
    clients,
    probeTokens: fixtures.probeTokens,
    intervalMs: options.probeIntervalMs,
    durationS: options.durationS,
    readings,
  };
  progress('POST → WebSocket latency, idle…');
  let meter = startCpuMeter(serverPid, options.pgPort);
  const idle = await measureLiveLatency(live);
  const liveIdle = { ...idle, cpu: coresOf(meter.stop()) };

  progress(
    `POST → WebSocket latency under ${options.backgroundReadingsPerS} readings/s of background ingest…`,
  );
  const load = {
    url,
    tokens: fixtures.fleet.map((s) => s.token),
    readingsPerS: options.backgroundReadingsPerS,
    batch: options.backgroundBatch,
  };
  // With the sockets on their own thread, the load gets one too: the probe's thread then only
  // probes. Its readings start 30 days back, clear of the main source's (60 days back, under
  // 12 days of seconds per run), so none is a duplicate.
  const background =
    options.liveClients === 'worker'
      ? startPacedLoadInWorker({ ...load, readingsStartMs: Date.now() - 30 * 24 * 3600 * 1000 })
      : startPacedLoad({
          ...load,
          body: (n) => (n === 1 ? readings.singleBody() : readings.batchBody(n)),
        });
  // Let the background load settle before the first probe.
  await new Promise((resolve) => setTimeout(resolve, 1000));
  meter = startCpuMeter(serverPid, options.pgPort);
  const loaded = await measureLiveLatency(live);
  const cpu = coresOf(meter.stop());
  const backgroundResult = { ...(await background.stop()), askedPerS: load.readingsPerS };
  return { liveIdle, liveLoaded: { ...loaded, cpu, background: backgroundResult } };
}

/**
 * The server's environment: API only (no web app to serve), a throwaway session secret, and
 * room for all the bench's sockets, which stand in for a shop's people but share one account.
 */
function serverEnv(databaseUrl: string, port: number, wsClients: number): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    DATABASE_URL: databaseUrl,
    PORT: String(port),
    HOST: '127.0.0.1',
    SESSION_SECRET: randomBytes(32).toString('hex'),
    LIVE_SOCKETS_PER_USER: String(Math.max(wsClients, 1)),
    // The harness waits for the info-level "listening on" line, and the figures include the
    // per-request log lines a default server writes: a LOG_LEVEL set in the shell changes neither.
    LOG_LEVEL: 'info',
  };
  delete env.WEB_DIR;
  return env;
}

async function busyCores(windowMs: number): Promise<number> {
  const before = machineCpuSeconds().busyS;
  await new Promise((resolve) => setTimeout(resolve, windowMs));
  return (machineCpuSeconds().busyS - before) / (windowMs / 1000);
}
