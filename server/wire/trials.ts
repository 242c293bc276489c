/**
 * Trial rows to what the API answers (ingest/wire/trials.ts): the one place that decides it,
 * standings included. A test counts in the standings once every treatment has its rank.
 */
import type { RankRow, TreatmentRow, TrialRow, TrialTestRow } from '@/db/queries/trials';
import { trialStandings } from '@/ingest/trials/standings';
import type { Photo } from '@/ingest/wire/photos';
import type {
  Trial,
  TrialStandings,
  TrialSummary,
  TrialTest,
  TrialTestConditions,
} from '@/ingest/wire';
import { trialVerdict } from '@/ingest/words/trials';

export function toTrialTest(
  row: TrialTestRow,
  ranks: readonly RankRow[],
  conditions?: TrialTestConditions | null,
  photos: Photo[] = [],
): TrialTest {
  return {
    id: row.id,
    name: row.name,
    kind: row.kind,
    from: row.from.toISOString(),
    to: row.to.toISOString(),
    zoneId: row.zoneId,
    sensorId: row.sensorId,
    notes: row.notes,
    ranks: ranks
      .filter((r) => r.testId === row.id)
      .map((r) => ({ treatmentId: r.treatmentId, rank: r.rank })),
    photos,
    ...(conditions === undefined ? {} : { conditions }),
  };
}

export function toStandings(
  treatments: readonly TreatmentRow[],
  tests: readonly TrialTestRow[],
  ranks: readonly RankRow[],
): TrialStandings {
  const rows: number[][] = [];
  for (const test of tests) {
    const byTreatment = new Map(
      ranks.filter((r) => r.testId === test.id).map((r) => [r.treatmentId, r.rank]),
    );
    const row = treatments.map((t) => byTreatment.get(t.id));
    if (row.every((rank) => rank !== undefined)) rows.push(row as number[]);
  }
  const s = trialStandings(rows, treatments.length);
  const idOf = (position: number) => treatments[position]!.id;
  return {
    tests: s.tests,
    rankTotals: s.rankTotals.map((r) => ({
      treatmentId: idOf(r.treatment),
      total: r.total,
      meanRank: r.meanRank,
    })),
    friedman: s.friedman,
    kendallW: s.kendallW,
    pairs: s.pairs.map((p) => ({
      better: idOf(p.better),
      worse: idOf(p.worse),
      z: p.z,
      p: p.p,
      adjustedP: p.adjustedP,
      differs: p.differs,
    })),
    verdict: trialVerdict(
      s,
      treatments.map((t) => t.name),
    ),
  };
}

export function toTrial(
  trial: TrialRow,
  treatments: readonly TreatmentRow[],
  tests: readonly TrialTestRow[],
  ranks: readonly RankRow[],
  conditions: ReadonlyMap<string, TrialTestConditions | null> = new Map(),
  photos: ReadonlyMap<string, Photo[]> = new Map(),
): Trial {
  return {
    id: trial.id,
    name: trial.name,
    createdAt: trial.createdAt.toISOString(),
    treatments: treatments.map((t) => ({ id: t.id, name: t.name })),
    tests: tests.map((t) =>
      toTrialTest(t, ranks, t.zoneId ? (conditions.get(t.id) ?? null) : null, photos.get(t.id)),
    ),
    standings: toStandings(treatments, tests, ranks),
  };
}

export function toTrialSummary(
  trial: TrialRow & { tests: number },
  treatments: readonly TreatmentRow[],
): TrialSummary {
  return {
    id: trial.id,
    name: trial.name,
    createdAt: trial.createdAt.toISOString(),
    treatments: treatments
      .filter((t) => t.trialId === trial.id)
      .map((t) => ({ id: t.id, name: t.name })),
    tests: trial.tests,
  };
}
