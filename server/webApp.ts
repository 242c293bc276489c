/**
 * Serves the exported web app (dist/): hashed scripts and assets cached for good, the page
 * revalidated every visit, and what scripts/webpage/finishExport.ts pre-compressed sent as it
 * is (brotli, else gzip) to a browser that accepts it. Also says which inline scripts the page
 * may run (the boot script), for the Content-Security-Policy. A shop's overview carries the
 * server's first screen (firstScreen.ts) for its signed-in members.
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import zlib from 'node:zlib';

import express, { type RequestHandler, type Router } from 'express';

import { notFound } from './errors';
import {
  firstScreen,
  overviewShopId,
  type FirstScreenDeps,
  type RenderedFirstScreen,
} from './firstScreen';
import {
  FIRST_SCREEN_ANSWERS_ID,
  FIRST_SCREEN_ID,
  type FirstScreenAnswers,
} from '@/ingest/wire/firstScreen';

export interface WebApp {
  /** CSP script-src entries ('sha256-…') for the page's inline scripts. */
  inlineScriptSources: string[];
  router: Router;
}

/** The CSP hash of each inline <script> of a page (CSP Level 3, "hash-source"). */
export function inlineScriptSources(html: string): string[] {
  const sources: string[] = [];
  for (const m of html.matchAll(/<script(\s[^>]*)?>([\s\S]*?)<\/script>/gi)) {
    if (/\ssrc\s*=/i.test(m[1] ?? '')) continue;
    const hash = crypto.createHash('sha256').update(m[2]!, 'utf8').digest('base64');
    sources.push(`'sha256-${hash}'`);
  }
  return sources;
}

/** Only what finishExport compresses; their types, since the name sent ends in .br or .gz. */
const COMPRESSED_TYPES: Record<string, string> = {
  '.js': 'application/javascript; charset=utf-8',
  '.ttf': 'font/ttf',
  '.html': 'text/html; charset=utf-8',
};

/** URL path ("/_expo/…/entry-1f.js") → the encodings stored beside it ("br", "gzip"). */
function compressedFilesOf(webDir: string): Map<string, string[]> {
  const files = new Map<string, string[]>();
  for (const entry of fs.readdirSync(webDir, { recursive: true, withFileTypes: true })) {
    if (!entry.isFile() || !(path.extname(entry.name) in COMPRESSED_TYPES)) continue;
    const full = path.join(entry.parentPath, entry.name);
    const url = `/${path.relative(webDir, full).split(path.sep).join('/')}`;
    const encodings = (['br', 'gzip'] as const).filter((e) =>
      fs.existsSync(`${full}.${e === 'br' ? 'br' : 'gz'}`),
    );
    if (encodings.length > 0) files.set(url, encodings);
  }
  return files;
}

/**
 * Sends `url`'s stored compressed copy when the browser takes one; otherwise leaves the request
 * to the plain file. The set of files is read once: an export is never changed in place.
 */
function sendCompressed(
  webDir: string,
  compressed: Map<string, string[]>,
  headers: Record<string, string>,
  cache: { maxAge?: string; immutable?: boolean },
  url: (req: express.Request) => string,
): RequestHandler {
  return (req, res, next) => {
    const file = url(req);
    const stored = compressed.get(file);
    // Either answer depends on Accept-Encoding: a shared cache must keep them apart.
    if (compressed.size > 0) res.vary('Accept-Encoding');
    if (!stored || (req.method !== 'GET' && req.method !== 'HEAD')) return next();
    // Ours, not the browser's order among those it accepts: brotli is the smaller (browsers list
    // "gzip, deflate, br, zstd" with equal weights).
    const encoding = stored.find((e) => req.acceptsEncodings(e) === e);
    if (!encoding) return next();
    res.setHeader('Content-Type', COMPRESSED_TYPES[path.extname(file)]!);
    res.setHeader('Content-Encoding', encoding);
    const relative = `.${file}.${encoding === 'br' ? 'br' : 'gz'}`;
    res.sendFile(relative, { root: webDir, dotfiles: 'allow', headers, ...cache }, (err) => {
      if (err && !res.headersSent) next(err);
    });
  };
}

/**
 * JSON for a script element: no "<" (so neither "</script>" nor "<!--" in a zone's name can end
 * or change the element), no ">" or "&", and the two line separators escaped too. JSON.parse
 * reads the escapes back as the characters they stand for.
 */
export function jsonForScriptElement(value: unknown): string {
  return JSON.stringify(value).replace(
    /[<>&\u2028\u2029]/g,
    (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`,
  );
}

/** Where the head's first elements end: after the charset, which must stay in the first 1,024 bytes. */
const CHARSET = /<meta charset="utf-8" ?\/?>/i;

/**
 * The page with the first screen in it: the API answers it was rendered from as JSON at the top
 * of the head, before the boot script that hands them to the app (a script element of type
 * application/json is never run, so the CSP has nothing to allow); its style elements close the
 * head, its markup comes before the app's root, above which it stays (fixed, covering the page)
 * until the boot script hands over to the app. The page's inline scripts, and so the CSP's
 * hashes, stay those of index.html.
 */
export function pageWithFirstScreen(page: string, rendered: RenderedFirstScreen): string {
  const { markup, answers } = rendered;
  const cover =
    `<div id="${FIRST_SCREEN_ID}" style="position:fixed;inset:0;z-index:1;overflow-y:auto;` +
    `display:flex;flex-direction:column">${markup.html}</div>`;
  const data =
    `<script type="application/json" id="${FIRST_SCREEN_ANSWERS_ID}">` +
    `${jsonForScriptElement(answers satisfies FirstScreenAnswers)}</script>`;
  const withData = CHARSET.test(page)
    ? page.replace(CHARSET, (charset) => `${charset}${data}`)
    : page.replace('<head>', (head) => `${head}${data}`);
  return withData
    .replace('</head>', () => `${markup.css}</head>`)
    .replace('<div id="root">', (root) => `${cover}${root}`);
}

const brotli = promisify(zlib.brotliCompress);
const gzip = promisify(zlib.gzip);

/**
 * A rendered page, compressed for a browser that takes it (brotli first, as for the stored
 * files). Made per request, so on the thread pool, not the request thread, and at a fast
 * brotli quality: measured on a demo overview (~125 KB of HTML), quality 5 sends ~14 KB
 * where 11 would save under a tenth more at many times the CPU (FINDINGS.md, "The overview
 * rendered by the server").
 */
async function compressedPage(
  html: string,
  req: express.Request,
): Promise<{ body: Buffer; encoding?: 'br' | 'gzip' }> {
  const plain = Buffer.from(html, 'utf8');
  try {
    if (req.acceptsEncodings('br') === 'br') {
      const params = {
        [zlib.constants.BROTLI_PARAM_QUALITY]: 5,
        [zlib.constants.BROTLI_PARAM_MODE]: zlib.constants.BROTLI_MODE_TEXT,
        [zlib.constants.BROTLI_PARAM_SIZE_HINT]: plain.length,
      };
      return { body: await brotli(plain, { params }), encoding: 'br' };
    }
    if (req.acceptsEncodings('gzip') === 'gzip') {
      return { body: await gzip(plain), encoding: 'gzip' };
    }
  } catch {
    // Never lose the page over its compression: the plain bytes always do.
  }
  return { body: plain };
}

export function webApp(webDir: string, deps?: FirstScreenDeps): WebApp | null {
  const indexHtml = path.join(webDir, 'index.html');
  if (!fs.existsSync(indexHtml)) return null;
  const page = fs.readFileSync(indexHtml, 'utf8');
  const compressed = compressedFilesOf(webDir);
  const router = express.Router();
  // Scripts and assets under /_expo and /assets carry a content hash in their name: a new
  // build gets new names, so a browser may keep them for good. index.html names the current
  // ones, so it is never kept without asking.
  const hashed = { maxAge: '365d', immutable: true } as const;
  for (const prefix of ['/_expo', '/assets']) {
    router.use(
      prefix,
      sendCompressed(webDir, compressed, {}, hashed, (req) => `${prefix}${req.path}`),
      express.static(path.join(webDir, prefix), { index: false, fallthrough: true, ...hashed }),
    );
  }
  // A missing script (an old chunk after a deploy) must fail as a script: answered with the
  // page, the browser would run HTML as JavaScript.
  router.use(['/_expo', '/assets'], notFound);
  // The server's own renderer is part of the export but no file to serve.
  router.use('/_ssr', notFound);
  router.use(express.static(webDir, { index: false, maxAge: '1h' }));
  // Client-side routes (/shops/…) all load the single-page app. The export may sit under a
  // dot folder (a build kept aside to compare), which send refuses unless told.
  const screen = deps ? firstScreen(webDir, deps) : null;
  if (screen && deps) {
    // Not a route with a :shopId parameter: Express would answer a malformed %-escape in it with
    // an error; overviewShopId reads the address itself.
    router.use(async (req, res, next) => {
      if ((req.method !== 'GET' && req.method !== 'HEAD') || !overviewShopId(req.path)) {
        return next();
      }
      // The same address answers each person differently: no cache may hand one to another.
      res.vary('Cookie');
      let rendered: RenderedFirstScreen | null = null;
      try {
        rendered = await screen(req);
      } catch (err) {
        // The plain page still works: the app asks for the same data itself.
        deps.logger.error({ err, path: req.path }, 'first screen failed; the plain page is sent');
      }
      if (!rendered) return next();
      res.setHeader('Cache-Control', 'private, no-store');
      res.vary('Accept-Encoding');
      const { body, encoding } = await compressedPage(pageWithFirstScreen(page, rendered), req);
      if (encoding) res.setHeader('Content-Encoding', encoding);
      res.type('html').send(body);
    });
  }
  const plain = { 'cache-control': 'no-cache' };
  // Middleware rather than a '/{*splat}' route: the route decodes its parameter and answers a
  // malformed %-escape (/shops/%E0%A4%A) with a 500; the page needs no parameter.
  const pageOnly: RequestHandler = (req, _res, next) =>
    next(req.method === 'GET' || req.method === 'HEAD' ? undefined : 'router');
  router.use(
    pageOnly,
    sendCompressed(webDir, compressed, plain, {}, () => '/index.html'),
    (_req, res) => res.sendFile(indexHtml, { dotfiles: 'allow', headers: plain }),
  );
  return { inlineScriptSources: inlineScriptSources(page), router };
}
