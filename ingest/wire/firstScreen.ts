/**
 * The overview's first screen as the server renders it into the page (server/firstScreen.ts),
 * with the app's own components (scripts/webpage/firstScreenEntry.tsx): the same answers the
 * app's first requests get, so the server's cards say what the app's cards will.
 */
import type { Me } from './people';
import type { Zone } from './zones';

export interface FirstScreenInput {
  /** GET /me's answer for the signed-in person. */
  me: Me;
  /** The shop of the address; one of `me.shops`. */
  shopId: string;
  /** GET /shops/:shopId/zones's zones. */
  zones: Zone[];
}

export interface FirstScreenMarkup {
  /** The screen's HTML, to place before the app's root element. */
  html: string;
  /** The style element react-native-web built for it (class rules of the markup). */
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
