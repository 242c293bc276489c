/**
 * The signed-in person: GET /me (with their shops and whether the address is verified), profile
 * changes (name, units, alarm and week-report e-mails), password change and sending the verification link again.
 */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { listShopsOfUser, notifyAccessChanged } from '@/db/queries/memberships';
import { findUserById, findUserSecrets, setPassword, updateProfile } from '@/db/queries/users';
import type { Me, UserResponse, VerificationSent } from '@/ingest/wire';

import { issueVerification } from '../auth/emailVerification';
import { userIdOf } from '../auth/middleware';
import { hashPassword, verifyPassword } from '../auth/password';
import type { RateLimits } from '../auth/rateLimits';
import { startSession, type SessionSigner } from '../auth/session';
import { ApiError } from '../errors';
import type { Mailer } from '../mail';
import { parseInput } from '../validate';
import { toShopSummary, toUser } from '../wire/people';

import { newPasswordField, personNameField, unitPrefField } from './fields';

const profileBody = z
  .object({
    name: personNameField.optional(),
    unitPref: unitPrefField.optional(),
    alarmMail: z.boolean('Send true or false').optional(),
    weekReportMail: z.boolean('Send true or false').optional(),
  })
  .strict()
  .refine(
    (b) =>
      b.name !== undefined ||
      b.unitPref !== undefined ||
      b.alarmMail !== undefined ||
      b.weekReportMail !== undefined,
    'Change the name, the units, alarm e-mails or the week report e-mail',
  );

const passwordBody = z.object({
  currentPassword: z.string().min(1, 'Enter your current password').max(200),
  newPassword: newPasswordField,
});

const signedOut = () => new ApiError(401, 'not_signed_in', 'Sign in to continue.');

const verificationBody = z.object({}).strict();

export interface MeDeps {
  db: Db;
  sessions: SessionSigner;
  mailer: Mailer;
  limits: RateLimits;
  publicUrl: string;
  now: () => number;
}

export function meRouter({ db, sessions, mailer, limits, publicUrl, now }: MeDeps): Router {
  const router = Router();

  router.get('/', async (_req, res) => {
    const userId = userIdOf(res);
    const user = await findUserById(db, userId);
    if (!user) throw signedOut();
    const shops = await listShopsOfUser(db, userId);
    res.json({ user: toUser(user), shops: shops.map(toShopSummary) } satisfies Me);
  });

  router.patch('/', async (req, res) => {
    const body = parseInput(profileBody, req.body);
    const user = await updateProfile(db, userIdOf(res), body);
    if (!user) throw signedOut();
    res.json({ user: toUser(user) } satisfies UserResponse);
  });

  // A new password ends every other session; this one continues with a fresh cookie.
  router.post('/password', limits.passwordChange, async (req, res) => {
    const body = parseInput(passwordBody, req.body);
    const userId = userIdOf(res);
    const secrets = await findUserSecrets(db, userId);
    if (!secrets) throw signedOut();
    if (!(await verifyPassword(body.currentPassword, secrets.passwordHash))) {
      throw new ApiError(400, 'wrong_password', 'The current password is not right.', [
        { path: 'currentPassword', message: 'Not your current password' },
      ]);
    }
    const version = await setPassword(db, userId, await hashPassword(body.newPassword));
    if (version === null) throw signedOut();
    await notifyAccessChanged(db, [userId]);
    await startSession(res, sessions, userId, version);
    res.status(204).end();
  });

  // The first link may be lost or expired; a new one does not end the older ones.
  router.post('/verification', limits.verificationMail, async (req, res) => {
    parseInput(verificationBody, req.body ?? {});
    const user = await findUserById(db, userIdOf(res));
    if (!user) throw signedOut();
    if (user.emailVerifiedAt !== null) {
      throw new ApiError(409, 'already_verified', `${user.email} is already verified.`);
    }
    try {
      await mailer.send(await issueVerification({ db, publicUrl, now }, user));
    } catch {
      throw new ApiError(
        503,
        'mail_unavailable',
        'The e-mail could not be sent right now. Try again in a minute.',
      );
    }
    res
      .status(202)
      .json({ status: 'verification_sent', email: user.email } satisfies VerificationSent);
  });

  return router;
}
