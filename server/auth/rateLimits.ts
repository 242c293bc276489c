/**
 * Limits on the routes a password guesser or a mail bomber would use. Counts live in each
 * instance's memory, so N instances allow up to N times the figures — still enough to make
 * guessing a 10-character password hopeless. Every refusal is a 429 in the shared error shape
 * with Retry-After.
 *
 * The older per-network-address limits come from express-rate-limit (on the real clock). The
 * limits keyed on an account or a target e-mail (which an attacker can hit from many addresses)
 * and the newer per-address ones are our own counters on the app's clock, so tests move time
 * instead of waiting.
 */
import type { Request, RequestHandler, Response } from 'express';
import { ipKeyGenerator, rateLimit, type RateLimitInfo } from 'express-rate-limit';

import { ApiError } from '../errors';

import { createBackoff, createWindowCounter, type Refusal } from './counters';

export interface RateLimitConfig {
  windowMs: number;
  /** Failed sign-ins per e-mail address and network address. */
  signInPerAccount: number;
  /** Failed sign-ins per e-mail address, from anywhere, before each further attempt waits. */
  signInFreeFailures: number;
  /** The first wait after those; every further failure doubles it, up to signInMaxDelayMs. */
  signInFirstDelayMs: number;
  signInMaxDelayMs: number;
  /** Sign-in attempts per network address, whatever the e-mail. */
  signInPerIp: number;
  signUpPerIp: number;
  /** Sign-ups naming one e-mail address (each sends that address a mail), whoever asks. */
  signUpPerEmail: number;
  /** Reset e-mails asked for per network address. */
  resetPerIp: number;
  /** Reset e-mails asked for per target address, whoever asks. */
  resetPerEmail: number;
  /** Reset links tried per network address. */
  resetConfirmPerIp: number;
  /** Verification links tried per network address. */
  verifyPerIp: number;
  /** Password changes per account (each one a scrypt verify and hash). */
  passwordChangePerAccount: number;
  /** Verification mails sent again per account. */
  verificationPerAccount: number;
  /** Invitations sent and invitation links tried per network address. */
  invitationsPerIp: number;
}

export const DEFAULT_RATE_LIMITS: RateLimitConfig = {
  windowMs: 15 * 60_000,
  signInPerAccount: 10,
  // Five tries cover a mistyped password or two; after that a guesser gets 1 s, 2 s, 4 s … and
  // never more than one guess per 15 min, while the owner waits seconds, not a lock-out.
  signInFreeFailures: 5,
  signInFirstDelayMs: 1_000,
  signInMaxDelayMs: 15 * 60_000,
  signInPerIp: 100,
  signUpPerIp: 20,
  signUpPerEmail: 5,
  resetPerIp: 10,
  resetPerEmail: 5,
  resetConfirmPerIp: 20,
  verifyPerIp: 50,
  passwordChangePerAccount: 10,
  verificationPerAccount: 5,
  invitationsPerIp: 50,
};

/** What the sign-in route tells the per-account back-off after checking a password. */
export interface SignInBackoff {
  /** Refuses (429) while the e-mail's back-off runs; otherwise passes on. */
  check: RequestHandler;
  failed(email: string): void;
  succeeded(email: string): void;
}

export interface RateLimits {
  signIn: RequestHandler[];
  signInBackoff: SignInBackoff;
  /** Per address before the body is read; per target e-mail only for a valid sign-up. */
  signUp: { perIp: RequestHandler; perEmail: RequestHandler };
  reset: RequestHandler[];
  resetConfirm: RequestHandler;
  verify: RequestHandler;
  /** Keyed on the signed-in account: mount after the session check. */
  passwordChange: RequestHandler;
  verificationMail: RequestHandler;
  invitations: RequestHandler;
}

function ipKey(req: Request): string {
  return ipKeyGenerator(req.ip ?? 'unknown');
}

/** The e-mail a request names, as the routes store it; '' when it names none. */
export function emailKey(req: Request): string {
  const body = req.body as { email?: unknown } | undefined;
  return typeof body?.email === 'string' ? body.email.trim().toLowerCase() : '';
}

function tooMany(what: string, retryAfterS: number): ApiError {
  const wait = retryAfterS >= 120 ? `${Math.ceil(retryAfterS / 60)} minutes` : `${retryAfterS} s`;
  return new ApiError(429, 'too_many_requests', `Too many ${what}; wait ${wait} and try again.`);
}

function refuse(res: Response, what: string, refusal: Refusal): ApiError {
  res.setHeader('Retry-After', String(refusal.retryAfterS));
  return tooMany(what, refusal.retryAfterS);
}

export function createRateLimits(
  config: RateLimitConfig = DEFAULT_RATE_LIMITS,
  now: () => number = Date.now,
): RateLimits {
  const limiter = (limit: number, what: string, extra: Parameters<typeof rateLimit>[0] = {}) =>
    rateLimit({
      windowMs: config.windowMs,
      limit,
      standardHeaders: 'draft-8',
      legacyHeaders: false,
      keyGenerator: ipKey,
      handler: (req, res, next) => {
        // express-rate-limit puts its count on the request under `rateLimit` (its default).
        const info = (req as Request & { rateLimit?: RateLimitInfo }).rateLimit;
        const resetMs = info?.resetTime?.getTime() ?? Date.now() + config.windowMs;
        const retryAfterS = Math.max(1, Math.ceil((resetMs - Date.now()) / 1000));
        next(refuse(res, `${what} from here`, { retryAfterS }));
      },
      ...extra,
    });

  /** A counter per key on the app's clock; requests without a key pass. */
  const perKey = (limit: number, what: string, key: (req: Request, res: Response) => string) => {
    const counter = createWindowCounter({ windowMs: config.windowMs, limit, now });
    const handler: RequestHandler = (req, res, next) => {
      const k = key(req, res);
      const refusal = k ? counter.hit(k) : null;
      next(refusal ? refuse(res, what, refusal) : undefined);
    };
    return handler;
  };

  const backoff = createBackoff({
    freeFailures: config.signInFreeFailures,
    firstDelayMs: config.signInFirstDelayMs,
    maxDelayMs: config.signInMaxDelayMs,
    now,
  });
  const userKey = (_req: Request, res: Response) => String(res.locals.userId ?? '');

  return {
    signIn: [
      limiter(config.signInPerIp, 'sign-in attempts'),
      // Only failures count against an account, so a person signing in often is never locked.
      limiter(config.signInPerAccount, 'failed sign-ins for this account', {
        keyGenerator: (req) => `${ipKey(req)}|${emailKey(req)}`,
        skipSuccessfulRequests: true,
      }),
    ],
    signInBackoff: {
      // Counted for every e-mail, with or without an account, so the refusal reveals nothing.
      check: (req, res, next) => {
        const refusal = backoff.check(emailKey(req));
        next(refusal ? refuse(res, 'failed sign-ins for this account', refusal) : undefined);
      },
      failed: (email) => backoff.failed(email),
      succeeded: (email) => backoff.succeeded(email),
    },
    signUp: {
      perIp: limiter(config.signUpPerIp, 'sign-ups'),
      perEmail: perKey(config.signUpPerEmail, 'sign-ups for this address', emailKey),
    },
    reset: [
      limiter(config.resetPerIp, 'password-reset requests'),
      perKey(config.resetPerEmail, 'password-reset requests for this address', emailKey),
    ],
    resetConfirm: perKey(config.resetConfirmPerIp, 'password-reset attempts from here', ipKey),
    verify: perKey(config.verifyPerIp, 'verification attempts from here', ipKey),
    passwordChange: perKey(config.passwordChangePerAccount, 'password changes', userKey),
    verificationMail: perKey(config.verificationPerAccount, 'verification e-mails', userKey),
    invitations: limiter(config.invitationsPerIp, 'invitation requests'),
  };
}
