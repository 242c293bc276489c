/**
 * Who is asking, and may they? `requireUser` answers 401 without a valid session;
 * `requireShopRole` answers 404 for a shop the user is not in (so shop ids do not leak) and
 * 403 when their role is too low.
 */
import type { RequestHandler, Response } from 'express';

import type { Db } from '@/db';
import { findMembership } from '@/db/queries/memberships';
import type { Role } from '@/db/schema';

import { ApiError } from '../errors';

import { readCookie, SESSION_COOKIE, type SessionSigner } from './session';

const RANK: Record<Role, number> = { viewer: 0, member: 1, owner: 2 };

/** The shop a `requireShopRole` check admitted the request to. */
export function shopIdOf(res: Response): string {
  return res.locals.shopId as string;
}

export function requireUser(sessions: SessionSigner): RequestHandler {
  return async (req, res, next) => {
    const token = readCookie(req.headers.cookie, SESSION_COOKIE);
    const userId = token ? await sessions.verify(token) : null;
    if (!userId) return next(new ApiError(401, 'not_signed_in', 'Sign in to continue.'));
    res.locals.userId = userId;
    next();
  };
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: unknown): value is string {
  return typeof value === 'string' && UUID.test(value);
}

export function requireShopRole(db: Db, minimum: Role): RequestHandler {
  return async (req, res, next) => {
    const shopId = req.params.shopId;
    const notFound = new ApiError(404, 'not_found', 'No such shop.');
    if (!isUuid(shopId)) return next(notFound);
    const membership = await findMembership(db, shopId, res.locals.userId as string);
    if (!membership) return next(notFound);
    if (RANK[membership.role] < RANK[minimum]) {
      return next(new ApiError(403, 'forbidden', `This needs the ${minimum} role in this shop.`));
    }
    res.locals.role = membership.role;
    res.locals.shopId = shopId;
    next();
  };
}
