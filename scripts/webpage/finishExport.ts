/**
 * After `expo export` (scripts/build-web.sh): makes dist/index.html start the first screen's work
 * at once instead of one step after another, and pre-compresses what the server sends.
 * - The boot script (boot.ts), inlined first in the head: the API requests of the first screen
 *   and preloads of its route chunks; the route → chunk names come from the entry chunk.
 * - The fonts: preloaded, and declared with font-display: swap in the style element expo-font
 *   looks in, so useFonts finds them declared and the app renders at once; text shows in the
 *   fallback until a face arrives instead of the page waiting for three 115 KB files.
 * - Each script, font and the page, gzip and brotli beside it (`x.js.gz`, `x.js.br`), for the
 *   server to send as they are (server/webApp.ts).
 * Usage: tsx scripts/webpage/finishExport.ts <export folder>
 */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

import { buildSync } from 'esbuild';

import type { RouteChunks } from './boot';

/** The style element expo-font keeps its @font-face rules in (expo-font ExpoFontLoader.web). */
const EXPO_FONT_STYLE_ID = 'expo-generated-fonts';

/**
 * Route file → chunk URL, read from the entry chunk: Metro writes app/ as a module context whose
 * getters name each route's async module (`"./x.tsx":{…get:()=>r(d[1])(d[12],d.paths)}`) and
 * whose dependency map gives that module's id (`"12":734`) and chunk (`"paths":{"734":"/_expo/…"}`).
 */
export function routeChunksOf(entrySource: string): RouteChunks {
  // The minifier writes some getters as `get(){var s;return s=r(d[1])(d[0],d.paths),…}`.
  const getter = /"(\.\/[^"]+\.[jt]sx?)":\{enumerable:!0,get.*?\([\w$]+\[(\d+)\],[\w$]+\.paths\)/g;
  const slots = [...entrySource.matchAll(getter)].map((m) => ({ file: m[1]!, slot: m[2]! }));
  if (slots.length === 0) throw new Error('no route context in the entry chunk');
  // The context module's dependency map follows its factory: `},<id>,{"0":…,"paths":{…}});`.
  const mapStart = entrySource.indexOf('{"0":', entrySource.lastIndexOf(slots.at(-1)!.file));
  const depMap = JSON.parse(balancedObject(entrySource, mapStart)) as Record<string, unknown> & {
    paths: Record<string, string>;
  };
  const chunks: RouteChunks = {};
  for (const { file, slot } of slots) {
    const chunk = depMap.paths[String(depMap[slot])];
    if (!chunk) throw new Error(`no chunk for route ${file}`);
    chunks[file] = chunk;
  }
  return chunks;
}

function balancedObject(source: string, start: number): string {
  if (source[start] !== '{') throw new Error('no dependency map after the route context');
  let depth = 0;
  let inString = false;
  for (let i = start; i < source.length; i++) {
    const c = source[i];
    if (inString) {
      if (c === '\\') i++;
      else if (c === '"') inString = false;
    } else if (c === '"') inString = true;
    else if (c === '{') depth++;
    else if (c === '}' && --depth === 0) return source.slice(start, i + 1);
  }
  throw new Error('unterminated dependency map');
}

/** The boot script for these chunks, minified, as an IIFE. */
export function bootScript(routeChunks: RouteChunks): string {
  const out = buildSync({
    entryPoints: [path.join(__dirname, 'bootEntry.ts')],
    bundle: true,
    write: false,
    format: 'iife',
    minify: true,
    target: ['es2020'],
    define: { __ROUTE_CHUNKS__: JSON.stringify(routeChunks) },
    logLevel: 'silent',
    tsconfig: path.join(__dirname, '..', '..', 'tsconfig.json'),
  });
  return out.outputFiles[0]!.text.trim();
}

/** Each JetBrains Mono face the export carries: family (its name before the hash) → URL. */
export function fontFacesOf(distDir: string): { family: string; url: string }[] {
  const faces: { family: string; url: string }[] = [];
  const assets = path.join(distDir, 'assets');
  if (!fs.existsSync(assets)) return faces;
  for (const entry of fs.readdirSync(assets, { recursive: true, withFileTypes: true })) {
    const m = /^(JetBrainsMono_\w+)\.[0-9a-f]+\.ttf$/.exec(entry.name);
    if (!entry.isFile() || !m) continue;
    const rel = path.relative(distDir, path.join(entry.parentPath, entry.name));
    faces.push({ family: m[1]!, url: `/${rel.split(path.sep).join('/')}` });
  }
  return faces.sort((a, b) => a.family.localeCompare(b.family));
}

/** The head's new first children: the boot script, the fonts' preloads and their faces. */
export function headAdditions(boot: string, faces: { family: string; url: string }[]): string {
  const preloads = faces.map(
    (f) => `<link rel="preload" href="${f.url}" as="font" type="font/ttf" crossorigin>`,
  );
  const rules = faces.map(
    (f) =>
      `@font-face{font-family:${f.family};src:url(${JSON.stringify(f.url)});font-display:swap}`,
  );
  return [
    `<script>${boot}</script>`,
    ...preloads,
    `<style id="${EXPO_FONT_STYLE_ID}">${rules.join('')}</style>`,
  ].join('');
}

function precompress(file: string): void {
  const data = fs.readFileSync(file);
  fs.writeFileSync(`${file}.gz`, zlib.gzipSync(data, { level: 9 }));
  fs.writeFileSync(
    `${file}.br`,
    zlib.brotliCompressSync(data, {
      params: {
        [zlib.constants.BROTLI_PARAM_QUALITY]: zlib.constants.BROTLI_MAX_QUALITY,
        [zlib.constants.BROTLI_PARAM_SIZE_HINT]: data.length,
      },
    }),
  );
}

// Around what this step adds, so a second run replaces it (a changed boot script needs no export).
const BEGIN = '<!-- page boot -->';
const END = '<!-- /page boot -->';

/** The page with the head additions put in, or put in again. */
export function finishPage(html: string, head: string): string {
  const begin = html.indexOf(BEGIN);
  if (begin >= 0) {
    const end = html.indexOf(END, begin);
    if (end < 0) throw new Error('the page has a boot block without its end');
    html = html.slice(0, begin) + html.slice(end + END.length);
  }
  // Right after the charset (which must stay in the first 1,024 bytes), so the requests start
  // before the browser reads anything else.
  const charset = /<meta charset="utf-8" ?\/?>/i.exec(html);
  if (!charset) throw new Error('no <meta charset> in the page');
  const at = charset.index + charset[0].length;
  return html.slice(0, at) + BEGIN + head + END + html.slice(at);
}

export function finishExport(distDir: string): void {
  const indexPath = path.join(distDir, 'index.html');
  const html = fs.readFileSync(indexPath, 'utf8');
  const entrySrc = /<script src="(\/_expo\/static\/js\/web\/entry-[^"]+\.js)"/.exec(html)?.[1];
  if (!entrySrc) throw new Error(`no entry script in ${indexPath}`);
  const routeChunks = routeChunksOf(fs.readFileSync(path.join(distDir, entrySrc), 'utf8'));
  const head = headAdditions(bootScript(routeChunks), fontFacesOf(distDir));
  fs.writeFileSync(indexPath, finishPage(html, head));
  for (const entry of fs.readdirSync(distDir, { recursive: true, withFileTypes: true })) {
    if (entry.isFile() && /\.(js|ttf|html)$/.test(entry.name)) {
      precompress(path.join(entry.parentPath, entry.name));
    }
  }
}

if (require.main === module) {
  const dir = process.argv[2];
  if (!dir) throw new Error('usage: tsx scripts/webpage/finishExport.ts <export folder>');
  finishExport(dir);
}
