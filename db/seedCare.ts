/**
 * Seeds the demo shop's surfaces, care log and finished trial (db/seedCareScenario.ts) into a
 * shop that seedDemo made. Each surface and the trial go in once, by name: a rerun, or a shop
 * seeded before this existed, gets only what is missing. Photos are drawn and stored elsewhere
 * (server/demo/); demoPhotoSubjects says which of the scenario's subjects still lack one.
 */
import { and, eq, inArray } from 'drizzle-orm';
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

import { averageRanks } from '@/ingest/trials/standings';
import type { TrialTestKind } from '@/ingest/wire/trials';

import type { Db } from './index';
import { insertTest, insertTrial, replaceRanks } from './queries/trials';
import { careEntries, photos, sensors, surfaces, trialTests, trials, users, zones } from './schema';
import { DEMO_PEOPLE, DEMO_SHOP } from './seed';
import { DEMO_SURFACES, DEMO_TRIAL, type DemoWhen } from './seedCareScenario';
import { transaction } from './transaction';

const DAY_MS = 86_400_000;

/** The instant of a scenario time: the shop-local date `daysAgo` before `nowMs`, at hh:mm. */
export function demoInstant(when: DemoWhen, nowMs: number, timeZone = DEMO_SHOP.timeZone): Date {
  // Noon-anchored so a clock change between the two days cannot move the date.
  const day = formatInTimeZone(new Date(nowMs - when.daysAgo * DAY_MS), timeZone, 'yyyy-MM-dd');
  const hh = String(when.hh).padStart(2, '0');
  const mm = String(when.mm ?? 0).padStart(2, '0');
  return fromZonedTime(`${day}T${hh}:${mm}:00`, timeZone);
}

export interface DemoCareCounts {
  surfaces: number;
  careEntries: number;
  trials: number;
}

export async function seedDemoCare(db: Db, shopId: string, nowMs: number): Promise<DemoCareCounts> {
  return transaction(db, async (tx) => {
    const added: DemoCareCounts = { surfaces: 0, careEntries: 0, trials: 0 };
    const idsByName = (rows: { id: string; name: string }[]) =>
      new Map(rows.map((r) => [r.name, r.id]));
    const zoneIds = idsByName(
      await tx
        .select({ id: zones.id, name: zones.name })
        .from(zones)
        .where(eq(zones.shopId, shopId)),
    );
    const sensorIds = idsByName(
      await tx
        .select({ id: sensors.id, name: sensors.name })
        .from(sensors)
        .where(eq(sensors.shopId, shopId)),
    );
    const people = new Map(
      (
        await tx
          .select({ id: users.id, email: users.email })
          .from(users)
          .where(
            inArray(
              users.email,
              DEMO_SURFACES.flatMap((s) => s.care.map((c) => c.by)).concat(DEMO_TRIAL.by),
            ),
          )
      ).map((u) => [u.email, u.id]),
    );
    const existing = new Set(
      (
        await tx.select({ name: surfaces.name }).from(surfaces).where(eq(surfaces.shopId, shopId))
      ).map((s) => s.name),
    );

    for (const [index, demo] of DEMO_SURFACES.entries()) {
      const zoneId = zoneIds.get(demo.zone);
      // A zone the owner renamed or removed takes its surfaces with it.
      if (existing.has(demo.name) || !zoneId) continue;
      const [surface] = await tx
        .insert(surfaces)
        .values({
          shopId,
          zoneId,
          name: demo.name,
          material: demo.material,
          sensorId: (demo.probe && sensorIds.get(demo.probe)) || null,
          // A second apart, in the scenario's order: lists sort by creation, and one
          // transaction's now() would leave them in id (random) order.
          createdAt: new Date(nowMs - (DEMO_SURFACES.length - index) * 1000),
        })
        .returning({ id: surfaces.id });
      added.surfaces += 1;
      for (const entry of demo.care) {
        await tx.insert(careEntries).values({
          shopId,
          surfaceId: surface!.id,
          kind: entry.kind,
          at: demoInstant(entry.when, nowMs),
          byUserId: people.get(entry.by) ?? null,
          coatingType: entry.coating?.type ?? null,
          product: entry.coating?.product ?? null,
          rusting: entry.rusting ?? null,
          note: entry.note ?? null,
        });
        added.careEntries += 1;
      }
    }

    const [trial] = await tx
      .select({ id: trials.id })
      .from(trials)
      .where(and(eq(trials.shopId, shopId), eq(trials.name, DEMO_TRIAL.name)));
    if (!trial) {
      const made = await insertTrial(tx, shopId, {
        name: DEMO_TRIAL.name,
        createdBy: people.get(DEMO_TRIAL.by)!,
        treatments: DEMO_TRIAL.treatments,
      });
      for (const test of DEMO_TRIAL.tests) {
        const row = await insertTest(tx, shopId, made.id, {
          name: test.name,
          kind: test.kind,
          from: demoInstant(test.from, nowMs),
          to: demoInstant(test.to, nowMs),
          zoneId: zoneIds.get(test.zone) ?? null,
          sensorId: null,
          notes: test.notes,
        });
        // Less rust ranks better; equal shares share the average rank, as the API stores a tie.
        const ranks = averageRanks(test.rustedPct);
        await replaceRanks(
          tx,
          shopId,
          row.id,
          made.treatments.map((t, i) => ({ treatmentId: t.id, rank: ranks[i]! })),
        );
      }
      added.trials += 1;
    }
    return added;
  });
}

export type DemoPhotoSubject =
  | {
      kind: 'care_entry';
      id: string;
      byUserId: string;
      surfaceName: string;
      shape: 'top' | 'bars';
      rusting: number;
      at: Date;
    }
  | {
      kind: 'trial_test';
      id: string;
      byUserId: string;
      testName: string;
      testKind: TrialTestKind;
      at: Date;
      treatments: readonly string[];
      rustedPct: readonly number[];
    };

/** The scenario's inspections and trial tests that have no photo yet. */
export async function demoPhotoSubjects(db: Db, shopId: string): Promise<DemoPhotoSubject[]> {
  // Whoever logged the entry took its photo; the owner stands in for an account that is gone.
  const [owner] = await db
    .select({ id: users.id })
    .from(users)
    .where(eq(users.email, DEMO_PEOPLE[0].email));
  if (!owner) return [];
  const wanted: DemoPhotoSubject[] = [];
  const entries = await db
    .select({
      id: careEntries.id,
      byUserId: careEntries.byUserId,
      surfaceName: surfaces.name,
      note: careEntries.note,
      rusting: careEntries.rusting,
      at: careEntries.at,
    })
    .from(careEntries)
    .innerJoin(surfaces, eq(surfaces.id, careEntries.surfaceId))
    .where(and(eq(careEntries.shopId, shopId), eq(careEntries.kind, 'inspection')));
  for (const demo of DEMO_SURFACES) {
    for (const entry of demo.care) {
      if (!entry.photo) continue;
      // The scenario's own entry: same surface, grade and note (a person's later entry is not).
      const row = entries.find(
        (e) => e.surfaceName === demo.name && e.note === entry.note && e.rusting === entry.rusting,
      );
      if (row) {
        wanted.push({
          kind: 'care_entry',
          id: row.id,
          byUserId: row.byUserId ?? owner.id,
          surfaceName: demo.name,
          shape: entry.photo,
          rusting: row.rusting!,
          at: row.at,
        });
      }
    }
  }
  const tests = await db
    .select({ id: trialTests.id, name: trialTests.name, to: trialTests.to, by: trials.createdBy })
    .from(trialTests)
    .innerJoin(trials, eq(trials.id, trialTests.trialId))
    .where(and(eq(trialTests.shopId, shopId), eq(trials.name, DEMO_TRIAL.name)));
  for (const test of DEMO_TRIAL.tests) {
    const row = tests.find((t) => t.name === test.name);
    if (row) {
      wanted.push({
        kind: 'trial_test',
        id: row.id,
        byUserId: row.by ?? owner.id,
        testName: test.name,
        testKind: test.kind,
        at: row.to,
        treatments: DEMO_TRIAL.treatments,
        rustedPct: test.rustedPct,
      });
    }
  }
  if (wanted.length === 0) return [];
  const photographed = new Set(
    (
      await db
        .select({ ownerId: photos.ownerId })
        .from(photos)
        .where(
          and(
            eq(photos.shopId, shopId),
            inArray(
              photos.ownerId,
              wanted.map((w) => w.id),
            ),
          ),
        )
    ).map((p) => p.ownerId),
  );
  return wanted.filter((w) => !photographed.has(w.id));
}
