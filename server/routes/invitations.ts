/**
 * Invitations: an owner invites an e-mail address with a role; the e-mailed link (the only
 * copy of the token) accepts once, for the account with that address — signed in already, or
 * created on the spot from the link. Either way the address counts as verified from then on.
 */
import { Router } from 'express';
import { z } from 'zod';

import {
  acceptInvitation,
  createInvitation,
  deleteInvitation,
  findOpenInvitation,
  listOpenInvitations,
} from '@/db/queries/invitations';
import { listMembers } from '@/db/queries/memberships';
import { findShop } from '@/db/queries/shops';
import { findUserById, insertUser, markEmailVerified } from '@/db/queries/users';
import type { InvitationsResponse } from '@/ingest/wire';

import { hashToken, newLinkToken } from '../auth/linkTokens';
import { isUuid, shopIdOf, userIdOf } from '../auth/middleware';
import { hashPassword } from '../auth/password';
import { startSession } from '../auth/session';
import { ApiError } from '../errors';
import { invitationMail } from '../mail';
import { parseInput } from '../validate';
import { toInvitation, toInvitationAccepted, toInvitationLink } from '../wire/people';

import type { AuthDeps } from './auth';
import { emailField, newPasswordField, personNameField, roleField } from './fields';

export const INVITATION_VALID_DAYS = 7;

const inviteBody = z.object({ email: emailField, role: roleField });
const acceptBody = z.object({ name: personNameField, password: newPasswordField }).partial();

const linkGone = () =>
  new ApiError(
    404,
    'invitation_not_found',
    'This invitation link has expired, was already used or was withdrawn. Ask the shop owner for a new one.',
  );

export type InvitationDeps = Omit<AuthDeps, 'logger'>;

/** Mounted at /api/v1 itself: it answers /shops/:shopId/invitations and /invitations/:token. */
export function invitationsRouter(deps: InvitationDeps): Router {
  const { db, sessions, mailer, limits, publicUrl, now } = deps;
  const router = Router();

  router.get('/shops/:shopId/invitations', async (_req, res) => {
    const rows = await listOpenInvitations(db, shopIdOf(res), new Date(now()));
    res.json({ invitations: rows.map(toInvitation) } satisfies InvitationsResponse);
  });

  router.post('/shops/:shopId/invitations', limits.invitations, async (req, res) => {
    const body = parseInput(inviteBody, req.body);
    const shopId = shopIdOf(res);
    const members = await listMembers(db, shopId);
    if (members.some((m) => m.email === body.email)) {
      throw new ApiError(409, 'already_member', 'This person is already a member of the shop.', [
        { path: 'email', message: 'Already a member' },
      ]);
    }
    const shop = await findShop(db, shopId);
    const inviter = await findUserById(db, userIdOf(res));
    if (!shop || !inviter) throw new ApiError(404, 'shop_not_found', 'No such shop among yours.');
    const token = newLinkToken();
    const invitation = await createInvitation(db, {
      shopId,
      email: body.email,
      role: body.role,
      tokenHash: hashToken(token),
      invitedBy: inviter.id,
      expiresAt: new Date(now() + INVITATION_VALID_DAYS * 24 * 3_600_000),
    });
    const mail = invitationMail({
      to: body.email,
      shopName: shop.name,
      inviterName: inviter.name,
      role: body.role,
      acceptUrl: `${publicUrl}/invite/${token}`,
      expiresAt: invitation.expiresAt,
    });
    try {
      await mailer.send(mail);
    } catch {
      // An invitation nobody can receive is useless: take it back and say so.
      await deleteInvitation(db, shopId, invitation.id);
      throw new ApiError(
        503,
        'mail_unavailable',
        'The invitation e-mail could not be sent right now. Try again in a minute.',
      );
    }
    res.status(201).json(toInvitation(invitation));
  });

  router.delete('/shops/:shopId/invitations/:invitationId', async (req, res) => {
    const id = req.params.invitationId;
    if (!isUuid(id) || !(await deleteInvitation(db, shopIdOf(res), id))) {
      throw new ApiError(404, 'not_found', 'No such invitation in this shop.');
    }
    res.status(204).end();
  });

  router.get('/invitations/:token', limits.invitations, async (req, res) => {
    const found = await findOpenInvitation(
      db,
      hashToken(String(req.params.token)),
      new Date(now()),
    );
    if (!found) throw linkGone();
    res.json(toInvitationLink(found));
  });

  router.post('/invitations/:token/accept', limits.invitations, async (req, res) => {
    const body = parseInput(acceptBody, req.body ?? {});
    const found = await findOpenInvitation(
      db,
      hashToken(String(req.params.token)),
      new Date(now()),
    );
    if (!found) throw linkGone();

    let userId: string;
    let status = 200;
    if (res.locals.userId) {
      userId = userIdOf(res);
      const user = await findUserById(db, userId);
      if (user?.email !== found.email) {
        throw new ApiError(
          403,
          'wrong_account',
          `This invitation is for ${found.email}. Sign out, then open the link again.`,
        );
      }
    } else if (found.accountExists) {
      throw new ApiError(
        401,
        'not_signed_in',
        `${found.email} already has an account: sign in, then accept.`,
      );
    } else {
      if (!body.name || !body.password) {
        throw new ApiError(400, 'invalid_input', 'Choose your name and a password.', [
          ...(body.name ? [] : [{ path: 'name', message: 'Enter your name' }]),
          ...(body.password ? [] : [{ path: 'password', message: 'Choose a password' }]),
        ]);
      }
      const created = await insertUser(db, {
        email: found.email,
        name: body.name,
        passwordHash: await hashPassword(body.password),
        emailVerifiedAt: new Date(now()),
      });
      if (!created) throw linkGone();
      userId = created.id;
      status = 201;
      await startSession(res, sessions, created.id, created.sessionVersion);
    }
    const accepted = await acceptInvitation(db, {
      invitationId: found.id,
      userId,
      now: new Date(now()),
    });
    if (!accepted) throw linkGone();
    // The link came by e-mail to this address: using it proves the address, as verification does.
    await markEmailVerified(db, userId, new Date(now()));
    res
      .status(status)
      .json(toInvitationAccepted({ id: accepted.shopId, name: found.shopName }, accepted.role));
  });

  return router;
}
