/**
 * Members of a shop: list, change a role, remove, and leave. A shop always keeps an owner:
 * the last one cannot be demoted, removed or leave (409), so someone can still manage it.
 */
import { Router } from 'express';
import { z } from 'zod';

import type { Db } from '@/db';
import { changeMembership, listMembers, type MembershipChange } from '@/db/queries/memberships';
import type { MemberRole, MembersResponse } from '@/ingest/wire';

import { isUuid, shopIdOf, userIdOf } from '../auth/middleware';
import { ApiError } from '../errors';
import { parseInput } from '../validate';
import { toMember } from '../wire/people';

import { roleField } from './fields';

const roleBody = z.object({ role: roleField });

function check(result: MembershipChange): void {
  if (result.ok) return;
  if (result.reason === 'not_a_member') {
    throw new ApiError(404, 'not_found', 'That person is not a member of this shop.');
  }
  throw new ApiError(
    409,
    'last_owner',
    'A shop needs at least one owner. Make someone else an owner first.',
  );
}

/** Mounted at /shops/:shopId. */
export function membersRouter(db: Db): Router {
  const router = Router({ mergeParams: true });

  router.get('/members', async (_req, res) => {
    const rows = await listMembers(db, shopIdOf(res));
    res.json({ members: rows.map(toMember) } satisfies MembersResponse);
  });

  router.patch('/members/:userId', async (req, res) => {
    const body = parseInput(roleBody, req.body);
    const userId = req.params.userId;
    if (!isUuid(userId)) check({ ok: false, reason: 'not_a_member' });
    check(await changeMembership(db, shopIdOf(res), userId, { role: body.role }));
    res.json({ userId, role: body.role } satisfies MemberRole);
  });

  router.delete('/members/:userId', async (req, res) => {
    const userId = req.params.userId;
    if (!isUuid(userId)) check({ ok: false, reason: 'not_a_member' });
    check(await changeMembership(db, shopIdOf(res), userId, { remove: true }));
    res.status(204).end();
  });

  router.delete('/membership', async (_req, res) => {
    check(await changeMembership(db, shopIdOf(res), userIdOf(res), { remove: true }));
    res.status(204).end();
  });

  return router;
}
