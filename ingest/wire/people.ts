/**
 * People and shops as the API answers them: GET/PATCH /me, sign-in and verification, shops,
 * members, invitations and invitation links. Times ISO 8601.
 */
import type { PaperSize } from './reports';

/** Owner: everything; member: acknowledge alarms, log care; viewer: read. */
export const ROLES = ['owner', 'member', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

/** How a person sees temperatures; the API always speaks °C and K. */
export const UNIT_PREFS = ['C', 'F'] as const;
export type UnitPref = (typeof UNIT_PREFS)[number];

export interface User {
  id: string;
  email: string;
  name: string;
  /** How temperatures are shown; the API always speaks °C and K. */
  unitPref: UnitPref;
  /** Whether alarm e-mails reach this person in shops where they are an owner or member. */
  alarmMail: boolean;
  /** Whether the week report reaches this person by e-mail on Mondays (owner or member). */
  weekReportMail: boolean;
  /** Whether the address is proved; alarm and report e-mails wait for it. */
  emailVerified: boolean;
}

/** Sign-in, verification and a profile change answer the person. */
export interface UserResponse {
  user: User;
}

/** A shop as created (POST /shops). */
export interface Shop {
  id: string;
  name: string;
  /** IANA zone; times on screen are shown in it. */
  timeZone: string;
}

/** A shop with the reader's role in it: /me's list, GET and PATCH /shops/:shopId. */
export interface ShopSummary extends Shop {
  role: Role;
  /** The sheet the week report's PDF is laid out on; the owner changes it. */
  paperSize: PaperSize;
}

export interface Me {
  user: User;
  shops: ShopSummary[];
}

export interface Member {
  userId: string;
  name: string;
  email: string;
  role: Role;
  since: string;
}

export interface MembersResponse {
  members: Member[];
}

/** A role change answers who and the new role. */
export interface MemberRole {
  userId: string;
  role: Role;
}

/** An open invitation as its shop's owners see it. */
export interface Invitation {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
  createdAt: string;
}

export interface InvitationsResponse {
  invitations: Invitation[];
}

/** An invitation link as its holder sees it: GET /invitations/:token. */
export interface InvitationLink {
  shopName: string;
  email: string;
  role: Role;
  expiresAt: string;
  accountExists: boolean;
}

/** Accepting an invitation answers the shop joined and the role held there. */
export interface InvitationAccepted {
  shop: { id: string; name: string };
  role: Role;
}

/** What sign-up and a resent verification answer, for a new address and a taken one alike. */
export interface VerificationSent {
  status: 'verification_sent';
  email: string;
}
