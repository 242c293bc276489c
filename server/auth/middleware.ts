/**
 * The one authorization middleware: looks the request up in the policy table, refuses
 * cross-site writes, checks the session (401), then the shop: a shop the person is not in
 * answers 404 exactly like a shop that does not exist, a role below the row's answers 403.
 * It renews a session cookie past half its lifetime.
 */
import type { RequestHandler, Response } from 'express';
import { match } from 'path-to-regexp';

import type { Db } from '@/db';
import type { Role } from '@/db/schema';

import { ApiError } from '../errors';

import { crossSiteRefusal } from './origin';
import { isShopRole, POLICY, ROLE_RANK, type PolicyRow } from './policy';
import { startSession, type SessionSigner } from './session';
import { isUuid, resolveSession } from './sessionState';

export { isUuid } from './sessionState';

const compiled = POLICY.map((row) => ({
  row,
  match: match<Partial<Record<string, string>>>(row.path),
}));

/** The policy row for a request and its path parameters, or null when no route answers. */
export function findPolicy(
  method: string,
  path: string,
): { row: PolicyRow; params: Partial<Record<string, string>> } | null {
  const wanted = method === 'HEAD' ? 'GET' : method;
  for (const entry of compiled) {
    if (entry.row.method !== wanted) continue;
    try {
      const found = entry.match(path);
      if (found) return { row: entry.row, params: found.params };
    } catch {
      // A malformed %-escape in the path matches nothing.
    }
  }
  return null;
}

export const SHOP_NOT_FOUND = 'shop_not_found';

export function userIdOf(res: Response): string {
  return res.locals.userId as string;
}

/** The shop the policy admitted the request to. */
export function shopIdOf(res: Response): string {
  return res.locals.shopId as string;
}

export function roleOf(res: Response): Role {
  return res.locals.role as Role;
}

export function authorize(deps: {
  db: Db;
  sessions: SessionSigner;
  trustedOrigins: ReadonlySet<string>;
}): RequestHandler {
  const { db, sessions } = deps;
  return async (req, res, next) => {
    const found = findPolicy(req.method, req.path);
    if (!found) {
      return next(new ApiError(404, 'not_found', `Nothing at ${req.method} ${req.path}.`));
    }
    const { row } = found;
    // A sensor's bearer token cannot be borrowed by another site: no origin check there.
    if (row.access === 'sensor') return next();
    const refusal = crossSiteRefusal(req, deps.trustedOrigins);
    if (refusal) return next(refusal);

    const shopId = isShopRole(row.access) ? found.params.shopId : undefined;
    const cookie = req.headers.cookie;
    const resolved =
      cookie === undefined
        ? null
        : await resolveSession(db, sessions, cookie, isUuid(shopId) ? shopId : undefined);
    const session = resolved === 'expired' ? null : resolved;
    if (session) {
      const { userId, sessionVersion, authTimeS } = session.claims;
      res.locals.userId = userId;
      res.locals.sessionVersion = sessionVersion;
      // The renewal keeps the sign-in time, so it never reaches past the absolute end.
      if (sessions.wantsRenewal(session.claims)) {
        await startSession(res, sessions, userId, sessionVersion, authTimeS);
      }
    }
    if (row.access === 'anyone') return next();
    if (resolved === 'expired') {
      return next(
        new ApiError(401, 'session_expired', 'Your session has ended; sign in again to continue.'),
      );
    }
    if (!session) return next(new ApiError(401, 'not_signed_in', 'Sign in to continue.'));
    if (!isShopRole(row.access)) return next();

    if (!isUuid(shopId) || !session.role) {
      return next(new ApiError(404, SHOP_NOT_FOUND, 'No such shop among yours.'));
    }
    if (ROLE_RANK[session.role] < ROLE_RANK[row.access]) {
      return next(
        new ApiError(403, 'forbidden', `This needs the ${row.access} role in this shop.`),
      );
    }
    res.locals.shopId = shopId;
    res.locals.role = session.role;
    next();
  };
}
