// The bundle report's arithmetic (scripts/bench/bundleSizes.ts), checked against outside
// references: the Base64 VLQ digits of the Source Map Revision 3 format, and esbuild's own
// account of how many output bytes each input file became (its metafile's bytesInOutput).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

import { build } from 'esbuild';
import { afterAll, describe, expect, it } from 'vitest';

import { bytesPerSource, decodeVlq, packageOf } from '@/scripts/bench/bundleSizes';

describe('decodeVlq', () => {
  // Source Map Revision 3, "Base 64 VLQ": five value bits per digit, 32 marks a continuation,
  // the lowest bit of the value is its sign. Values worked by hand from that rule (from memory
  // of the format): A = 0, C = 1, D = −1, g = 32 (continue, 0) then B = 1 → 16 → 16.
  it.each([
    ['A', [0]],
    ['C', [1]],
    ['D', [-1]],
    ['gB', [16]],
    ['hB', [-16]],
    ['AAgBC', [0, 0, 16, 1]],
    // 1000 = 0b1111101000 → sign-shifted 2000 = 0b11111010000: low five 10000 (+32 = 48, 'w'),
    // then 111110 = 62 → 30 (+32 = 62, '+'), then 1 ('B').
    ['w+B', [1000]],
  ])('%s → %j', (segment, values) => {
    expect(decodeVlq(segment)).toEqual(values);
  });

  it('refuses a segment cut off in a continuation', () => {
    expect(() => decodeVlq('g')).toThrow(/unterminated/);
  });
});

describe('packageOf', () => {
  it.each([
    ['/node_modules/victory-core/lib/index.js', 'victory-core'],
    ['/node_modules/@tanstack/query-core/build/modern/index.js', '@tanstack/query-core'],
    ['/node_modules/a/node_modules/@scope/b/x.js', '@scope/b'],
    ['/components/zones/ZoneCard.tsx', 'components/'],
    ['__prelude__', '(runtime)'],
  ])('%s → %s', (source, name) => expect(packageOf(source)).toBe(name));
});

describe('bytesPerSource against esbuild', () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'drybench-map-'));
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it('attributes a bundle to its inputs as esbuild counts them, within a few per cent', async () => {
    // Two inputs of very different sizes, so a wrong split between them shows.
    const words = Array.from({ length: 400 }, (_, i) => `word${i}`);
    fs.writeFileSync(
      path.join(dir, 'big.js'),
      `export const big = ${JSON.stringify(words)};\nexport function pick(i) { return big[i % big.length].toUpperCase(); }\n`,
    );
    fs.writeFileSync(
      path.join(dir, 'entry.js'),
      `import { pick } from './big.js';\nwindow.answer = [1, 2, 3].map(pick).join('-');\n`,
    );
    const result = await build({
      entryPoints: [path.join(dir, 'entry.js')],
      bundle: true,
      minify: true,
      sourcemap: 'external',
      metafile: true,
      write: false,
      outfile: path.join(dir, 'out.js'),
      logLevel: 'silent',
    });
    const js = result.outputFiles.find((f) => f.path.endsWith('.js'))!.text;
    const map = JSON.parse(result.outputFiles.find((f) => f.path.endsWith('.map'))!.text);
    const ours = bytesPerSource(js, map);
    const theirs = Object.values(result.metafile.outputs)[0]!.inputs;
    for (const [input, { bytesInOutput }] of Object.entries(theirs)) {
      const name = path.basename(input);
      const mine = [...ours].find(([source]) => source.endsWith(name))?.[1] ?? 0;
      // The wrapper and separators between modules fall to one side or the other: 5 % + 20.
      expect(Math.abs(mine - bytesInOutput)).toBeLessThanOrEqual(bytesInOutput * 0.05 + 20);
    }
    // Every character of the output is counted once.
    expect([...ours.values()].reduce((a, b) => a + b, 0)).toBe(js.length);
  });
});
