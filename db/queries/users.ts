import { and, eq, sql } from 'drizzle-orm';

import type { Db } from '../index';
import { memberships, users, type TemperatureUnitPref } from '../schema';

/** An account without its secrets (password hash, session version). */
export interface UserRow {
  id: string;
  email: string;
  name: string;
  unitPref: TemperatureUnitPref;
  /** Whether alarm e-mails reach this person (as an owner or member of a shop). */
  alarmMail: boolean;
  /** Whether the Monday week-report e-mail reaches this person (owner or member). */
  weekReportMail: boolean;
  /** When the person proved the address (verification or invitation link); mail waits for it. */
  emailVerifiedAt: Date | null;
}

const publicColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  unitPref: users.unitPref,
  alarmMail: users.alarmMail,
  weekReportMail: users.weekReportMail,
  emailVerifiedAt: users.emailVerifiedAt,
};

export async function findUserByEmail(db: Db, email: string) {
  const [row] = await db.select().from(users).where(eq(users.email, email.toLowerCase()));
  return row ?? null;
}

export async function findUserById(db: Db, id: string): Promise<UserRow | null> {
  const [row] = await db.select(publicColumns).from(users).where(eq(users.id, id));
  return row ?? null;
}

/** The stored password hash and session version, for checks that need the secret. */
export async function findUserSecrets(db: Db, id: string) {
  const [row] = await db
    .select({ passwordHash: users.passwordHash, sessionVersion: users.sessionVersion })
    .from(users)
    .where(eq(users.id, id));
  return row ?? null;
}

/**
 * Inserts a user; null when the e-mail is taken (the unique index decides, not a pre-check).
 * `emailVerifiedAt` when the address is already proved (an accepted invitation link).
 */
export async function insertUser(
  db: Db,
  input: { email: string; name: string; passwordHash: string; emailVerifiedAt?: Date },
): Promise<(UserRow & { sessionVersion: number }) | null> {
  const [row] = await db
    .insert(users)
    .values({ ...input, email: input.email.toLowerCase() })
    .onConflictDoNothing({ target: users.email })
    .returning({ ...publicColumns, sessionVersion: users.sessionVersion });
  return row ?? null;
}

/**
 * What every signed-in request needs, in one primary-key probe: the account's current session
 * version and, when the route names a shop, the person's role there (null when not a member).
 */
export async function findSessionState(db: Db, userId: string, shopId?: string) {
  const [row] = await db
    .select({ sessionVersion: users.sessionVersion, role: memberships.role })
    .from(users)
    .leftJoin(
      memberships,
      and(eq(memberships.userId, users.id), eq(memberships.shopId, shopId ?? sql`null::uuid`)),
    )
    .where(eq(users.id, userId));
  return row ?? null;
}

export async function updateProfile(
  db: Db,
  userId: string,
  changes: {
    name?: string;
    unitPref?: TemperatureUnitPref;
    alarmMail?: boolean;
    weekReportMail?: boolean;
  },
): Promise<UserRow | null> {
  const [row] = await db
    .update(users)
    .set(changes)
    .where(eq(users.id, userId))
    .returning(publicColumns);
  return row ?? null;
}

/** Ends every session of the account (all devices); returns the new version. */
export async function bumpSessionVersion(db: Db, userId: string): Promise<number | null> {
  const [row] = await db
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId))
    .returning({ sessionVersion: users.sessionVersion });
  return row?.sessionVersion ?? null;
}

/**
 * Stores a re-hash of the same password (new parameters) only if the hash is still the one
 * that was checked, so a password change racing the sign-in is never undone. Sessions stay.
 */
export async function replacePasswordHash(
  db: Db,
  input: { userId: string; oldHash: string; newHash: string },
): Promise<boolean> {
  const rows = await db
    .update(users)
    .set({ passwordHash: input.newHash })
    .where(and(eq(users.id, input.userId), eq(users.passwordHash, input.oldHash)))
    .returning({ id: users.id });
  return rows.length > 0;
}

/** Records that the person proved the address; an earlier proof keeps its time. */
export async function markEmailVerified(db: Db, userId: string, at: Date): Promise<void> {
  await db
    .update(users)
    .set({ emailVerifiedAt: sql`coalesce(${users.emailVerifiedAt}, ${at})` })
    .where(eq(users.id, userId));
}

/** Sets a new password and ends every older session in the same statement. */
export async function setPassword(
  db: Db,
  userId: string,
  passwordHash: string,
): Promise<number | null> {
  const [row] = await db
    .update(users)
    .set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId))
    .returning({ sessionVersion: users.sessionVersion });
  return row?.sessionVersion ?? null;
}
