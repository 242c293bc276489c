/**
 * What the renderer's main thread did between navigation start and the first zone card, read
 * from a Chromium trace of one run (`--web-trace`). Wall times on a shared machine move with the
 * load; the thread's own CPU time (`tdur`) and the V8 sampler's self time per function move far
 * less, so they are the figures to compare builds by.
 */
import fs from 'node:fs';
import path from 'node:path';

import { decodeVlq, packageOf } from './bundleSizes';

/** The user-timing mark the measured page makes when the first zone card is in the document. */
export const FIRST_CARD_MARK = 'drybench-first-zone-card';

interface TraceEvent {
  name: string;
  cat?: string;
  ph: string;
  ts: number;
  dur?: number;
  tdur?: number;
  pid: number;
  tid: number;
  id?: string;
  args?: Record<string, unknown>;
}

interface ProfileNode {
  id: number;
  parent?: number;
  callFrame: {
    functionName?: string;
    url?: string;
    lineNumber?: number;
    columnNumber?: number;
  };
}

export interface MainThreadSummary {
  /** Wall time of the main thread's top-level tasks until the first card. */
  busyMs: number;
  /** The thread's CPU time over the same tasks. */
  cpuMs: number;
  /**
   * CPU time of every thread of the page's renderer process until the first card (V8 compiles
   * scripts on worker threads while they stream): what the main thread's figure can hide.
   */
  processCpuMs: number;
  /** Self wall time per kind of work (script compile, evaluation, style, layout …), largest first. */
  byKind: { name: string; ms: number }[];
  /** V8 sampler self time per function (name and file), largest first. */
  byFunction: { name: string; ms: number }[];
  /** Self time per script file (V8 samples), largest first. */
  byFile: { name: string; ms: number }[];
  /** Self time per package (V8 samples mapped through the export's source maps), if given. */
  byPackage: { name: string; ms: number }[];
}

/** Per generated line, the columns where a source's segment starts (source map revision 3). */
type LineStarts = { column: number; source: string }[][];

function lineStartsOf(mapPath: string): LineStarts | null {
  if (!fs.existsSync(mapPath)) return null;
  const map = JSON.parse(fs.readFileSync(mapPath, 'utf8')) as {
    sources: string[];
    mappings: string;
  };
  let sourceIndex = 0;
  return map.mappings.split(';').map((line) => {
    let column = 0;
    const starts: { column: number; source: string }[] = [];
    for (const segment of line.split(',').filter(Boolean)) {
      const fields = decodeVlq(segment);
      column += fields[0]!;
      if (fields.length >= 4) {
        sourceIndex += fields[1]!;
        starts.push({ column, source: map.sources[sourceIndex] ?? '(unmapped)' });
      }
    }
    return starts;
  });
}

/** The package of generated (line, column), both 0-based: the last segment starting at or before. */
function packageAt(starts: LineStarts, line: number, column: number): string {
  const segs = starts[line] ?? [];
  const seg = segs.findLast((x) => x.column <= column) ?? segs[0];
  return seg ? packageOf(seg.source) : '(unmapped)';
}

const top = (m: Map<string, number>, n: number) =>
  [...m.entries()]
    .sort((a, b) => b[1] - a[1])
    .slice(0, n)
    .map(([name, us]) => ({ name, ms: Math.round(us / 100) / 10 }));

const add = (m: Map<string, number>, k: string, v: number) => m.set(k, (m.get(k) ?? 0) + v);

/**
 * mapsDir: an export of the same build with source maps (scripts/bundle-report.ts writes one to
 * .tmp/web-maps); without it byPackage is empty.
 */
export function summarizeTrace(
  tracePath: string,
  firstRenderMs: number,
  mapsDir?: string,
): MainThreadSummary {
  const raw = JSON.parse(fs.readFileSync(tracePath, 'utf8')) as
    TraceEvent[] | { traceEvents: TraceEvent[] };
  const events = Array.isArray(raw) ? raw : raw.traceEvents;
  // The page's main thread and its clock: the user-timing mark the page makes when the first
  // card enters the document (FIRST_CARD_MARK), firstRenderMs after navigation start. The
  // navigation start event itself is not always in the trace (the page's renderer may have
  // started before tracing did).
  const mark = events.find((e) => e.name === FIRST_CARD_MARK);
  if (!mark) throw new Error(`${tracePath}: no ${FIRST_CARD_MARK} mark`);
  const nav = { pid: mark.pid, tid: mark.tid };
  const end = mark.ts;
  const start = end - firstRenderMs * 1000;
  const onMain = events
    .filter((e) => e.pid === nav.pid && e.tid === nav.tid && e.ph === 'X' && e.dur !== undefined)
    .filter((e) => e.ts >= start && e.ts < end)
    .sort((a, b) => a.ts - b.ts || b.dur! - a.dur!);

  // Top-level tasks (not nested in another complete event) give busy and CPU time; every event's
  // self time (its duration less its children's) gives the split by kind.
  let busy = 0;
  let cpu = 0;
  const byKind = new Map<string, number>();
  const stack: { e: TraceEvent; childUs: number }[] = [];
  const close = (until: number) => {
    while (stack.length && stack.at(-1)!.e.ts + stack.at(-1)!.e.dur! <= until) {
      const done = stack.pop()!;
      add(byKind, done.e.name, Math.max(0, done.e.dur! - done.childUs));
    }
  };
  for (const e of onMain) {
    close(e.ts);
    const clipped = Math.min(e.dur!, end - e.ts);
    if (stack.length === 0) {
      busy += clipped;
      cpu += (e.tdur ?? e.dur!) * (clipped / Math.max(1, e.dur!));
    } else stack.at(-1)!.childUs += e.dur!;
    stack.push({ e, childUs: 0 });
  }
  close(Number.POSITIVE_INFINITY);

  // Every thread of the renderer: top-level events per thread, each thread's own CPU time.
  let processCpu = 0;
  const endOfThread = new Map<number, number>();
  for (const e of events
    .filter((x) => x.pid === nav.pid && x.ph === 'X' && x.dur !== undefined && x.ts < end)
    .filter((x) => x.ts + x.dur! > start)
    .sort((a, b) => a.tid - b.tid || a.ts - b.ts || b.dur! - a.dur!)) {
    if (e.ts < (endOfThread.get(e.tid) ?? -Infinity)) continue; // nested in the one before
    endOfThread.set(e.tid, e.ts + e.dur!);
    const inside = Math.min(e.ts + e.dur!, end) - Math.max(e.ts, start);
    processCpu += (e.tdur ?? e.dur!) * (inside / Math.max(1, e.dur!));
  }

  // The V8 sampler: ProfileChunk events of the main thread's profile carry nodes and samples.
  const nodes = new Map<number, ProfileNode>();
  const byFunction = new Map<string, number>();
  const byFile = new Map<string, number>();
  const byPackage = new Map<string, number>();
  const maps = new Map<string, LineStarts | null>();
  const mapOf = (file: string) => {
    if (!mapsDir) return null;
    if (!maps.has(file)) {
      maps.set(file, lineStartsOf(path.join(mapsDir, '_expo/static/js/web', `${file}.map`)));
    }
    return maps.get(file)!;
  };
  const profileIds = new Set(
    events
      .filter((e) => e.name === 'Profile' && e.pid === nav.pid && e.tid === nav.tid)
      .map((e) => e.id),
  );
  let t = 0;
  for (const e of events) {
    if (e.name === 'Profile' && profileIds.has(e.id)) {
      t = Number((e.args?.data as { startTime?: number } | undefined)?.startTime ?? 0);
    }
    if (e.name !== 'ProfileChunk' || !profileIds.has(e.id)) continue;
    const data = e.args?.data as {
      cpuProfile?: { nodes?: ProfileNode[]; samples?: number[] };
      timeDeltas?: number[];
    };
    for (const n of data.cpuProfile?.nodes ?? []) nodes.set(n.id, n);
    const samples = data.cpuProfile?.samples ?? [];
    const deltas = data.timeDeltas ?? [];
    for (let i = 0; i < samples.length; i++) {
      t += deltas[i] ?? 0;
      const next = deltas[i + 1] ?? 0;
      if (t < start || t >= end) continue;
      const node = nodes.get(samples[i]!);
      if (!node) continue;
      const fn = node.callFrame.functionName || '(anonymous)';
      if (fn === '(idle)' || fn === '(program)') continue;
      const file = (node.callFrame.url ?? '').split('/').pop() || '(native)';
      add(byFunction, `${fn} ${file}`, next);
      add(byFile, file, next);
      const starts = mapOf(file);
      if (starts) {
        const { lineNumber = 0, columnNumber = 0 } = node.callFrame;
        add(byPackage, packageAt(starts, lineNumber, columnNumber), next);
      } else if (mapsDir) add(byPackage, file, next);
    }
  }
  return {
    busyMs: Math.round(busy / 1000),
    cpuMs: Math.round(cpu / 1000),
    processCpuMs: Math.round(processCpu / 1000),
    byKind: top(byKind, 12),
    byFunction: top(byFunction, 15),
    byFile: top(byFile, 10),
    byPackage: top(byPackage, 20),
  };
}

// `npx tsx scripts/bench/webTrace.ts TRACE FIRST_RENDER_MS [MAPS_DIR]` prints one trace's summary.
if (process.argv[1]?.endsWith('webTrace.ts') && process.argv[2]) {
  const [trace, ms, maps] = process.argv.slice(2);
  console.log(JSON.stringify(summarizeTrace(trace!, Number(ms), maps), null, 2));
}
