// The web phase's trace summary (scripts/bench/webTrace.ts), on a hand-made trace written to
// the Trace Event Format (Google's "Trace Event Format" document: complete events `ph: 'X'`
// with `ts`, `dur` and the thread's own `tdur`, all in microseconds) and to DevTools' sampled
// CPU profile as Chromium writes it into traces (`Profile` with a start time, `ProfileChunk`
// with `cpuProfile.nodes`, `samples` and `timeDeltas` in microseconds). The expected figures
// are worked by hand from those definitions; the field names are from memory of the formats,
// checked against a real trace of the bench (`--web-trace`).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import { afterAll, describe, expect, it } from 'vitest';

import { FIRST_CARD_MARK, summarizeTrace } from '@/scripts/bench/webTrace';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'web-trace-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

const PAGE = { pid: 7, tid: 7 };
const OTHER = { pid: 9, tid: 9 };
const file = 'entry-abc.js';

// The first card 100 ms after navigation start: the window is ts 1,000 → 101,000 µs.
const events = [
  { name: FIRST_CARD_MARK, ph: 'R', ts: 101_000, ...PAGE },
  // Before the window: not counted.
  { name: 'RunTask', ph: 'X', ts: 500, dur: 400, tdur: 400, ...PAGE },
  // A task of 50 ms wall, 30 ms on the CPU, with a 40 ms call holding a 10 ms compile.
  { name: 'RunTask', ph: 'X', ts: 2_000, dur: 50_000, tdur: 30_000, ...PAGE },
  { name: 'FunctionCall', ph: 'X', ts: 3_000, dur: 40_000, tdur: 25_000, ...PAGE },
  { name: 'V8.CompileCode', ph: 'X', ts: 4_000, dur: 10_000, tdur: 10_000, ...PAGE },
  // A task cut by the first card: 6 of its 20 ms fall in the window, so 6 ms wall and CPU.
  { name: 'RunTask', ph: 'X', ts: 95_000, dur: 20_000, tdur: 20_000, ...PAGE },
  // A V8 worker of the same renderer compiling while the script streams: 8 ms CPU, nested 2.
  { name: 'V8.CompileTask', ph: 'X', ts: 20_000, dur: 9_000, tdur: 8_000, pid: PAGE.pid, tid: 8 },
  { name: 'V8.Parse', ph: 'X', ts: 21_000, dur: 2_000, tdur: 2_000, pid: PAGE.pid, tid: 8 },
  // Another renderer's work: not the page's.
  { name: 'RunTask', ph: 'X', ts: 10_000, dur: 30_000, tdur: 30_000, ...OTHER },
  { name: 'Profile', ph: 'P', id: '0x1', ts: 1_000, args: { data: { startTime: 1_000 } }, ...PAGE },
  {
    name: 'ProfileChunk',
    ph: 'P',
    id: '0x1',
    ts: 40_000,
    pid: PAGE.pid,
    tid: 99, // the sampler's own thread; the chunk belongs to the profile by its id
    args: {
      data: {
        cpuProfile: {
          nodes: [
            { id: 1, callFrame: { functionName: '(root)' } },
            {
              id: 2,
              parent: 1,
              callFrame: {
                functionName: 'a',
                url: `http://h/${file}`,
                lineNumber: 0,
                columnNumber: 1,
              },
            },
            {
              id: 3,
              parent: 1,
              callFrame: {
                functionName: 'b',
                url: `http://h/${file}`,
                lineNumber: 0,
                columnNumber: 7,
              },
            },
            { id: 4, parent: 1, callFrame: { functionName: '(idle)' } },
          ],
          samples: [2, 2, 3, 4, 3],
        },
        // Samples at 1,000, 11,000, 21,000, 31,000 and 200,000 µs; each lasts until the next.
        timeDeltas: [0, 10_000, 10_000, 10_000, 169_000],
      },
    },
  },
];

// One generated line: columns 0–4 from a package, 5 onwards from our components (mappings
// "AAAA,KCAA": column 0 → source 0; column +5, source +1).
const mapsDir = path.join(dir, 'maps');
fs.mkdirSync(path.join(mapsDir, '_expo/static/js/web'), { recursive: true });
fs.writeFileSync(
  path.join(mapsDir, '_expo/static/js/web', `${file}.map`),
  JSON.stringify({
    version: 3,
    sources: ['/node_modules/alpha/index.js', '/components/zones/ZoneCard.tsx'],
    names: [],
    mappings: 'AAAA,KCAA',
  }),
);
const tracePath = path.join(dir, 'trace.json');
fs.writeFileSync(tracePath, JSON.stringify({ traceEvents: events }));

describe('summarizeTrace', () => {
  const s = summarizeTrace(tracePath, 100, mapsDir);

  it('counts only the page thread’s top-level tasks inside the window, wall and CPU', () => {
    expect(s.busyMs).toBe(50 + 6);
    expect(s.cpuMs).toBe(30 + 6);
  });

  it('adds the renderer’s other threads for the process figure, each top-level event once', () => {
    expect(s.processCpuMs).toBe(30 + 6 + 8);
  });

  it('splits nested events into self time', () => {
    const kind = Object.fromEntries(s.byKind.map((k) => [k.name, k.ms]));
    expect(kind['FunctionCall']).toBe(30); // 40 less its 10 ms compile
    expect(kind['V8.CompileCode']).toBe(10);
  });

  it('gives each sample the time to the next one, and maps it to its package', () => {
    // a: two samples of 10 ms; b: one of 10 ms (its second sample at 200 ms is past the window);
    // the idle sample counts for nobody.
    expect(s.byFunction).toEqual([
      { name: `a ${file}`, ms: 20 },
      { name: `b ${file}`, ms: 10 },
    ]);
    expect(s.byFile).toEqual([{ name: file, ms: 30 }]);
    expect(s.byPackage).toEqual([
      { name: 'alpha', ms: 20 },
      { name: 'components/', ms: 10 },
    ]);
  });

  it('refuses a trace without the first card’s mark', () => {
    const bare = path.join(dir, 'bare.json');
    fs.writeFileSync(bare, JSON.stringify({ traceEvents: events.slice(1) }));
    expect(() => summarizeTrace(bare, 100)).toThrow(/no drybench-first-zone-card mark/);
  });
});
