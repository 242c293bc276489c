/**
 * Cross-site request refusal for everything that rides on the session cookie. SameSite=Lax
 * already keeps the cookie off most cross-site requests; this is the second wall: a browser
 * always names the page's origin (Origin, else Referer, and Sec-Fetch-Site) on a POST, PATCH
 * or DELETE, so a request naming a foreign origin is refused. A request naming none comes from
 * a script or a command-line client, which cannot borrow a person's cookie, and may pass.
 */
import type { Request } from 'express';

import { ApiError } from '../errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

function originOfUrl(url: string): string {
  try {
    return new URL(url).origin;
  } catch {
    return 'null';
  }
}

export function crossSiteRefusal(
  req: Request,
  trustedOrigins: ReadonlySet<string>,
): ApiError | null {
  if (SAFE_METHODS.has(req.method)) return null;
  const refusal = new ApiError(
    403,
    'cross_site_request',
    'This request came from another site and was refused. Use Drybench itself.',
  );
  if (req.get('sec-fetch-site') === 'cross-site') return refusal;
  const origin =
    req.get('origin') ?? (req.get('referer') ? originOfUrl(req.get('referer')!) : null);
  if (origin === null) return null;
  const own = `${req.protocol}://${req.get('host')}`;
  return origin === own || trustedOrigins.has(origin) ? null : refusal;
}

/** The origin of a WebSocket upgrade must be ours too (browsers send it on every handshake). */
export function isTrustedUpgradeOrigin(
  origin: string | undefined,
  host: string | undefined,
  trustedOrigins: ReadonlySet<string>,
): boolean {
  if (origin === undefined) return true;
  if (trustedOrigins.has(origin)) return true;
  const url = originOfUrl(origin);
  return host !== undefined && (url === `http://${host}` || url === `https://${host}`);
}
