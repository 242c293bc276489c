// What the web bundle is made of: `npx tsx scripts/bundle-report.ts [export folder]`. Without a
// folder it exports the web app with source maps to .tmp/web-maps (dist/ ships without them).
import { execFileSync } from 'node:child_process';
import path from 'node:path';

import { bytesPerPackage, jsFilesOf } from '@/scripts/bench/bundleSizes';

const TOP = 25;
// Files this large also get their own list of packages.
const BIG_FILE_BYTES = 100 * 1024;
const TOP_PER_FILE = 10;
const kb = (n: number) => (n / 1024).toFixed(1).padStart(8);

function main() {
  let dir = process.argv[2];
  if (!dir) {
    dir = '.tmp/web-maps';
    console.error(`exporting the web app with source maps to ${dir}…`);
    execFileSync(
      'npx',
      ['expo', 'export', '--platform', 'web', '--source-maps', '--output-dir', dir],
      {
        stdio: ['ignore', 'ignore', 'inherit'],
        // As scripts/build-web.sh exports dist/.
        env: {
          ...process.env,
          CI: '1',
          EXPO_PUBLIC_FOLDER: 'scripts/web',
          EXPO_UNSTABLE_TREE_SHAKING: process.env.EXPO_TREE_SHAKING ?? '1',
          EXPO_UNSTABLE_METRO_OPTIMIZE_GRAPH: process.env.EXPO_TREE_SHAKING ?? '1',
        },
      },
    );
  }
  const files = jsFilesOf(dir);
  const total = new Map<string, number>();
  const perBigFile: string[] = [];
  console.log('file                                                        KB raw   KB gz');
  for (const f of files) {
    console.log(`${f.file.padEnd(56)} ${kb(f.bytes)} ${kb(f.gzBytes)}`);
    const perPackage = bytesPerPackage(path.join(dir, f.file));
    for (const [name, n] of perPackage ?? []) total.set(name, (total.get(name) ?? 0) + n);
    if (perPackage && f.bytes >= BIG_FILE_BYTES) {
      perBigFile.push(`\n${path.basename(f.file)}, top ${TOP_PER_FILE} packages:`);
      for (const [name, n] of top(perPackage, TOP_PER_FILE)) {
        perBigFile.push(`${name.padEnd(44)} ${kb(n)} KB`);
      }
    }
  }
  const sum = (key: 'bytes' | 'gzBytes') => files.reduce((s, f) => s + f[key], 0);
  console.log(`${'all files'.padEnd(56)} ${kb(sum('bytes'))} ${kb(sum('gzBytes'))}`);
  if (total.size === 0) return console.log('(no source maps beside the files: no package split)');
  const all = [...total.values()].reduce((s, n) => s + n, 0);
  console.log(`\ntop ${TOP} packages by minified characters, all files:`);
  for (const [name, n] of top(total, TOP)) {
    console.log(`${name.padEnd(44)} ${kb(n)} KB ${((100 * n) / all).toFixed(1).padStart(5)} %`);
  }
  console.log(perBigFile.join('\n'));
}

function top(sizes: Map<string, number>, n: number): [string, number][] {
  return [...sizes].sort((a, b) => b[1] - a[1]).slice(0, n);
}

main();
