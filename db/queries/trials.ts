/**
 * Protection trials: the trial with its treatments, its tests and each test's ranks. Every
 * statement names the shop, so an id from another shop finds nothing.
 */
import { and, asc, count, desc, eq, inArray } from 'drizzle-orm';

import type { TrialTestKind } from '@/ingest/wire/trials';

import type { Db } from '../index';
import { trialRanks, trialTests, trialTreatments, trials } from '../schema';

export interface TrialRow {
  id: string;
  name: string;
  createdAt: Date;
}

export interface TreatmentRow {
  id: string;
  trialId: string;
  name: string;
}

export interface TrialTestRow {
  id: string;
  name: string;
  kind: TrialTestKind;
  from: Date;
  to: Date;
  zoneId: string | null;
  sensorId: string | null;
  notes: string | null;
}

export interface RankRow {
  testId: string;
  treatmentId: string;
  rank: number;
}

const trialColumns = { id: trials.id, name: trials.name, createdAt: trials.createdAt };
const treatmentColumns = {
  id: trialTreatments.id,
  trialId: trialTreatments.trialId,
  name: trialTreatments.name,
};
const testColumns = {
  id: trialTests.id,
  name: trialTests.name,
  kind: trialTests.kind,
  from: trialTests.from,
  to: trialTests.to,
  zoneId: trialTests.zoneId,
  sensorId: trialTests.sensorId,
  notes: trialTests.notes,
};

/** Run inside a transaction: the trial and its treatments go in together. */
export async function insertTrial(
  db: Db,
  shopId: string,
  input: { name: string; createdBy: string; treatments: readonly string[] },
) {
  const [trial] = await db
    .insert(trials)
    .values({ shopId, name: input.name, createdBy: input.createdBy })
    .returning(trialColumns);
  if (!trial) throw new Error('trial insert returned no row');
  const treatments = await db
    .insert(trialTreatments)
    .values(
      input.treatments.map((name, position) => ({ shopId, trialId: trial.id, name, position })),
    )
    .returning(treatmentColumns);
  return { ...trial, treatments: sortLike(treatments, input.treatments) };
}

function sortLike(rows: TreatmentRow[], names: readonly string[]): TreatmentRow[] {
  return [...rows].sort((a, b) => names.indexOf(a.name) - names.indexOf(b.name));
}

export async function findTrial(db: Db, shopId: string, trialId: string) {
  const [row] = await db
    .select(trialColumns)
    .from(trials)
    .where(and(eq(trials.shopId, shopId), eq(trials.id, trialId)));
  return row ?? null;
}

/** Treatments of the given trials, in the order they were given. */
export async function treatmentsOf(db: Db, shopId: string, trialIds: readonly string[]) {
  if (trialIds.length === 0) return [];
  return db
    .select(treatmentColumns)
    .from(trialTreatments)
    .where(and(eq(trialTreatments.shopId, shopId), inArray(trialTreatments.trialId, [...trialIds])))
    .orderBy(asc(trialTreatments.trialId), asc(trialTreatments.position));
}

/** The shop's trials, newest first, with how many tests each has. */
export async function listTrials(db: Db, shopId: string) {
  return db
    .select({ ...trialColumns, tests: count(trialTests.id) })
    .from(trials)
    .leftJoin(trialTests, eq(trialTests.trialId, trials.id))
    .where(eq(trials.shopId, shopId))
    .groupBy(trials.id)
    .orderBy(desc(trials.createdAt), desc(trials.id));
}

export async function testsOf(db: Db, shopId: string, trialId: string): Promise<TrialTestRow[]> {
  return db
    .select(testColumns)
    .from(trialTests)
    .where(and(eq(trialTests.shopId, shopId), eq(trialTests.trialId, trialId)))
    .orderBy(asc(trialTests.from), asc(trialTests.createdAt));
}

export async function findTest(db: Db, shopId: string, trialId: string, testId: string) {
  const [row] = await db
    .select(testColumns)
    .from(trialTests)
    .where(
      and(
        eq(trialTests.shopId, shopId),
        eq(trialTests.trialId, trialId),
        eq(trialTests.id, testId),
      ),
    );
  return row ?? null;
}

export async function insertTest(
  db: Db,
  shopId: string,
  trialId: string,
  input: Omit<TrialTestRow, 'id'>,
): Promise<TrialTestRow> {
  const [row] = await db
    .insert(trialTests)
    .values({ shopId, trialId, ...input })
    .returning(testColumns);
  if (!row) throw new Error('trial test insert returned no row');
  return row;
}

export async function ranksOf(
  db: Db,
  shopId: string,
  testIds: readonly string[],
): Promise<RankRow[]> {
  if (testIds.length === 0) return [];
  return db
    .select({
      testId: trialRanks.testId,
      treatmentId: trialRanks.treatmentId,
      rank: trialRanks.rank,
    })
    .from(trialRanks)
    .where(and(eq(trialRanks.shopId, shopId), inArray(trialRanks.testId, [...testIds])));
}

/** Run inside a transaction: a test's ranks are replaced as a whole. */
export async function replaceRanks(
  db: Db,
  shopId: string,
  testId: string,
  ranks: readonly { treatmentId: string; rank: number }[],
) {
  await db
    .delete(trialRanks)
    .where(and(eq(trialRanks.shopId, shopId), eq(trialRanks.testId, testId)));
  await db.insert(trialRanks).values(ranks.map((r) => ({ shopId, testId, ...r })));
}
