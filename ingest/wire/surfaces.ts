/**
 * Surfaces and their care log as the API answers them: GET|POST /shops/:shopId/surfaces,
 * GET …/surfaces/:surfaceId, POST …/care, GET …/exposure, GET|PUT …/coating-budgets.
 * Times are ISO 8601 (UTC), exposures in hours.
 */
import type { Photo } from './photos';

/** What was done to a surface: a coat put on, or a look at it. */
export const CARE_KINDS = ['coating', 'inspection'] as const;
export type CareKind = (typeof CARE_KINDS)[number];

/** Generic kinds of protective coat; the product itself is the shop's own free text. */
export const COATING_TYPES = ['wax', 'dry_film', 'inhibitor_spray', 'oil', 'other'] as const;
export type CoatingType = (typeof COATING_TYPES)[number];

/** ISO 4628-3 degree of rusting, Ri 0 (none) to Ri 5 (the worst). */
export const RUSTING_GRADES = [0, 1, 2, 3, 4, 5] as const;
export type RustingGrade = (typeof RUSTING_GRADES)[number];

export interface Surface {
  id: string;
  name: string;
  zoneId: string;
  material: string | null;
  /** The probe on this surface, whose readings alone count for its exposure; null: the zone's. */
  sensorId: string | null;
  createdAt: string;
}

export interface CareEntry {
  id: string;
  kind: CareKind;
  at: string;
  /** Who logged it; null when that person's account is gone. */
  by: { id: string; name: string } | null;
  coating: { type: CoatingType; product: string | null } | null;
  rusting: RustingGrade | null;
  note: string | null;
  /** Its photos, oldest first (ingest/wire/photos.ts). */
  photos: Photo[];
}

/** One surface with its care log, newest first. */
export interface SurfaceDetail extends Surface {
  care: CareEntry[];
}

export interface SurfacesResponse {
  surfaces: Surface[];
}

/** How much exposure a coat of a type is trusted to take before a re-coat is suggested. */
export interface CoatingBudget {
  coating: CoatingType;
  hoursWet: number;
  hoursClose: number;
  towHours: number;
  /** True when the shop kept the default (ingest/care.ts). */
  isDefault: boolean;
}

export interface CoatingBudgetsResponse {
  budgets: CoatingBudget[];
}

/**
 * Exposure of a surface since its last coat, from stored readings with the week report's rule
 * (each reading stands until the next, at most 15 min). `since` is null when no coat is logged:
 * the hours are then null and a coat is suggested.
 */
export interface SurfaceExposure {
  since: string | null;
  coating: CoatingType | null;
  hoursClose: number | null;
  hoursWet: number | null;
  timeOfWetnessHours: number | null;
  recoat: { due: boolean; reason: string; cautions: string[] };
}
