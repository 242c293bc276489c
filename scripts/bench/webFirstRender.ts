/**
 * The web phase: what the overview costs a browser. A shop of a few zones, each with a fresh
 * reading, signed in; then, per run, a fresh Chromium (new profile, empty cache) opens the
 * overview over loopback. Two figures:
 * - firstRenderMs: navigation start (the page's time origin) to the first zone card in the
 *   document, median over the runs, at the phone size (390×844) the app is designed for first;
 * - bundleKbGz: the JavaScript the overview loaded before that moment, each file gzip -9 from
 *   dist/ and summed (what a server sending pre-compressed files would send).
 */
import fs from 'node:fs';
import path from 'node:path';

import { chromium, type Browser } from 'playwright-core';

import { CHROMIUM_ARGS, CHROMIUM_PATH } from '@/tests/support/chromium';

import { gzipSize } from './bundleSizes';
import { call, signUp } from './fixtures';
import { percentile } from './stats';
import { FIRST_CARD_MARK, summarizeTrace } from './webTrace';

export interface WebRun {
  firstRenderMs: number;
  /** Navigation start to the app's own first card (the same as firstRenderMs without SSR). */
  appCardMs: number;
  /** Paths of the scripts fetched before the zone list showed, as the page asked for them. */
  scripts: string[];
  /** Each request before then: file or route, start → end in ms since navigation start. */
  timeline: string[];
}

export interface WebResult {
  viewport: { width: number; height: number };
  runs: WebRun[];
  firstRenderMs: number;
  /** Median navigation start → the app's own first card, behind the server's first screen. */
  appCardMs: number;
  /** Per script the overview loaded (first run; every run loads the same): raw and gzip -9. */
  scripts: { file: string; bytes: number; gzBytes: number }[];
  bundleKbGz: number;
  bundleKbRaw: number;
  /** What the first screen ran (the counting run); null if it could not count. */
  work: WebWork | null;
}

export const PHONE = { width: 390, height: 844 };
const RUNS = 7;
const ZONES = 4;

/** A signed-in owner of a shop of ZONES zones, each with a sensor that has just posted. */
async function webShop(url: string): Promise<{ cookie: string; shopId: string }> {
  const cookie = await signUp(url, 'Overview owner');
  const post = <T>(p: string, body: unknown) => call<T>(url, p, body, cookie).then((r) => r.body);
  const shop = await post<{ id: string }>('/shops', { name: 'Overview shop', timeZone: 'UTC' });
  for (let z = 0; z < ZONES; z++) {
    const zone = await post<{ id: string }>(`/shops/${shop.id}/zones`, { name: `Bay ${z + 1}` });
    const sensor = await post<{ token: string }>(`/shops/${shop.id}/sensors`, {
      name: `Probe ${z + 1}`,
      zoneId: zone.id,
    });
    const air = 14 + 2 * z;
    const res = await fetch(`${url}/api/v1/ingest`, {
      method: 'POST',
      headers: { authorization: `Bearer ${sensor.token}`, 'content-type': 'application/json' },
      body: JSON.stringify({ air, rh: 55 + 8 * z, surface: air - 1.5, battery: 3.1 }),
    });
    if (res.status !== 202) throw new Error(`reading for zone ${z + 1}: ${res.status}`);
  }
  return { cookie, shopId: shop.id };
}

// In the page before any of its scripts: the moment the first zone card enters the document,
// on the page's clock (milliseconds since navigation start).
// Also the moment the app's own first card is in its root (with the server's first screen,
// server/firstScreen.ts, the first card in the document is the server's).
const MARK_FIRST_CARD = `(() => {
  const seen = () => {
    if (!window.__firstZoneCardMs && document.querySelector('[data-testid="zone-card"]')) {
      window.__firstZoneCardMs = performance.now();
      performance.mark('${FIRST_CARD_MARK}');
    }
    if (document.querySelector('#root [data-testid="zone-card"]')) {
      window.__appZoneCardMs = performance.now();
      observer.disconnect();
    }
  };
  const observer = new MutationObserver(seen);
  observer.observe(document, { childList: true, subtree: true });
})();`;

// Counted in one extra, untimed run (the wrapping costs a little on every module): how many
// module bodies Metro ran and how many times React committed before the first card, and the
// number of fibers in the tree then. Load-independent measures of the work the first screen does.
// Metro's runtime assigns the global __d (define) once; a setter wraps each module's factory.
const COUNT_WORK = `(() => {
  const w = window;
  const count = (w.__drybenchWork = { modules: 0, commits: 0, fibers: 0, commitMs: [] });
  let define;
  Object.defineProperty(w, '__d', {
    configurable: true,
    get: () => define,
    set: (d) => {
      define = (factory, ...rest) =>
        d(function () { if (!w.__firstZoneCardMs) count.modules++; return factory.apply(this, arguments); }, ...rest);
    },
  });
  const fibersOf = (fiber) => {
    let n = 0;
    const stack = [fiber];
    while (stack.length) {
      const f = stack.pop();
      for (let c = f; c; c = c.sibling) { n++; if (c.child) stack.push(c.child); }
    }
    return n;
  };
  w.__REACT_DEVTOOLS_GLOBAL_HOOK__ = {
    supportsFiber: true,
    renderers: new Map(),
    inject: () => 1,
    checkDCE: () => {},
    onScheduleFiberRoot: () => {},
    onCommitFiberUnmount: () => {},
    onPostCommitFiberRoot: () => {},
    onCommitFiberRoot: (_id, root) => {
      if (w.__firstZoneCardMs) return;
      count.commits++;
      count.fibers = fibersOf(root.current);
      count.commitMs.push(Math.round(performance.now()));
    },
  };
})();`;

export interface WebWork {
  /** Module bodies Metro ran before the first card. */
  modules: number;
  /** React commits before the first card, and the fibers in the tree at the last of them. */
  commits: number;
  fibers: number;
  /** When each commit happened (ms since navigation start; slowed by the counting). */
  commitMs: number[];
}

// What a trace records: the main thread's tasks, script parse/compile/run and V8's samples.
const TRACE_CATEGORIES = [
  'devtools.timeline',
  'disabled-by-default-devtools.timeline',
  'toplevel',
  'loading',
  'v8',
  'v8.execute',
  'disabled-by-default-v8.compile',
  'disabled-by-default-v8.cpu_profiler',
  'blink.user_timing',
];

async function oneRun(
  browser: Browser,
  url: string,
  cookie: string,
  shopId: string,
  tracePath: string | null,
  countWork = false,
): Promise<WebRun & { work?: WebWork }> {
  const [name, value] = [
    cookie.slice(0, cookie.indexOf('=')),
    cookie.slice(cookie.indexOf('=') + 1),
  ];
  const context = await browser.newContext({ viewport: PHONE });
  try {
    await context.addCookies([{ name, value, url }]);
    await context.addInitScript(MARK_FIRST_CARD);
    if (countWork) await context.addInitScript(COUNT_WORK);
    const page = await context.newPage();
    const scripts: string[] = [];
    page.on('request', (req) => {
      const u = new URL(req.url());
      if (u.pathname.endsWith('.js')) scripts.push(u.pathname);
    });
    if (tracePath)
      await browser.startTracing(page, { path: tracePath, categories: TRACE_CATEGORIES });
    await page.goto(`${url}/shops/${shopId}`);
    await page
      .getByTestId('zone-card')
      .first()
      .waitFor({ timeout: 30_000 })
      .catch(async (err: unknown) => {
        const text = await page.evaluate(() => document.body.innerText.slice(0, 300));
        throw new Error(`no zone card at ${page.url()}; the page says: ${text}`, { cause: err });
      });
    const firstRenderMs = await page.evaluate(
      () => (window as unknown as { __firstZoneCardMs: number }).__firstZoneCardMs,
    );
    await page.locator('#root [data-testid="zone-card"]').first().waitFor({ timeout: 30_000 });
    const appCardMs = await page.evaluate(
      () => (window as unknown as { __appZoneCardMs: number }).__appZoneCardMs,
    );
    if (tracePath) await browser.stopTracing();
    // Only what was asked for before the card showed counts as the overview's load.
    const asked = await page.evaluate(
      (until) =>
        performance
          .getEntriesByType('resource')
          .filter((e) => e.name.endsWith('.js') && e.startTime <= until)
          .map((e) => new URL(e.name).pathname),
      firstRenderMs,
    );
    // Where the time went: each request until then, on the page's clock.
    const timeline = await page.evaluate(
      (until) =>
        performance
          .getEntriesByType('resource')
          .filter((e) => e.startTime <= until)
          .map((e) => {
            const u = new URL(e.name);
            const r = e as PerformanceResourceTiming;
            return `${u.pathname.split('/').pop()} ${Math.round(r.startTime)}→${Math.round(r.responseEnd)}`;
          }),
      firstRenderMs,
    );
    const work = countWork
      ? await page.evaluate(() => (window as unknown as { __drybenchWork: WebWork }).__drybenchWork)
      : undefined;
    return {
      firstRenderMs,
      appCardMs,
      scripts: scripts.filter((s) => asked.includes(s)),
      timeline,
      work,
    };
  } finally {
    await context.close();
  }
}

export async function measureWeb(opts: {
  url: string;
  distDir: string;
  /** Writes a Chromium trace of the last run here, if set. */
  traceDir?: string | null;
  progress: (line: string) => void;
}): Promise<WebResult> {
  const { cookie, shopId } = await webShop(opts.url);
  const runs: WebRun[] = [];
  for (let i = 0; i < RUNS; i++) {
    // A new browser process each run: a fresh profile, nothing cached or compiled.
    const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
    try {
      const trace =
        opts.traceDir && i === RUNS - 1
          ? path.join(opts.traceDir, `overview-${Date.now()}.json`)
          : null;
      if (trace) fs.mkdirSync(opts.traceDir!, { recursive: true });
      const run = await oneRun(browser, opts.url, cookie, shopId, trace);
      runs.push(run);
      if (trace) {
        opts.progress(`the last run's trace: ${trace}`);
        // A trace that cannot be read costs its summary, not the run's figures.
        const main = (() => {
          try {
            return summarizeTrace(trace, run.firstRenderMs, opts.distDir);
          } catch (err) {
            opts.progress(`its trace could not be summarized: ${String(err)}`);
            return null;
          }
        })();
        if (main) {
          const list = (xs: { name: string; ms: number }[]) =>
            xs.map((x) => `${x.name} ${x.ms}`).join('; ');
          opts.progress(
            `its main thread until the first card (${Math.round(run.firstRenderMs)} ms): busy ` +
              `${main.busyMs} ms, CPU ${main.cpuMs} ms (the renderer's threads together: ` +
              `${main.processCpuMs} ms CPU); by kind (self ms): ${list(main.byKind)}`,
          );
          opts.progress(`V8 samples by file (self ms): ${list(main.byFile)}`);
          opts.progress(`V8 samples by function (self ms): ${list(main.byFunction)}`);
          // Only an export with source maps beside its files (scripts/bundle-report.ts).
          if (main.byPackage.length)
            opts.progress(`V8 samples by package (self ms): ${list(main.byPackage)}`);
        }
      }
    } finally {
      await browser.close();
    }
  }
  opts.progress(`the last run's requests (ms): ${runs.at(-1)!.timeline.join(', ')}`);
  const counting = await chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
  const work = await oneRun(counting, opts.url, cookie, shopId, null, true)
    .then((r) => r.work ?? null)
    .finally(() => counting.close());
  if (work) {
    opts.progress(
      `before the first card (an extra, untimed run): ${work.modules} module bodies run, ` +
        `${work.commits} React commits (at ${work.commitMs.join(', ')} ms), ` +
        `${work.fibers} fibers in the tree`,
    );
  }
  opts.progress(
    `first render, ${RUNS} runs: ${runs.map((r) => Math.round(r.firstRenderMs)).join(', ')} ms`,
  );
  opts.progress(
    `the app's own first card, ${RUNS} runs: ` +
      `${runs.map((r) => Math.round(r.appCardMs)).join(', ')} ms`,
  );
  const scripts = runs[0]!.scripts.map((file) => {
    const data = fs.readFileSync(path.join(opts.distDir, file));
    return { file, bytes: data.length, gzBytes: gzipSize(data) };
  });
  const kb = (n: number) => Math.round((n / 1024) * 10) / 10;
  const median = (values: number[]) =>
    percentile(
      [...values].sort((a, b) => a - b),
      50,
    );
  return {
    viewport: PHONE,
    runs,
    firstRenderMs: median(runs.map((r) => r.firstRenderMs)),
    appCardMs: median(runs.map((r) => r.appCardMs)),
    scripts,
    bundleKbGz: kb(scripts.reduce((s, f) => s + f.gzBytes, 0)),
    bundleKbRaw: kb(scripts.reduce((s, f) => s + f.bytes, 0)),
    work,
  };
}
