/**
 * What the exported web app weighs: each JavaScript file raw and gzipped (-9), and, from its
 * source map, which package its bytes come from. No analysis package is needed: a source map
 * (version 3, as Metro writes it) says for every run of generated characters which source it
 * came from, so summing the runs per source and the sources per package gives the split.
 */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';

export interface JsFile {
  /** Path under the export folder, with forward slashes (`_expo/static/js/web/…`). */
  file: string;
  bytes: number;
  gzBytes: number;
}

/** Gzip at level 9, as a server that pre-compresses would send it. */
export function gzipSize(data: Buffer | string): number {
  return zlib.gzipSync(data, { level: 9 }).length;
}

/** Every .js file of an export, largest first. */
export function jsFilesOf(distDir: string): JsFile[] {
  const dir = path.join(distDir, '_expo', 'static', 'js');
  if (!fs.existsSync(dir)) return [];
  const files: JsFile[] = [];
  for (const entry of fs.readdirSync(dir, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile() || !entry.name.endsWith('.js')) continue;
    const full = path.join(entry.parentPath, entry.name);
    const data = fs.readFileSync(full);
    files.push({
      file: path.relative(distDir, full).split(path.sep).join('/'),
      bytes: data.length,
      gzBytes: gzipSize(data),
    });
  }
  return files.sort((a, b) => b.bytes - a.bytes);
}

const BASE64 = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
const BASE64_VALUE = new Map([...BASE64].map((c, i) => [c, i]));

/**
 * Decodes one segment of a source map's `mappings` (Base64 VLQ, source map revision 3: five
 * value bits per digit, bit 6 continues, the lowest bit of the whole value is the sign).
 */
export function decodeVlq(segment: string): number[] {
  const values: number[] = [];
  let value = 0;
  let shift = 0;
  for (const char of segment) {
    const digit = BASE64_VALUE.get(char);
    if (digit === undefined) throw new Error(`not a Base64 digit: ${char}`);
    value += (digit & 31) * 2 ** shift;
    if (digit & 32) {
      shift += 5;
      continue;
    }
    values.push(value % 2 === 1 ? -(value - 1) / 2 : value / 2);
    value = 0;
    shift = 0;
  }
  if (shift !== 0) throw new Error(`unterminated segment: ${segment}`);
  return values;
}

interface RawSourceMap {
  sources: string[];
  mappings: string;
}

/**
 * Generated characters per source: each mapped segment runs to the next segment of its line
 * (or the line's end). Metro writes one module per line (`__d(function(…){…},id,[deps])`), and
 * its wrapper and dependency list carry no mapping: they count for the line's first source. A
 * line with no mapping at all (a kept licence comment inside a module) counts for the source
 * before it; the prelude before any source counts under `(unmapped)`.
 */
export function bytesPerSource(generated: string, map: RawSourceMap): Map<string, number> {
  const sizes = new Map<string, number>();
  const add = (source: string, n: number) => {
    if (n > 0) sizes.set(source, (sizes.get(source) ?? 0) + n);
  };
  const lines = generated.split('\n');
  const mappingLines = map.mappings.split(';');
  let sourceIndex = 0;
  let previous = '(unmapped)';
  lines.forEach((line, lineNo) => {
    const segments = (mappingLines[lineNo] ?? '').split(',').filter(Boolean);
    let column = 0;
    const starts: { column: number; source: string | null }[] = [];
    for (const segment of segments) {
      const fields = decodeVlq(segment);
      column += fields[0]!;
      let source: string | null = null;
      if (fields.length >= 4) {
        sourceIndex += fields[1]!;
        source = map.sources[sourceIndex] ?? null;
      }
      starts.push({ column, source });
    }
    const owner = starts.find((s) => s.source !== null)?.source ?? previous;
    previous = starts.findLast((s) => s.source !== null)?.source ?? owner;
    // The newline itself belongs to the line.
    add(owner, (starts[0]?.column ?? line.length) + (lineNo < lines.length - 1 ? 1 : 0));
    starts.forEach((s, i) =>
      add(s.source ?? owner, (starts[i + 1]?.column ?? line.length) - s.column),
    );
  });
  return sizes;
}

/** `node_modules/@scope/name/…` → `@scope/name`; our own files → their top folder (`components/`). */
export function packageOf(source: string): string {
  const at = source.lastIndexOf('node_modules/');
  if (at >= 0) {
    const parts = source.slice(at + 'node_modules/'.length).split('/');
    return parts[0]!.startsWith('@') ? `${parts[0]}/${parts[1]}` : parts[0]!;
  }
  const own = source.replace(/^\/+/, '').split('/');
  return own.length > 1 ? `${own[0]}/` : '(runtime)';
}

/** Bytes per package of one file with its map beside it (`x.js.map`); null without a map. */
export function bytesPerPackage(jsPath: string): Map<string, number> | null {
  const mapPath = `${jsPath}.map`;
  if (!fs.existsSync(mapPath)) return null;
  const map = JSON.parse(fs.readFileSync(mapPath, 'utf8')) as RawSourceMap;
  const perPackage = new Map<string, number>();
  for (const [source, n] of bytesPerSource(fs.readFileSync(jsPath, 'utf8'), map)) {
    const name = source === '(unmapped)' ? source : packageOf(source);
    perPackage.set(name, (perPackage.get(name) ?? 0) + n);
  }
  return perPackage;
}
