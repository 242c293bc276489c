/**
 * The web page's first script, inlined into dist/index.html's head by finishExport.ts. Before
 * the browser has fetched and run the app (~1.7 MB of JavaScript), it
 * - asks the API what the first screen will ask: /me on every page, and on a shop's pages the
 *   open alarms (the banner, the tab count) and, for the overview and a zone, the zones —
 *   components/queries/early.ts hands those answers to the app's first GET of each path; a page
 *   the server rendered (server/firstScreen.ts) holds those answers already, and they are taken
 *   from it instead of asked for again;
 * - preloads the route chunks the page's address will need (its layouts and its screen), which
 *   expo-router would otherwise fetch one step at a time, each after the one before has run;
 * - takes away the overview the server rendered into the page once the app shows its own
 *   (firstScreenHandover.ts).
 * It must stay small and dependency-free: it runs on every page load, before anything else.
 */
import { EARLY_GLOBAL, type EarlyAnswers } from '@/components/queries/early';
import {
  API_PREFIX,
  FIRST_SCREEN_ANSWERS_ID,
  type FirstScreenAnswers,
} from '@/ingest/wire/firstScreen';

import { watchFirstScreen, type HandoverWindow } from './firstScreenHandover';

/** Route file (as Metro's route context names it, "./shops/[shopId]/index.tsx") → chunk URL. */
export type RouteChunks = Record<string, string>;

const API = API_PREFIX;

/** The GETs the first screen at this address makes, with the paths apiRequest gives them. */
export function earlyApiPaths(pathname: string): string[] {
  const paths = [`${API}/me`];
  const shop = /^\/shops\/([^/]+)(\/.*)?$/.exec(pathname);
  if (!shop) return paths;
  // The address holds the id as the app reads it (decoded); the app's paths encode it again.
  let shopId: string;
  try {
    shopId = decodeURIComponent(shop[1]!);
  } catch {
    return paths;
  }
  const shopPath = `${API}/shops/${encodeURIComponent(shopId)}`;
  paths.push(`${shopPath}/alarms?state=open`);
  const rest = shop[2] ?? '';
  // The overview and a zone's page list the zones, and the sensors for the setup checklist
  // above them (ZonesScreen); other shop pages do not.
  if (rest === '' || rest === '/' || /^\/zones\/[^/]+\/?$/.test(rest))
    paths.push(`${shopPath}/zones`, `${shopPath}/sensors`);
  return paths;
}

/** A route file's address pattern: "./shops/[shopId]/index.tsx" → ["shops", "[shopId]"]. */
function patternOf(file: string): string[] {
  const segments = file
    .replace(/^\.\//, '')
    .replace(/\.[jt]sx?$/, '')
    .split('/');
  if (segments.at(-1) === 'index') segments.pop();
  return segments;
}

function matches(pattern: string[], segments: string[]): boolean {
  if (pattern.length !== segments.length) return false;
  return pattern.every((p, i) => p === segments[i] || /^\[[^.][^\]]*\]$/.test(p));
}

/** Static segments count more: /shops/new beats /shops/[shopId], as in expo-router. */
function staticCount(pattern: string[]): number {
  return pattern.filter((p) => !p.startsWith('[')).length;
}

/**
 * The route files expo-router loads for this address: each _layout.tsx from the root down to the
 * screen's folder, then the screen (or +not-found.tsx when no screen matches).
 */
export function routeFilesFor(pathname: string, files: string[]): string[] {
  const segments = pathname.split('/').filter((s) => s !== '');
  const screens = files.filter((f) => !/(^|\/)[_+][^/]*$/.test(f));
  const screen =
    screens
      .filter((f) => matches(patternOf(f), segments))
      .sort((a, b) => staticCount(patternOf(b)) - staticCount(patternOf(a)))[0] ??
    files.find((f) => f === './+not-found.tsx');
  if (!screen) return [];
  const folders = screen.split('/').slice(0, -1);
  const layouts = folders
    .map((_, i) => `${folders.slice(0, i + 1).join('/')}/_layout.tsx`)
    .filter((f) => files.includes(f));
  return [...layouts, screen];
}

interface BootWindow extends HandoverWindow {
  performance: { now(): number };
  fetch: typeof fetch;
  Response: typeof Response;
  document: HandoverWindow['document'] & Pick<Document, 'createElement' | 'head'>;
}

/**
 * The API answers the server rendered this page from (the JSON element above this script), or
 * none: a plain page, or JSON that does not read (then the app asks, as on any page).
 */
export function embeddedAnswers(doc: Pick<Document, 'getElementById'>): FirstScreenAnswers {
  const text = doc.getElementById(FIRST_SCREEN_ANSWERS_ID)?.textContent;
  if (!text) return {};
  try {
    const answers: unknown = JSON.parse(text);
    return answers !== null && typeof answers === 'object' ? (answers as FirstScreenAnswers) : {};
  } catch {
    return {};
  }
}

export function boot(win: BootWindow, routeChunks: RouteChunks): void {
  const { pathname } = win.location;
  const answers: EarlyAnswers['answers'] = {};
  const startedMs = win.performance.now();
  const embedded = embeddedAnswers(win.document);
  for (const path of earlyApiPaths(pathname)) {
    if (Object.hasOwn(embedded, path)) {
      // What the route answered the server a moment ago, for this person: a 200 with that body.
      answers[path] = Promise.resolve(
        new win.Response(JSON.stringify(embedded[path]), {
          status: 200,
          headers: { 'Content-Type': 'application/json' },
        }),
      );
      continue;
    }
    // The same request apiRequest makes; an unused or failed answer costs nothing but itself.
    answers[path] = win.fetch(path, {
      credentials: 'same-origin',
      headers: { Accept: 'application/json' },
    });
    // Nobody may take a failed one; keep it from being reported as unhandled.
    answers[path].catch(() => undefined);
  }
  (win as unknown as Record<string, EarlyAnswers>)[EARLY_GLOBAL] = { startedMs, answers };

  for (const file of routeFilesFor(pathname, Object.keys(routeChunks))) {
    const link = win.document.createElement('link');
    link.rel = 'preload';
    link.as = 'script';
    link.href = routeChunks[file]!;
    win.document.head.appendChild(link);
  }
  watchFirstScreen(win);
}
