/**
 * The overview's first screen rendered into the page (issue 13): for a signed-in member at
 * /shops/:shopId, the shop's zone cards as HTML, from the app's own components, so the cards are
 * in the document when the page arrives instead of after ~1.7 MB of JavaScript has run. The
 * renderer is built with the web export (dist/_ssr/, scripts/webpage/firstScreenEntry.tsx) and
 * loaded from it: the server never imports the app's components. The data are exactly what the
 * app's own first requests answer (GET /me, GET …/zones), for this person and this shop only.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';

import type { Request } from 'express';

import type { Db } from '@/db';
import { listAlarms } from '@/db/queries/alarms';
import { listShopsOfUser } from '@/db/queries/memberships';
import { listSensors } from '@/db/queries/sensors';
import { findUserById } from '@/db/queries/users';
import { listZonesWithLatest } from '@/db/queries/zones';
import {
  firstScreenAnswerPaths,
  type FirstScreenAnswers,
  type FirstScreenInput,
  type FirstScreenMarkup,
  type FirstScreenRenderer,
} from '@/ingest/wire/firstScreen';

import { alarmOf } from './alarms/wire';
import { isUuid } from './auth/middleware';
import type { SessionSigner } from './auth/session';
import { resolveSession } from './auth/sessionState';
import type { Logger } from './logger';
import { toShopSummary, toUser } from './wire/people';
import { toSensor } from './wire/sensors';
import { toZone } from './wire/zones';

/** Where build-web.sh puts the renderer, inside the export it was built with. */
export const FIRST_SCREEN_RENDERER = path.join('_ssr', 'first-screen.cjs'); // firstScreenBuild.ts's RENDERER_PATH

/**
 * Renders at start-up before the first person's: scripts/webpage/firstScreenEntry.tsx measured
 * ~5–10 ms of CPU per render from about the 15th on, 60–130 ms for the first few.
 */
const WARM_UP_RENDERS = 15;

/** A rendered first screen and the API answers it was rendered from, by the app's GET paths. */
export interface RenderedFirstScreen {
  markup: FirstScreenMarkup;
  answers: FirstScreenAnswers;
}

/** The first screen for this request, or null when the plain page is the answer. */
export type FirstScreen = (req: Request) => Promise<RenderedFirstScreen | null>;

export interface FirstScreenDeps {
  db: Db;
  sessions: SessionSigner;
  logger: Logger;
  /** What the sensors route tells clients about the MQTT broker (server/app.ts's option). */
  mqttPublicUrl: string | null;
}

/** The shop id of an overview address (/shops/:shopId), or null for every other page. */
export function overviewShopId(pathname: string): string | null {
  const found = /^\/shops\/([^/]+)\/?$/.exec(pathname);
  if (!found) return null;
  try {
    const shopId = decodeURIComponent(found[1]!);
    return isUuid(shopId) ? shopId : null;
  } catch {
    return null;
  }
}

/**
 * What the first screen shows this person at this address: null unless the session is live and
 * its person a member of the shop, and the shop has zones (without any, the app's own notice is
 * the page). One query per answer, as the API's routes make them, mapped by the routes' own wire
 * functions.
 */
export async function firstScreenInput(
  deps: Pick<FirstScreenDeps, 'db' | 'sessions' | 'mqttPublicUrl'>,
  cookie: string | undefined,
  shopId: string,
): Promise<FirstScreenInput | null> {
  const { db, sessions } = deps;
  if (cookie === undefined) return null;
  const session = await resolveSession(db, sessions, cookie, shopId);
  if (session === null || session === 'expired' || session.role === null) return null;
  const userId = session.claims.userId;
  const [user, shops, zoneRows, alarmRows, sensorRows] = await Promise.all([
    findUserById(db, userId),
    listShopsOfUser(db, userId),
    listZonesWithLatest(db, shopId),
    listAlarms(db, shopId, 'open'),
    listSensors(db, shopId),
  ]);
  if (!user || zoneRows.length === 0) return null;
  const zones = zoneRows.map(toZone);
  return {
    me: { user: toUser(user), shops: shops.map(toShopSummary) },
    shopId,
    zones,
    alarms: alarmRows.map(alarmOf),
    sensors: {
      sensors: sensorRows.map(toSensor),
      mqtt: deps.mqttPublicUrl ? { url: deps.mqttPublicUrl } : null,
    },
  };
}

/** The answers the rendered page holds: each GET's body exactly as its route sends it. */
export function firstScreenAnswers(input: FirstScreenInput): FirstScreenAnswers {
  const paths = firstScreenAnswerPaths(input.shopId);
  return {
    [paths.me]: input.me,
    [paths.zones]: { zones: input.zones },
    [paths.alarms]: { alarms: input.alarms },
    [paths.sensors]: input.sensors,
  };
}

/** The renderer in this export, or null when the export has none (an older build). */
export function loadFirstScreenRenderer(
  webDir: string,
  logger: Logger,
): FirstScreenRenderer | null {
  const file = path.join(webDir, FIRST_SCREEN_RENDERER);
  if (!fs.existsSync(file)) return null;
  try {
    return createRequire(import.meta.url)(file) as FirstScreenRenderer;
  } catch (err) {
    logger.error({ err, file }, 'first screen renderer did not load; pages are served plain');
    return null;
  }
}

export function firstScreen(webDir: string, deps: FirstScreenDeps): FirstScreen | null {
  const renderer = loadFirstScreenRenderer(webDir, deps.logger);
  if (!renderer) return null;
  // After start-up's own work, and never keeping a process alive for it.
  setTimeout(() => {
    try {
      renderer.warmUp?.(WARM_UP_RENDERS, Date.now());
    } catch (err) {
      deps.logger.error({ err }, 'first screen warm-up failed');
    }
  }, 0).unref();
  return async (req) => {
    const shopId = overviewShopId(req.path);
    if (!shopId) return null;
    const input = await firstScreenInput(deps, req.headers.cookie, shopId);
    if (!input) return null;
    return { markup: renderer.renderFirstScreen(input), answers: firstScreenAnswers(input) };
  };
}
