import { and, eq, inArray, isNotNull } from 'drizzle-orm';

import type { Db } from '../index';
import { memberships, shops, users, type Role } from '../schema';

import { LIVE_CHANNEL, notify } from '../notify';
import { transaction } from '../transaction';

type Executor = Pick<Db, 'execute'>;

export async function listShopsOfUser(db: Db, userId: string) {
  return db
    .select({
      id: shops.id,
      name: shops.name,
      timeZone: shops.timeZone,
      paperSize: shops.paperSize,
      role: memberships.role,
    })
    .from(memberships)
    .innerJoin(shops, eq(shops.id, memberships.shopId))
    .where(eq(memberships.userId, userId))
    .orderBy(shops.name);
}

export async function addMember(db: Db, shopId: string, userId: string, role: Role) {
  await db.insert(memberships).values({ shopId, userId, role }).onConflictDoNothing();
}

export async function listMembers(db: Db, shopId: string) {
  return db
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      createdAt: memberships.createdAt,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.shopId, shopId))
    .orderBy(users.name);
}

/**
 * Tells every server instance's live hub that these people's shops changed, so their open
 * WebSockets stop (or start) receiving a shop's messages. Sent inside the caller's
 * transaction: PostgreSQL delivers it only if the change commits.
 */
export async function notifyAccessChanged(executor: Executor, userIds: string[]) {
  if (userIds.length === 0) return;
  const payload = JSON.stringify({ type: 'access', userIds });
  await notify(executor, LIVE_CHANNEL, payload);
}

export type MembershipChange = { ok: true } | { ok: false; reason: 'not_a_member' | 'last_owner' };

/**
 * Changes a member's role or removes them, refusing to leave a shop without an owner. The
 * shop's owner rows are locked first, so two owners demoting each other at the same moment
 * cannot both succeed.
 */
export async function changeMembership(
  db: Db,
  shopId: string,
  userId: string,
  change: { role: Role } | { remove: true },
): Promise<MembershipChange> {
  return transaction(db, async (tx) => {
    const owners = await tx
      .select({ userId: memberships.userId })
      .from(memberships)
      .where(and(eq(memberships.shopId, shopId), eq(memberships.role, 'owner')))
      .for('update');
    const [current] = await tx
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.shopId, shopId), eq(memberships.userId, userId)))
      .for('update');
    if (!current) return { ok: false, reason: 'not_a_member' };
    const staysOwner = 'role' in change && change.role === 'owner';
    if (current.role === 'owner' && !staysOwner && owners.length <= 1) {
      return { ok: false, reason: 'last_owner' };
    }
    const where = and(eq(memberships.shopId, shopId), eq(memberships.userId, userId));
    if ('remove' in change) await tx.delete(memberships).where(where);
    else await tx.update(memberships).set({ role: change.role }).where(where);
    await notifyAccessChanged(tx, [userId]);
    return { ok: true };
  });
}

/** The per-person switches that decide which e-mails of a shop reach someone. */
export type MailSwitch = 'alarmMail' | 'weekReportMail';

/**
 * Owners and members of the shop who keep this e-mail on and proved their address; viewers only
 * look, and an unproved address may be someone else's (a typo, or a sign-up in another's name).
 */
export function mailRecipients(db: Db, shopId: string, mail: MailSwitch) {
  return db
    .select({
      userId: users.id,
      email: users.email,
      unitPref: users.unitPref,
      role: memberships.role,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(
      and(
        eq(memberships.shopId, shopId),
        inArray(memberships.role, ['owner', 'member']),
        eq(users[mail], true),
        isNotNull(users.emailVerifiedAt),
      ),
    )
    .orderBy(users.email);
}
