/**
 * Accounts without a session: sign-up, sign-in, sign-out and password reset by e-mail.
 * The reset link is single-use, expires after RESET_VALID_MINUTES and is stored as a hash.
 */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { createPasswordReset, spendPasswordReset } from '@/db/queries/passwordResets';
import { bumpSessionVersion, findUserByEmail, insertUser } from '@/db/queries/users';
import { notifyAccessChanged } from '@/db/queries/memberships';

import { hashToken, newLinkToken } from '../auth/linkTokens';
import { userIdOf } from '../auth/middleware';
import { hashPassword, verifyPassword } from '../auth/password';
import type { RateLimits } from '../auth/rateLimits';
import { SESSION_COOKIE, startSession, type SessionSigner } from '../auth/session';
import { ApiError } from '../errors';
import type { Logger } from '../logger';
import { passwordResetMail, type Mailer } from '../mail';
import { parseInput } from '../validate';

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

  router.post('/sign-up', limits.signUp, async (req, res) => {
    const body = parseInput(signUpBody, req.body);
    const created = await insertUser(db, {
      email: body.email,
      name: body.name,
      passwordHash: await hashPassword(body.password),
    });
    if (!created) {
      throw new ApiError(
        409,
        'email_taken',
        'An account with this e-mail already exists; sign in instead.',
        [{ path: 'email', message: 'Already registered' }],
      );
    }
    const { sessionVersion, ...user } = created;
    await startSession(res, sessions, user.id, sessionVersion);
    res.status(201).json({ user });
  });

  router.post('/sign-in', ...limits.signIn, async (req, res) => {
    const body = parseInput(signInBody, req.body);
    const found = await findUserByEmail(db, body.email);
    // One message for both cases, so the form does not reveal which e-mails have accounts.
    if (!found || !(await verifyPassword(body.password, found.passwordHash))) {
      throw new ApiError(401, 'invalid_credentials', 'That e-mail and password do not match.');
    }
    await startSession(res, sessions, found.id, found.sessionVersion);
    res.json({
      user: {
        id: found.id,
        email: found.email,
        name: found.name,
        unitPref: found.unitPref,
        alarmMail: found.alarmMail,
      },
    });
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
  router.post('/password-reset', limits.reset, async (req, res) => {
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

  router.post('/password-reset/confirm', limits.reset, async (req, res) => {
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
