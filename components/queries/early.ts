/**
 * Answers the web page asked for before the app's scripts ran. The page's first (inline) script,
 * scripts/webpage/boot.ts, starts GET /me and, on a shop's pages, the shop's open alarms and
 * zones while the browser is still fetching and compiling ~1.7 MB of JavaScript; without it those
 * requests would wait for the app, then for the layouts, then for /me. The app takes each answer
 * once, for the first GET of its path (apiRequest), and only while it is fresh.
 */

/** The window property the boot script fills in. */
export const EARLY_GLOBAL = '__drybenchEarly';

/**
 * An answer is for the first screen: past this, since the page started, it is old news and the
 * app asks again. Our own choice: far longer than the app takes to start, far shorter than any
 * query's staleTime.
 */
export const EARLY_FRESH_MS = 10_000;

export interface EarlyAnswers {
  /** performance.now() when the requests started (the page's clock). */
  startedMs: number;
  /** Pending answers by API path (with its query string), as apiRequest names them. */
  answers: Record<string, Promise<Response>>;
}

type EarlyHost = { [EARLY_GLOBAL]?: EarlyAnswers };

/**
 * The early answer for this path, removed so it is used once; none when the page started no
 * request for it or when it is no longer fresh.
 */
export function takeEarlyAnswer(
  path: string,
  host: EarlyHost = globalThis as EarlyHost,
  nowMs: number = globalThis.performance?.now() ?? Number.POSITIVE_INFINITY,
): Promise<Response> | undefined {
  const early = host[EARLY_GLOBAL];
  if (!early || !Object.hasOwn(early.answers, path)) return undefined;
  const answer = early.answers[path];
  delete early.answers[path];
  return nowMs - early.startedMs <= EARLY_FRESH_MS ? answer : undefined;
}

/**
 * The early answer if it came back 2xx. Anything else (a 401 before a sign-in that has happened
 * since, a network error) is not trusted: the caller asks again.
 */
export async function earlyOk(answer: Promise<Response> | undefined): Promise<Response | null> {
  if (!answer) return null;
  const response = await answer.catch(() => null);
  return response?.ok ? response : null;
}

/**
 * Forgets every answer not yet taken. A live message means the shop changed after the page's
 * requests were read; a query that starts later must ask again, or it would show the state
 * from before the change with nothing left to patch it.
 */
export function dropEarlyAnswers(host: EarlyHost = globalThis as EarlyHost): void {
  const early = host[EARLY_GLOBAL];
  if (early) early.answers = {};
}
