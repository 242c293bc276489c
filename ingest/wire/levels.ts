/**
 * The levels a dew margin falls into, and where a surface temperature came from: small lists the
 * database enums, the server and the app all take from here. This file stays free of zod so the
 * app can import it without carrying a schema library into the web bundle.
 */

/** Dry, close to the dew point, wet, or unknown when no margin could be computed. */
export const LEVELS = ['dry', 'close', 'wet', 'unknown'] as const;
export type Level = (typeof LEVELS)[number];

/** A surface probe measured it, or it was estimated from the air temperature's history. */
export const SURFACE_SOURCES = ['probe', 'estimate'] as const;
export type SurfaceSource = (typeof SURFACE_SOURCES)[number];
