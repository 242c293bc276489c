/**
 * Limits on the routes a password guesser or a mail bomber would use. Counts live in each
 * instance's memory, so N instances allow up to N times the figures — still enough to make
 * guessing a 10-character password hopeless. Every refusal is a 429 in the shared error shape.
 */
import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';

import { ApiError } from '../errors';

export interface RateLimitConfig {
  windowMs: number;
  /** Failed sign-ins per e-mail address and network address. */
  signInPerAccount: number;
  /** Sign-in attempts per network address, whatever the e-mail. */
  signInPerIp: number;
  signUpPerIp: number;
  /** Reset e-mails asked for per network address. */
  resetPerIp: number;
  /** Invitations sent and invitation links tried per network address. */
  invitationsPerIp: number;
}

export const DEFAULT_RATE_LIMITS: RateLimitConfig = {
  windowMs: 15 * 60_000,
  signInPerAccount: 10,
  signInPerIp: 100,
  signUpPerIp: 20,
  resetPerIp: 10,
  invitationsPerIp: 50,
};

export interface RateLimits {
  signIn: RequestHandler[];
  signUp: RequestHandler;
  reset: RequestHandler;
  invitations: RequestHandler;
}

function ipKey(req: Request): string {
  return ipKeyGenerator(req.ip ?? 'unknown');
}

export function createRateLimits(config: RateLimitConfig = DEFAULT_RATE_LIMITS): RateLimits {
  const limiter = (limit: number, what: string, extra: Parameters<typeof rateLimit>[0] = {}) =>
    rateLimit({
      windowMs: config.windowMs,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      keyGenerator: ipKey,
      handler: (_req, _res, next) =>
        next(
          new ApiError(
            429,
            'too_many_requests',
            `Too many ${what} from here; wait ${Math.ceil(config.windowMs / 60_000)} minutes and try again.`,
          ),
        ),
      ...extra,
    });
  const accountKey = (req: Request) => {
    const body = req.body as { email?: unknown } | undefined;
    const email = typeof body?.email === 'string' ? body.email.trim().toLowerCase() : '';
    return `${ipKey(req)}|${email}`;
  };
  return {
    signIn: [
      limiter(config.signInPerIp, 'sign-in attempts'),
      // Only failures count against an account, so a person signing in often is never locked.
      limiter(config.signInPerAccount, 'failed sign-ins for this account', {
        keyGenerator: accountKey,
        skipSuccessfulRequests: true,
      }),
    ],
    signUp: limiter(config.signUpPerIp, 'sign-ups'),
    reset: limiter(config.resetPerIp, 'password-reset requests'),
    invitations: limiter(config.invitationsPerIp, 'invitation requests'),
  };
}
