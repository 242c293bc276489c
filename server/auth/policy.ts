/**
 * Who may call what: every API route under /api/v1 and the least it needs. The `authorize`
 * middleware looks each request up here before any router runs, and a route without a row
 * answers 404 — so a new route is unreachable until it is given a row (fail closed), and the
 * tenant matrix in tests/server/tenantMatrix.test.ts is generated from this same list.
 *
 *   anyone  no session needed (a session, when present, is still read)
 *   sensor  a sensor's bearer token, checked by the ingest route itself
 *   user    any signed-in person
 *   viewer / member / owner   at least that role in the shop named by `:shopId`
 */
import type { Role } from '@/db/schema';

export type Access = 'anyone' | 'sensor' | 'user' | Role;

export type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export interface PolicyRow {
  method: Method;
  /** Relative to /api/v1, in Express's `:param` syntax. */
  path: string;
  access: Access;
}

export const ROLE_RANK: Record<Role, number> = { viewer: 0, member: 1, owner: 2 };

export function isShopRole(access: Access): access is Role {
  return access in ROLE_RANK;
}

export const POLICY: readonly PolicyRow[] = [
  { method: 'GET', path: '/health', access: 'anyone' },
  { method: 'POST', path: '/ingest', access: 'sensor' },

  { method: 'POST', path: '/auth/sign-up', access: 'anyone' },
  { method: 'POST', path: '/auth/sign-in', access: 'anyone' },
  { method: 'POST', path: '/auth/sign-out', access: 'anyone' },
  // The token in the link is the key; opening it signs its account in.
  { method: 'POST', path: '/auth/verify', access: 'anyone' },
  { method: 'POST', path: '/auth/password-reset', access: 'anyone' },
  { method: 'POST', path: '/auth/password-reset/confirm', access: 'anyone' },

  { method: 'GET', path: '/me', access: 'user' },
  { method: 'PATCH', path: '/me', access: 'user' },
  { method: 'POST', path: '/me/password', access: 'user' },
  { method: 'POST', path: '/me/verification', access: 'user' },

  { method: 'POST', path: '/shops', access: 'user' },
  { method: 'GET', path: '/shops/:shopId', access: 'viewer' },
  { method: 'PATCH', path: '/shops/:shopId', access: 'owner' },
  { method: 'DELETE', path: '/shops/:shopId', access: 'owner' },

  { method: 'GET', path: '/shops/:shopId/zones', access: 'viewer' },
  { method: 'POST', path: '/shops/:shopId/zones', access: 'owner' },
  { method: 'PATCH', path: '/shops/:shopId/zones/:zoneId', access: 'owner' },
  { method: 'DELETE', path: '/shops/:shopId/zones/:zoneId', access: 'owner' },
  { method: 'GET', path: '/shops/:shopId/zones/:zoneId/readings', access: 'viewer' },

  // Last seen and battery help everyone notice a silent sensor; tokens never leave the server.
  { method: 'GET', path: '/shops/:shopId/sensors', access: 'viewer' },
  { method: 'POST', path: '/shops/:shopId/sensors', access: 'owner' },
  { method: 'PATCH', path: '/shops/:shopId/sensors/:sensorId', access: 'owner' },
  { method: 'DELETE', path: '/shops/:shopId/sensors/:sensorId', access: 'owner' },
  { method: 'POST', path: '/shops/:shopId/sensors/:sensorId/token', access: 'owner' },
  { method: 'DELETE', path: '/shops/:shopId/sensors/:sensorId/token', access: 'owner' },

  // Members' e-mail addresses are for the people who work in the shop, not for viewers.
  { method: 'GET', path: '/shops/:shopId/members', access: 'member' },
  { method: 'PATCH', path: '/shops/:shopId/members/:userId', access: 'owner' },
  { method: 'DELETE', path: '/shops/:shopId/members/:userId', access: 'owner' },
  // Leaving a shop is one's own decision, whatever the role (the last owner excepted).
  { method: 'DELETE', path: '/shops/:shopId/membership', access: 'viewer' },

  { method: 'GET', path: '/shops/:shopId/invitations', access: 'owner' },
  { method: 'POST', path: '/shops/:shopId/invitations', access: 'owner' },
  { method: 'DELETE', path: '/shops/:shopId/invitations/:invitationId', access: 'owner' },
  // The token in the link is the key: whoever holds it may read and accept the invitation.
  { method: 'GET', path: '/invitations/:token', access: 'anyone' },
  { method: 'POST', path: '/invitations/:token/accept', access: 'anyone' },

  // Alarms (API.md): everyone sees them; acknowledging is work done in the shop.
  { method: 'GET', path: '/shops/:shopId/alarms', access: 'viewer' },
  { method: 'POST', path: '/shops/:shopId/alarms/:alarmId/ack', access: 'member' },

  // The week report: anyone in the shop reads it (a viewer may be the landlord it is for).
  { method: 'GET', path: '/shops/:shopId/reports/week', access: 'viewer' },

  // Protection trials (API.md): testing treatments is work done in the shop, so members write
  // as owners do; viewers read the standings.
  { method: 'GET', path: '/shops/:shopId/trials', access: 'viewer' },
  { method: 'POST', path: '/shops/:shopId/trials', access: 'member' },
  { method: 'GET', path: '/shops/:shopId/trials/:trialId', access: 'viewer' },
  { method: 'POST', path: '/shops/:shopId/trials/:trialId/tests', access: 'member' },
  { method: 'PUT', path: '/shops/:shopId/trials/:trialId/tests/:testId/ranks', access: 'member' },
  // The care log (API.md): coating and inspecting the iron is work done in the shop, so members
  // log it and tune the coating budgets; viewers read.
  { method: 'GET', path: '/shops/:shopId/surfaces', access: 'viewer' },
  { method: 'POST', path: '/shops/:shopId/surfaces', access: 'member' },
  { method: 'GET', path: '/shops/:shopId/surfaces/:surfaceId', access: 'viewer' },
  { method: 'POST', path: '/shops/:shopId/surfaces/:surfaceId/care', access: 'member' },
  { method: 'GET', path: '/shops/:shopId/surfaces/:surfaceId/exposure', access: 'viewer' },
  { method: 'GET', path: '/shops/:shopId/coating-budgets', access: 'viewer' },
  { method: 'PUT', path: '/shops/:shopId/coating-budgets', access: 'member' },
  // Photos for the care log and trials: taking one is work done in the shop; everyone in the
  // shop sees them, through the checked proxy only (the bucket is never public).
  { method: 'POST', path: '/shops/:shopId/photos', access: 'member' },
  {
    method: 'POST',
    path: '/shops/:shopId/surfaces/:surfaceId/care/:entryId/photos',
    access: 'member',
  },
  { method: 'POST', path: '/shops/:shopId/trials/:trialId/tests/:testId/photos', access: 'member' },
  { method: 'GET', path: '/shops/:shopId/photos/:photoId', access: 'viewer' },
  { method: 'GET', path: '/shops/:shopId/photos/:photoId/thumb', access: 'viewer' },
  // A member removes the photos they added (the route checks whose it is); owners any.
  { method: 'DELETE', path: '/shops/:shopId/photos/:photoId', access: 'member' },
  // CSV imports (API.md): bringing in a logger's history is work done in the shop, so members
  // import as owners do; viewers see the imports and their rejected lines.
  { method: 'GET', path: '/shops/:shopId/sensors/:sensorId/imports', access: 'viewer' },
  { method: 'POST', path: '/shops/:shopId/sensors/:sensorId/imports', access: 'member' },
  { method: 'GET', path: '/shops/:shopId/sensors/:sensorId/imports/:importId', access: 'viewer' },
  {
    method: 'POST',
    path: '/shops/:shopId/sensors/:sensorId/imports/:importId/start',
    access: 'member',
  },
  {
    method: 'POST',
    path: '/shops/:shopId/sensors/:sensorId/imports/:importId/cancel',
    access: 'member',
  },
  {
    method: 'GET',
    path: '/shops/:shopId/sensors/:sensorId/imports/:importId/rejected.csv',
    access: 'viewer',
  },
];
