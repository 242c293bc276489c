/**
 * People and shop rows to what the API answers (ingest/wire/people.ts): the one place that
 * decides the shape of a user, a shop, a member and an invitation.
 */
import type { findOpenInvitation, listOpenInvitations } from '@/db/queries/invitations';
import type { listMembers, listShopsOfUser } from '@/db/queries/memberships';
import type { UserRow } from '@/db/queries/users';
import type {
  Invitation,
  InvitationAccepted,
  InvitationLink,
  Member,
  Shop,
  ShopSummary,
  User,
} from '@/ingest/wire';

type ShopOfUserRow = Awaited<ReturnType<typeof listShopsOfUser>>[number];
type MemberRow = Awaited<ReturnType<typeof listMembers>>[number];
type InvitationRow = Awaited<ReturnType<typeof listOpenInvitations>>[number];
type OpenInvitationRow = NonNullable<Awaited<ReturnType<typeof findOpenInvitation>>>;

export function toUser(row: UserRow): User {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    unitPref: row.unitPref,
    alarmMail: row.alarmMail,
    weekReportMail: row.weekReportMail,
    emailVerified: row.emailVerifiedAt !== null,
  };
}

export function toShop(row: Shop): Shop {
  return { id: row.id, name: row.name, timeZone: row.timeZone };
}

export function toShopSummary(row: ShopOfUserRow): ShopSummary {
  return { ...toShop(row), role: row.role, paperSize: row.paperSize };
}

export function toMember(row: MemberRow): Member {
  return {
    userId: row.userId,
    name: row.name,
    email: row.email,
    role: row.role,
    since: row.createdAt.toISOString(),
  };
}

export function toInvitation(row: InvitationRow): Invitation {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    expiresAt: row.expiresAt.toISOString(),
    createdAt: row.createdAt.toISOString(),
  };
}

/** What the link's holder may see: never the shop's id or who else was invited. */
export function toInvitationLink(row: OpenInvitationRow): InvitationLink {
  return {
    shopName: row.shopName,
    email: row.email,
    role: row.role,
    expiresAt: row.expiresAt.toISOString(),
    accountExists: row.accountExists,
  };
}

export function toInvitationAccepted(
  shop: { id: string; name: string },
  role: InvitationAccepted['role'],
): InvitationAccepted {
  return { shop: { id: shop.id, name: shop.name }, role };
}
