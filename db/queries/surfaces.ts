/** Surfaces, their care log and the shop's coating budgets. Every query is scoped by shop. */
import { and, asc, desc, eq, isNull, sql } from 'drizzle-orm';

import type { CareKind, CoatingType } from '@/ingest/wire/surfaces';

import type { Db } from '../index';
import { careEntries, coatingBudgets, sensors, surfaces, users, zones } from '../schema';

const surfaceColumns = {
  id: surfaces.id,
  name: surfaces.name,
  zoneId: surfaces.zoneId,
  material: surfaces.material,
  sensorId: surfaces.sensorId,
  createdAt: surfaces.createdAt,
};

export type SurfaceRow = Awaited<ReturnType<typeof listSurfaces>>[number];

export async function listSurfaces(db: Db, shopId: string) {
  return db
    .select(surfaceColumns)
    .from(surfaces)
    .where(eq(surfaces.shopId, shopId))
    .orderBy(asc(surfaces.createdAt), asc(surfaces.id));
}

export async function findSurface(db: Db, shopId: string, surfaceId: string) {
  const [row] = await db
    .select(surfaceColumns)
    .from(surfaces)
    .where(and(eq(surfaces.shopId, shopId), eq(surfaces.id, surfaceId)));
  return row ?? null;
}

/** True when the zone is the shop's. */
export async function zoneInShop(db: Db, shopId: string, zoneId: string): Promise<boolean> {
  const [row] = await db
    .select({ id: zones.id })
    .from(zones)
    .where(and(eq(zones.shopId, shopId), eq(zones.id, zoneId)));
  return Boolean(row);
}

/** The zone of a sensor of the shop that has not been removed, or null. */
export async function sensorZone(db: Db, shopId: string, sensorId: string) {
  const [row] = await db
    .select({ zoneId: sensors.zoneId })
    .from(sensors)
    .where(and(eq(sensors.shopId, shopId), eq(sensors.id, sensorId), isNull(sensors.removedAt)));
  return row?.zoneId ?? null;
}

export async function insertSurface(
  db: Db,
  values: {
    shopId: string;
    zoneId: string;
    name: string;
    material: string | null;
    sensorId: string | null;
  },
) {
  const [row] = await db.insert(surfaces).values(values).returning(surfaceColumns);
  if (!row) throw new Error('surface insert returned no row');
  return row;
}

const careColumns = {
  id: careEntries.id,
  kind: careEntries.kind,
  at: careEntries.at,
  byUserId: careEntries.byUserId,
  byName: users.name,
  coatingType: careEntries.coatingType,
  product: careEntries.product,
  rusting: careEntries.rusting,
  note: careEntries.note,
};

export type CareEntryRow = Awaited<ReturnType<typeof listCareEntries>>[number];

/** A surface's care log, newest first (ties: the later logged first). */
export async function listCareEntries(db: Db, shopId: string, surfaceId: string) {
  return db
    .select(careColumns)
    .from(careEntries)
    .leftJoin(users, eq(users.id, careEntries.byUserId))
    .where(and(eq(careEntries.shopId, shopId), eq(careEntries.surfaceId, surfaceId)))
    .orderBy(desc(careEntries.at), desc(careEntries.createdAt));
}

export async function insertCareEntry(
  db: Db,
  values: {
    shopId: string;
    surfaceId: string;
    kind: CareKind;
    at: Date;
    byUserId: string;
    coatingType: CoatingType | null;
    product: string | null;
    rusting: number | null;
    note: string | null;
  },
): Promise<CareEntryRow> {
  const [inserted] = await db.insert(careEntries).values(values).returning({ id: careEntries.id });
  if (!inserted) throw new Error('care entry insert returned no row');
  const [row] = await db
    .select(careColumns)
    .from(careEntries)
    .leftJoin(users, eq(users.id, careEntries.byUserId))
    .where(eq(careEntries.id, inserted.id));
  if (!row) throw new Error('care entry vanished after insert');
  return row;
}

/** The newest coat logged on a surface, or null. */
export async function lastCoating(db: Db, shopId: string, surfaceId: string) {
  const [row] = await db
    .select({ at: careEntries.at, coatingType: careEntries.coatingType })
    .from(careEntries)
    .where(
      and(
        eq(careEntries.shopId, shopId),
        eq(careEntries.surfaceId, surfaceId),
        eq(careEntries.kind, 'coating'),
      ),
    )
    .orderBy(desc(careEntries.at), desc(careEntries.createdAt))
    .limit(1);
  return row && row.coatingType ? { at: row.at, coatingType: row.coatingType } : null;
}

export interface BudgetRow {
  coating: CoatingType;
  hoursWet: number;
  hoursClose: number;
  towHours: number;
}

/** The shop's own budgets; types without a row keep the default. */
export async function listCoatingBudgets(db: Db, shopId: string): Promise<BudgetRow[]> {
  return db
    .select({
      coating: coatingBudgets.coating,
      hoursWet: coatingBudgets.hoursWet,
      hoursClose: coatingBudgets.hoursClose,
      towHours: coatingBudgets.towHours,
    })
    .from(coatingBudgets)
    .where(eq(coatingBudgets.shopId, shopId));
}

export async function upsertCoatingBudgets(db: Db, shopId: string, rows: readonly BudgetRow[]) {
  if (rows.length === 0) return;
  await db
    .insert(coatingBudgets)
    .values(rows.map((r) => ({ shopId, ...r })))
    .onConflictDoUpdate({
      target: [coatingBudgets.shopId, coatingBudgets.coating],
      set: {
        hoursWet: sql`excluded.hours_wet`,
        hoursClose: sql`excluded.hours_close`,
        towHours: sql`excluded.tow_hours`,
      },
    });
}
