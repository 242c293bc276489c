/**
 * The overview's first screen as the server renders it into the page (server/firstScreen.ts),
 * with the app's own components (scripts/webpage/firstScreenEntry.tsx): the same answers the
 * app's first requests get, so the server's cards say what the app's cards will.
 */
import type { Alarm } from './alarms';
import type { Me } from './people';
import type { SensorsResponse } from './sensors';
import type { Zone } from './zones';

export interface FirstScreenInput {
  /** GET /me's answer for the signed-in person. */
  me: Me;
  /** The shop of the address; one of `me.shops`. */
  shopId: string;
  /** GET /shops/:shopId/zones's zones. */
  zones: Zone[];
  /** GET /shops/:shopId/alarms?state=open's alarms (the banner, the count on Alarms). */
  alarms: Alarm[];
  /** GET /shops/:shopId/sensors's answer (the setup checklist above the overview reads it). */
  sensors: SensorsResponse;
}

export interface FirstScreenMarkup {
  /** The screen's HTML, to place before the app's root element. */
  html: string;
  /** The style elements: react-native-web's class rules of the markup, and which layout shows at which width. */
  css: string;
}

/** What the built renderer module exports. */
export interface FirstScreenRenderer {
  renderFirstScreen(input: FirstScreenInput): FirstScreenMarkup;
  /** Renders invented data `times` times, so real requests find the code compiled. */
  warmUp?(times: number, nowMs: number): void;
}

/** The element id of the server's first screen; the boot script removes it once the app shows. */
export const FIRST_SCREEN_ID = 'first-screen';

/** The id of the page's JSON (a non-executed script element) holding the API answers rendered. */
export const FIRST_SCREEN_ANSWERS_ID = 'first-screen-answers';

/** The API's address prefix; the app's apiRequest puts it before every path. */
export const API_PREFIX = '/api/v1';

/**
 * The API paths, as the app's queries request them, whose answers the first screen of a shop's
 * overview holds: the boot script hands them to the app's first GETs instead of asking again.
 */
export function firstScreenAnswerPaths(shopId: string): {
  me: string;
  alarms: string;
  zones: string;
  sensors: string;
} {
  const shop = `${API_PREFIX}/shops/${encodeURIComponent(shopId)}`;
  return {
    me: `${API_PREFIX}/me`,
    alarms: `${shop}/alarms?state=open`,
    zones: `${shop}/zones`,
    sensors: `${shop}/sensors`,
  };
}

/** API path → the JSON body its GET answers (200), as embedded in the page. */
export type FirstScreenAnswers = Record<string, unknown>;
