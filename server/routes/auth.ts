import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { findUserByEmail, insertUser } from '@/db/queries/users';

import { hashPassword, verifyPassword } from '../auth/password';
import { SESSION_COOKIE, type SessionSigner } from '../auth/session';
import { ApiError } from '../errors';
import { parseInput } from '../validate';

const email = z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(254);

const signUpBody = z.object({
  email,
  // 10 characters: NIST SP 800-63B asks for at least 8; we ask a little more.
  password: z.string().min(10, 'Use at least 10 characters').max(200),
  name: z.string().trim().min(1, 'Enter your name').max(100),
});

const signInBody = z.object({ email, password: z.string().min(1).max(200) });

export function authRouter(db: Db, sessions: SessionSigner): Router {
  const router = Router();

  router.post('/sign-up', async (req, res) => {
    const body = parseInput(signUpBody, req.body);
    const user = await insertUser(db, {
      email: body.email,
      name: body.name,
      passwordHash: await hashPassword(body.password),
    });
    if (!user) {
      throw new ApiError(
        409,
        'email_taken',
        'An account with this e-mail already exists; sign in instead.',
        [{ path: 'email', message: 'Already registered' }],
      );
    }
    res.cookie(SESSION_COOKIE, await sessions.sign(user.id), sessions.cookieOptions);
    res.status(201).json({ user });
  });

  router.post('/sign-in', async (req, res) => {
    const body = parseInput(signInBody, req.body);
    const found = await findUserByEmail(db, body.email);
    // One message for both cases, so the form does not reveal which e-mails have accounts.
    if (!found || !(await verifyPassword(body.password, found.passwordHash))) {
      throw new ApiError(401, 'invalid_credentials', 'That e-mail and password do not match.');
    }
    res.cookie(SESSION_COOKIE, await sessions.sign(found.id), sessions.cookieOptions);
    res.json({ user: { id: found.id, email: found.email, name: found.name } });
  });

  router.post('/sign-out', (_req, res) => {
    const { maxAge: _maxAge, ...options } = sessions.cookieOptions;
    res.clearCookie(SESSION_COOKIE, options);
    res.status(204).end();
  });

  return router;
}
