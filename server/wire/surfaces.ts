/** Surface and care rows to what the API answers (ingest/wire/surfaces.ts). */
import type { BudgetRow, CareEntryRow, SurfaceRow } from '@/db/queries/surfaces';
import { DEFAULT_COATING_BUDGETS } from '@/ingest/care';
import type { Photo } from '@/ingest/wire/photos';
import {
  COATING_TYPES,
  type CareEntry,
  type CoatingBudget,
  type RustingGrade,
  type Surface,
} from '@/ingest/wire/surfaces';

export function toSurface(row: SurfaceRow): Surface {
  return {
    id: row.id,
    name: row.name,
    zoneId: row.zoneId,
    material: row.material,
    sensorId: row.sensorId,
    createdAt: row.createdAt.toISOString(),
  };
}

/** `photos`: the entry's own, oldest first (none for an entry just logged). */
export function toCareEntry(row: CareEntryRow, photos: Photo[] = []): CareEntry {
  return {
    id: row.id,
    kind: row.kind,
    at: row.at.toISOString(),
    by: row.byUserId && row.byName !== null ? { id: row.byUserId, name: row.byName } : null,
    coating: row.coatingType ? { type: row.coatingType, product: row.product } : null,
    rusting: row.rusting === null ? null : (row.rusting as RustingGrade),
    note: row.note,
    photos,
  };
}

/** Every coating type, the shop's own budget where it set one, else the default. */
export function toCoatingBudgets(rows: readonly BudgetRow[]): CoatingBudget[] {
  const own = new Map(rows.map((r) => [r.coating, r]));
  return COATING_TYPES.map((coating) => {
    const row = own.get(coating);
    const hours = row ?? DEFAULT_COATING_BUDGETS[coating];
    return {
      coating,
      hoursWet: hours.hoursWet,
      hoursClose: hours.hoursClose,
      towHours: hours.towHours,
      isDefault: !row,
    };
  });
}
