import { eq } from 'drizzle-orm';

import type { Db } from '../index';
import { users } from '../schema';

export interface PublicUser {
  id: string;
  email: string;
  name: string;
}

const publicColumns = { id: users.id, email: users.email, name: users.name };

export async function findUserByEmail(db: Db, email: string) {
  const [row] = await db.select().from(users).where(eq(users.email, email.toLowerCase()));
  return row ?? null;
}

export async function findUserById(db: Db, id: string): Promise<PublicUser | null> {
  const [row] = await db.select(publicColumns).from(users).where(eq(users.id, id));
  return row ?? null;
}

/** Inserts a user; null when the e-mail is taken (the unique index decides, not a pre-check). */
export async function insertUser(
  db: Db,
  input: { email: string; name: string; passwordHash: string },
): Promise<PublicUser | null> {
  const [row] = await db
    .insert(users)
    .values({ ...input, email: input.email.toLowerCase() })
    .onConflictDoNothing({ target: users.email })
    .returning(publicColumns);
  return row ?? null;
}
