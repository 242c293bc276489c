// The page's boot script (scripts/webpage/boot.ts) and the export's finishing step
// (finishExport.ts). The references: the API paths are the ones the app's own query functions
// request (so an early answer is the one the app takes), the route files are the app/ folder as
// it stands, matched by expo-router's documented rules (a layout wraps every route in its folder
// and below; an index file answers its folder's address; a static segment beats a [param]; an
// address nothing matches renders +not-found), and the dependency-map text is Metro's format as
// expo 56.0.23 exports it (copied from dist/, shortened).
import fs from 'node:fs';
import path from 'node:path';

import { afterEach, describe, expect, it, vi } from 'vitest';

import { alarmsQueryOptions } from '@/components/queries/alarms';
import { EARLY_GLOBAL, type EarlyAnswers } from '@/components/queries/early';
import { meQueryOptions } from '@/components/queries/me';
import { sensorsQueryOptions } from '@/components/queries/sensors';
import { zonesQueryOptions } from '@/components/queries/zones';
import { FIRST_SCREEN_ANSWERS_ID, firstScreenAnswerPaths } from '@/ingest/wire/firstScreen';
import { boot, earlyApiPaths, routeFilesFor } from '@/scripts/webpage/boot';
import {
  bootScript,
  finishPage,
  headAdditions,
  routeChunksOf,
} from '@/scripts/webpage/finishExport';

/** The path a query function fetches, caught at fetch. */
async function pathFetchedBy(queryFn: unknown): Promise<string> {
  const fetched: string[] = [];
  vi.stubGlobal('fetch', async (url: string) => {
    fetched.push(url);
    return new Response('{}', { status: 200 });
  });
  await (queryFn as (ctx: { signal: AbortSignal }) => Promise<unknown>)({
    signal: new AbortController().signal,
  });
  vi.unstubAllGlobals();
  return fetched[0]!;
}

afterEach(() => vi.unstubAllGlobals());

describe('earlyApiPaths', () => {
  const SHOP = '6f1c2a9e-0d4b-4c3e-9a51-7b2f8e0c1d23';
  const shopAddress = `/shops/${SHOP}`;

  it('asks for /me on any page, as LiveProvider does on every page', async () => {
    const me = await pathFetchedBy(meQueryOptions().queryFn);
    for (const address of ['/', '/sign-in', '/verify', '/shops/x/report']) {
      expect(earlyApiPaths(address)).toContain(me);
    }
    expect(earlyApiPaths('/sign-in')).toEqual([me]);
  });

  it('asks the overview for exactly the paths the app requests: /me, open alarms, zones, sensors', async () => {
    const expected = [
      await pathFetchedBy(meQueryOptions().queryFn),
      await pathFetchedBy(alarmsQueryOptions(SHOP, 'open').queryFn),
      await pathFetchedBy(zonesQueryOptions(SHOP).queryFn),
      // The setup checklist above the zones (SetupChecklist) lists the sensors.
      await pathFetchedBy(sensorsQueryOptions(SHOP).queryFn),
    ];
    expect(earlyApiPaths(shopAddress)).toEqual(expected);
    expect(earlyApiPaths(`${shopAddress}/`)).toEqual(expected);
    // A zone's page lists the zones too (ZonesScreen with a zone selected).
    expect(earlyApiPaths(`${shopAddress}/zones/z-1`)).toEqual(expected);
  });

  it('leaves the zones out on shop pages that do not list them', () => {
    for (const page of ['alarms', 'report', 'sensors', 'care', 'care/s-1', 'trials/t-1']) {
      const paths = earlyApiPaths(`${shopAddress}/${page}`);
      expect(paths).toHaveLength(2);
      expect(paths.some((p) => p.endsWith('/zones'))).toBe(false);
    }
  });

  it('encodes an id as the app does from the decoded route parameter', async () => {
    // expo-router hands screens decoded parameters; the app's paths encode them again.
    const id = 'a b/é';
    const zones = await pathFetchedBy(zonesQueryOptions(id).queryFn);
    expect(earlyApiPaths(`/shops/${encodeURIComponent(id)}`)).toContain(zones);
    // A malformed escape is no shop id the app could have: only /me is asked.
    expect(earlyApiPaths('/shops/%E0%A4%A')).toEqual(['/api/v1/me']);
  });
});

/** The route files as Metro's route context names them: "./shops/[shopId]/index.tsx". */
function appRouteFiles(): string[] {
  const root = path.join(__dirname, '..', '..', 'app');
  return fs
    .readdirSync(root, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile() && e.name.endsWith('.tsx'))
    .map(
      (e) => `./${path.relative(root, path.join(e.parentPath, e.name)).split(path.sep).join('/')}`,
    )
    .sort();
}

describe('routeFilesFor (the app/ folder as it stands)', () => {
  const files = appRouteFiles();
  const shop = ['./_layout.tsx', './shops/[shopId]/_layout.tsx'];

  it.each([
    ['/', ['./_layout.tsx', './index.tsx']],
    ['/sign-in', ['./_layout.tsx', './sign-in.tsx']],
    ['/invite/abc', ['./_layout.tsx', './invite/[token].tsx']],
    ['/shops/s1', [...shop, './shops/[shopId]/index.tsx']],
    ['/shops/s1/', [...shop, './shops/[shopId]/index.tsx']],
    ['/shops/s1/alarms', [...shop, './shops/[shopId]/alarms.tsx']],
    ['/shops/s1/care', [...shop, './shops/[shopId]/care/index.tsx']],
    ['/shops/s1/care/x', [...shop, './shops/[shopId]/care/[surfaceId].tsx']],
    ['/shops/s1/zones/z', [...shop, './shops/[shopId]/zones/[zoneId].tsx']],
    ['/no/such/page', ['./_layout.tsx', './+not-found.tsx']],
    ['/shops', ['./_layout.tsx', './+not-found.tsx']],
  ])('%s loads %j', (address, expected) => {
    expect(routeFilesFor(address, files)).toEqual(expected);
  });

  it('prefers a static segment to a parameter, as expo-router ranks them', () => {
    const withStatic = [...files, './shops/new.tsx'];
    expect(routeFilesFor('/shops/new', withStatic).at(-1)).toBe('./shops/new.tsx');
    expect(routeFilesFor('/shops/other', withStatic).at(-1)).toBe('./shops/[shopId]/index.tsx');
  });
});

// Metro's route context and its dependency map, as expo 56.0.23 exports them (dist/'s entry
// chunk, three of the 24 routes kept, including the getter the minifier writes long-hand).
const ENTRY_SAMPLE =
  '__d(function(g,r,i,a,m,e,d){const s=Object.defineProperties({},{' +
  '"./+not-found.tsx":{enumerable:!0,get(){var s;return s=r(d[1])(d[0],d.paths),r(d[1]),s}},' +
  '"./_layout.tsx":{enumerable:!0,get:()=>r(d[1])(d[2],d.paths)},' +
  '"./shops/[shopId]/index.tsx":{enumerable:!0,get:()=>r(d[1])(d[3],d.paths)}});' +
  'function t(t){return s[t]}t.keys=function(){return Object.keys(s)},m.exports=t},8,' +
  '{"0":723,"1":9,"2":724,"3":734,"paths":{' +
  '"723":"/_expo/static/js/web/+not-found-fa18.js",' +
  '"724":"/_expo/static/js/web/_layout-7948.js",' +
  '"734":"/_expo/static/js/web/index-287c.js"}});\n' +
  '__d(function(g,r,i,a,m,e,d){m.exports={}},9,[]);';

describe('routeChunksOf', () => {
  it("reads each route's chunk from the entry chunk", () => {
    expect(routeChunksOf(ENTRY_SAMPLE)).toEqual({
      './+not-found.tsx': '/_expo/static/js/web/+not-found-fa18.js',
      './_layout.tsx': '/_expo/static/js/web/_layout-7948.js',
      './shops/[shopId]/index.tsx': '/_expo/static/js/web/index-287c.js',
    });
  });

  it('fails the build when the entry has no route context', () => {
    expect(() => routeChunksOf('__d(function(){},1,[]);')).toThrow(/no route context/);
  });
});

describe('boot (the page before the app)', () => {
  const chunks = routeChunksOf(ENTRY_SAMPLE);

  /** `embedded`: the text of the server's answers element, when the page has one. */
  function fakeWindow(pathname: string, nowMs: number, embedded?: string) {
    const requested: { path: string; init: RequestInit }[] = [];
    const head: { rel: string; as: string; href: string }[] = [];
    const win = {
      location: { pathname },
      performance: { now: () => nowMs },
      fetch: (p: string, init: RequestInit) => {
        requested.push({ path: p, init });
        return Promise.resolve(new Response('{}'));
      },
      Response,
      document: {
        getElementById: (id: string) =>
          id === FIRST_SCREEN_ANSWERS_ID && embedded !== undefined
            ? { textContent: embedded }
            : null,
        createElement: () => ({ rel: '', as: '', href: '' }),
        head: { appendChild: (link: { rel: string; as: string; href: string }) => head.push(link) },
      },
      // The first screen's handover watches the page (tested in tests/e2e/firstScreen.test.ts).
      MutationObserver: class {
        observe() {}
        disconnect() {}
      },
    };
    return { win, requested, head };
  }

  it("starts the first screen's requests as apiRequest would make them, and leaves them for the app", () => {
    const { win, requested } = fakeWindow('/shops/s1', 42);
    boot(win as never, chunks);
    expect(requested.map((r) => r.path)).toEqual(earlyApiPaths('/shops/s1'));
    for (const { init } of requested) {
      expect(init).toEqual({ credentials: 'same-origin', headers: { Accept: 'application/json' } });
    }
    const early = (win as unknown as Record<string, EarlyAnswers>)[EARLY_GLOBAL]!;
    expect(early.startedMs).toBe(42);
    expect(Object.keys(early.answers)).toEqual(earlyApiPaths('/shops/s1'));
  });

  it('takes the answers the server rendered the page from instead of asking again', async () => {
    const paths = firstScreenAnswerPaths('s1');
    const zones = { zones: [{ id: 'z1', name: '</script> bench' }] };
    const embedded = JSON.stringify({ [paths.me]: { user: { id: 'u1' } }, [paths.zones]: zones });
    const { win, requested } = fakeWindow('/shops/s1', 7, embedded);
    boot(win as never, chunks);
    // Only the paths the page did not hold are asked for.
    expect(requested.map((r) => r.path)).toEqual([paths.alarms, paths.sensors]);
    const early = (win as unknown as Record<string, EarlyAnswers>)[EARLY_GLOBAL]!;
    expect(Object.keys(early.answers)).toEqual(earlyApiPaths('/shops/s1'));
    const answer = await early.answers[paths.zones]!;
    expect(answer.status).toBe(200);
    expect(answer.headers.get('content-type')).toBe('application/json');
    expect(await answer.json()).toEqual(zones);
  });

  it('asks for everything when the embedded answers do not read as JSON', () => {
    const { win, requested } = fakeWindow('/shops/s1', 7, '{"/api/v1/me": ');
    boot(win as never, chunks);
    expect(requested.map((r) => r.path)).toEqual(earlyApiPaths('/shops/s1'));
  });

  it("preloads the address's layouts and screen as scripts, and nothing else", () => {
    const { win, head } = fakeWindow('/shops/s1', 0);
    boot(win as never, chunks);
    expect(head).toEqual([
      { rel: 'preload', as: 'script', href: '/_expo/static/js/web/_layout-7948.js' },
      { rel: 'preload', as: 'script', href: '/_expo/static/js/web/index-287c.js' },
    ]);
  });
});

describe('the finished page', () => {
  const faces = [
    { family: 'JetBrainsMono_400Regular', url: '/assets/f/JetBrainsMono_400Regular.ab.ttf' },
  ];
  const template =
    '<!doctype html><html><head><meta charset="utf-8" /><title>Drybench</title></head><body></body></html>';

  it('puts the additions right after the charset, and a second run replaces them', () => {
    const once = finishPage(template, headAdditions('boot()', faces));
    expect(once.indexOf('<script>boot()</script>')).toBe(
      once.indexOf('/>') + 2 + '<!-- page boot -->'.length,
    );
    // HTML Standard 4.2.5.4: the charset declaration must sit within the first 1,024 bytes.
    expect(once.indexOf('<meta charset')).toBeLessThan(1024);
    const twice = finishPage(once, headAdditions('boot2()', faces));
    expect(twice).toContain('<script>boot2()</script>');
    expect(twice).not.toContain('boot()');
    expect(twice.match(/<style id="expo-generated-fonts">/g)).toHaveLength(1);
  });

  it('declares each face with swap and preloads it in CORS mode, as fonts are fetched', () => {
    const head = headAdditions('', faces);
    // CSS Fonts 4 §4.9: swap shows the fallback at once and swaps the face in when it arrives.
    expect(head).toContain(
      '@font-face{font-family:JetBrainsMono_400Regular;src:url("/assets/f/JetBrainsMono_400Regular.ab.ttf");font-display:swap}',
    );
    // Fonts are always fetched in CORS mode (CSS Fonts 4 §4.8.2); a preload without crossorigin
    // would not match and the face would be fetched twice.
    expect(head).toContain(
      '<link rel="preload" href="/assets/f/JetBrainsMono_400Regular.ab.ttf" as="font" type="font/ttf" crossorigin>',
    );
  });

  it('bundles the boot script into one self-contained expression with the chunks inlined', () => {
    const script = bootScript({ './_layout.tsx': '/_expo/static/js/web/_layout-7948.js' });
    expect(script).toContain('"./_layout.tsx":"/_expo/static/js/web/_layout-7948.js"');
    expect(script).not.toMatch(/\brequire\(|\bimport\b|__ROUTE_CHUNKS__/);
    // Small enough to sit in every page: a few kilobytes at most.
    expect(script.length).toBeLessThan(4096);
  });
});
