/**
 * Accounts without a session: sign-up, e-mail verification, sign-in, sign-out and password
 * reset by e-mail. Reset and verification links are single-use, expire and are stored as hashes.
 *
 * Neither sign-up nor sign-in tells whether an address has an account: sign-up answers the same
 * 202 for both and mails the address instead, and sign-in spends the same scrypt work on an
 * unknown address as on a wrong password before the same 401.
 */
import { Router, type RequestHandler } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { spendEmailVerification } from '@/db/queries/emailVerifications';
import { notifyAccessChanged } from '@/db/queries/memberships';
import { createPasswordReset, spendPasswordReset } from '@/db/queries/passwordResets';
import {
  bumpSessionVersion,
  findUserByEmail,
  findUserById,
  insertUser,
  replacePasswordHash,
} from '@/db/queries/users';
import type { UserResponse, VerificationSent } from '@/ingest/wire';

import { issueVerification } from '../auth/emailVerification';
import { hashToken, newLinkToken } from '../auth/linkTokens';
import { userIdOf } from '../auth/middleware';
import { dummyPasswordHash, hashPassword, isCurrentHash, verifyPassword } from '../auth/password';
import type { RateLimits } from '../auth/rateLimits';
import { SESSION_COOKIE, startSession, type SessionSigner } from '../auth/session';
import { ApiError } from '../errors';
import type { Logger } from '../logger';
import { passwordResetMail, signUpAttemptMail, type Mailer } from '../mail';
import { parseInput } from '../validate';
import { toUser } from '../wire/people';

import { emailField, newPasswordField, personNameField } from './fields';

export const RESET_VALID_MINUTES = 60;

const signUpBody = z.object({
  email: emailField,
  password: newPasswordField,
  name: personNameField,
});
const signInBody = z.object({ email: emailField, password: z.string().min(1).max(200) });
const resetRequestBody = z.object({ email: emailField });
const resetConfirmBody = z.object({
  token: z.string().min(10).max(200),
  password: newPasswordField,
});
const linkTokenField = z.string('Send the token from the link').min(10).max(200);
const verifyBody = z.object({ token: linkTokenField });

export interface AuthDeps {
  db: Db;
  sessions: SessionSigner;
  mailer: Mailer;
  limits: RateLimits;
  publicUrl: string;
  now: () => number;
  logger: Logger;
}

export function authRouter({
  db,
  sessions,
  mailer,
  limits,
  publicUrl,
  now,
  logger,
}: AuthDeps): Router {
  const router = Router();
  const mailLog = logger.child({ component: 'mail' });
  // Made now, so the first unknown address does not pay for it (and show in the timing).
  void dummyPasswordHash();

  // 202 and the same body whether or not the address has an account; no session either way
  // (signing in would reveal it). A new account gets a verification link, an existing one a
  // note that someone tried. Both hash the password, and mail goes out after the answer.
  // A refused form (a bad name, a short password) does not use up the address's sign-ups.
  const checkSignUp: RequestHandler = (req, res, next) => {
    res.locals.signUp = parseInput(signUpBody, req.body);
    next();
  };
  router.post(
    '/sign-up',
    limits.signUp.perIp,
    checkSignUp,
    limits.signUp.perEmail,
    async (req, res) => {
      const body = res.locals.signUp as z.infer<typeof signUpBody>;
      const created = await insertUser(db, {
        email: body.email,
        name: body.name,
        passwordHash: await hashPassword(body.password),
      });
      res
        .status(202)
        .json({ status: 'verification_sent', email: body.email } satisfies VerificationSent);
      // After the answer, so its timing does not depend on which branch runs.
      const mail = async () =>
        created
          ? issueVerification({ db, publicUrl, now }, created)
          : signUpAttemptMail({
              to: body.email,
              signInUrl: `${publicUrl}/sign-in`,
              resetUrl: `${publicUrl}/forgot-password`,
            });
      void mail()
        .then((m) => mailer.send(m))
        .catch((err: unknown) =>
          mailLog.error({ err, reqId: req.id }, 'sign-up mail could not be sent'),
        );
    },
  );

  // The link proves the address and signs the person in, like accepting an invitation does.
  router.post('/verify', limits.verify, async (req, res) => {
    const body = parseInput(verifyBody, req.body ?? {});
    const spent = await spendEmailVerification(db, {
      tokenHash: hashToken(body.token),
      now: new Date(now()),
    });
    const user = spent && (await findUserById(db, spent.userId));
    if (!spent || !user) {
      throw new ApiError(
        400,
        'verification_link_invalid',
        'This link was already used or has expired. If your address is not verified yet, sign in and send a new link from your profile.',
      );
    }
    await startSession(res, sessions, user.id, spent.sessionVersion);
    res.json({ user: toUser(user) } satisfies UserResponse);
  });

  router.post('/sign-in', ...limits.signIn, limits.signInBackoff.check, async (req, res) => {
    const body = parseInput(signInBody, req.body);
    const found = await findUserByEmail(db, body.email);
    // An unknown address is checked against a dummy hash: the same work, the same answer.
    const matches = await verifyPassword(
      body.password,
      found?.passwordHash ?? (await dummyPasswordHash()),
    );
    if (!found || !matches) {
      limits.signInBackoff.failed(body.email);
      // One message for both cases, so the form does not reveal which e-mails have accounts.
      throw new ApiError(401, 'invalid_credentials', 'That e-mail and password do not match.');
    }
    limits.signInBackoff.succeeded(body.email);
    if (!isCurrentHash(found.passwordHash)) {
      // Older scrypt parameters: the password is at hand only now, so upgrade the hash now.
      await replacePasswordHash(db, {
        userId: found.id,
        oldHash: found.passwordHash,
        newHash: await hashPassword(body.password),
      });
    }
    await startSession(res, sessions, found.id, found.sessionVersion);
    res.json({ user: toUser(found) } satisfies UserResponse);
  });

  // Signing out ends this account's sessions everywhere, not only this browser's cookie.
  router.post('/sign-out', async (_req, res) => {
    const userId = res.locals.userId ? userIdOf(res) : null;
    if (userId) {
      await bumpSessionVersion(db, userId);
      await notifyAccessChanged(db, [userId]);
    }
    const { maxAge: _maxAge, ...options } = sessions.cookieOptions();
    res.clearCookie(SESSION_COOKIE, options);
    res.status(204).end();
  });

  // Always 202, whether or not the address has an account: the answer reveals nothing.
  router.post('/password-reset', ...limits.reset, async (req, res) => {
    const body = parseInput(resetRequestBody, req.body);
    const user = await findUserByEmail(db, body.email);
    if (user) {
      const token = newLinkToken();
      await createPasswordReset(db, {
        userId: user.id,
        tokenHash: hashToken(token),
        expiresAt: new Date(now() + RESET_VALID_MINUTES * 60_000),
      });
      const mail = passwordResetMail({
        to: user.email,
        resetUrl: `${publicUrl}/reset-password/${token}`,
        validMinutes: RESET_VALID_MINUTES,
      });
      // Sent after answering, so the time taken does not tell whether the account exists.
      void mailer
        .send(mail)
        .catch((err: unknown) =>
          mailLog.error({ err, reqId: req.id }, 'password reset mail could not be sent'),
        );
    }
    res.status(202).json({ sent: true });
  });

  router.post('/password-reset/confirm', limits.resetConfirm, async (req, res) => {
    const body = parseInput(resetConfirmBody, req.body);
    const spent = await spendPasswordReset(db, {
      tokenHash: hashToken(body.token),
      passwordHash: await hashPassword(body.password),
      now: new Date(now()),
    });
    if (!spent) {
      throw new ApiError(
        410,
        'link_expired',
        'This reset link has expired or was already used. Ask for a new one.',
      );
    }
    await notifyAccessChanged(db, [spent.userId]);
    await startSession(res, sessions, spent.userId, spent.sessionVersion);
    res.status(204).end();
  });

  return router;
}
