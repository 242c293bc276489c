/**
 * The week report of a shop: figures from SQL aggregates (db/queries/reports.ts), words from
 * ingest/words/report.ts, in the wire shape (ingest/wire/reports.ts) that the JSON, the CSV, the
 * PDF and the Monday e-mail all start from.
 */
import type { Db } from '@/db';
import { querySeries } from '@/db/queries/readings';
import {
  alarmWeekFigures,
  reportShop,
  reportZones,
  zoneWeekFigures,
  type AlarmWeekRow,
} from '@/db/queries/reports';
import { ALARM_KINDS, type AlarmKind } from '@/ingest/alarmKinds';
import { weekBounds, type WeekFigures } from '@/ingest/reportWeek';
import { annualWetHours, towCategory, TOW_MAX_GAP_MS } from '@/ingest/wetness';
import type { UnitPref } from '@/ingest/wire/people';
import type { ReadingPoint } from '@/ingest/wire/readings';
import type { AlarmWeekFigures, WeekReport, ZoneWeekFigures } from '@/ingest/wire/reports';
import { shopVerdict, weekNote, zoneVerdict } from '@/ingest/words/report';
import { toReadingPoint } from '@/server/wire/readings';

const HOUR_MS = 3_600_000;
/** The chart points per zone: the same cap as the app's history chart. */
export const REPORT_SERIES_POINTS = 500;

export interface WeekReportInput {
  shopId: string;
  /** The Monday, shop-local, YYYY-MM-DD. */
  start: string;
  unit: UnitPref;
  now: Date;
}

type SqlFigures = Omit<WeekFigures, 'periodMs' | 'annualWetHours'>;

/** A zone that sent nothing in the period: no coverage, nulls, every hour unknown, silent. */
function emptyFigures(fromMs: number, endMs: number): SqlFigures {
  const none = { min: null, mean: null, max: null };
  return {
    readings: 0,
    coveredMs: 0,
    airC: none,
    rhPct: none,
    emcPct: none,
    lowestMargin: null,
    levelMs: { dry: 0, close: 0, wet: 0, unknown: endMs - fromMs },
    wetnessMs: 0,
    silentPeriods: endMs > fromMs ? [{ fromMs, toMs: endMs }] : [],
  };
}

function alarmFigures(row: AlarmWeekRow | undefined): AlarmWeekFigures {
  const openedByKind = Object.fromEntries(
    ALARM_KINDS.map((kind) => [kind, row?.openedByKind[kind] ?? 0]),
  ) as Record<AlarmKind, number>;
  return {
    opened: row?.opened ?? 0,
    openedByKind,
    acknowledged: row?.acknowledged ?? 0,
    medianAckMinutes: row?.medianAckMinutes ?? null,
    longestAckMinutes: row?.longestAckMinutes ?? null,
    unacknowledged: row?.unacknowledged ?? 0,
  };
}

const iso = (ms: number) => new Date(ms).toISOString();

/**
 * Zones per statement: a week of 1-minute data is ~10,000 rows a zone and one statement runs on
 * one core, so a shop's zones are split over a few connections that PostgreSQL runs side by
 * side (measured: 10 zones' week ~120 ms of CPU in one statement).
 */
const ZONES_PER_STATEMENT = 4;

async function figuresInParallel(
  db: Db,
  zoneIds: string[],
  period: Parameters<typeof zoneWeekFigures>[2],
) {
  const groups: string[][] = [];
  for (let i = 0; i < zoneIds.length; i += ZONES_PER_STATEMENT) {
    groups.push(zoneIds.slice(i, i + ZONES_PER_STATEMENT));
  }
  const parts = await Promise.all(groups.map((ids) => zoneWeekFigures(db, ids, period)));
  return new Map(parts.flatMap((part) => [...part]));
}

/** Null when the shop does not exist. */
export async function buildWeekReport(db: Db, input: WeekReportInput): Promise<WeekReport | null> {
  const shop = await reportShop(db, input.shopId);
  if (!shop) return null;
  const week = weekBounds(input.start, shop.timeZone);
  const nowMs = input.now.getTime();
  // The current week stops at the time of making; a future week would have no period at all.
  const endMs = Math.max(week.fromMs, Math.min(week.toMs, nowMs));
  const periodMs = endMs - week.fromMs;
  const zones = await reportZones(db, shop.id);
  const [figures, alarms] = await Promise.all([
    figuresInParallel(
      db,
      zones.map((z) => z.id),
      { fromMs: week.fromMs, endMs, maxGapMs: TOW_MAX_GAP_MS },
    ),
    alarmWeekFigures(db, shop.id, { fromMs: week.fromMs, endMs, nowMs }),
  ]);
  const alarmsByZone = new Map(alarms.zones.map((a) => [a.zoneId, a]));

  const zoneFigures = zones.map((zone): ZoneWeekFigures => {
    const f = figures.get(zone.id) ?? emptyFigures(week.fromMs, endMs);
    const annualHours = annualWetHours({ wetMs: f.wetnessMs, coveredMs: f.coveredMs });
    const withoutVerdict: Omit<ZoneWeekFigures, 'verdict'> = {
      zoneId: zone.id,
      name: zone.name,
      purpose: zone.purpose,
      readings: f.readings,
      coveragePct: periodMs > 0 ? (f.coveredMs / periodMs) * 100 : 0,
      airC: f.airC,
      rhPct: f.rhPct,
      emcPct: f.emcPct,
      lowestMargin: f.lowestMargin
        ? { marginK: f.lowestMargin.marginK, at: iso(f.lowestMargin.atMs) }
        : null,
      levelHours: {
        dry: f.levelMs.dry / HOUR_MS,
        close: f.levelMs.close / HOUR_MS,
        wet: f.levelMs.wet / HOUR_MS,
        unknown: f.levelMs.unknown / HOUR_MS,
      },
      timeOfWetness: {
        hours: f.wetnessMs / HOUR_MS,
        annualHours,
        category: annualHours === null ? null : towCategory(annualHours),
      },
      alarms: alarmFigures(alarmsByZone.get(zone.id)),
      silentPeriods: f.silentPeriods.map((p) => ({
        from: iso(p.fromMs),
        to: iso(p.toMs),
        hours: (p.toMs - p.fromMs) / HOUR_MS,
      })),
    };
    return { ...withoutVerdict, verdict: zoneVerdict(withoutVerdict, input.unit, shop.timeZone) };
  });

  // The shop's lowest margin: the lowest of any zone, the earlier one on a tie.
  const lowest = zoneFigures
    .filter((z) => z.lowestMargin !== null)
    .sort(
      (a, b) =>
        a.lowestMargin!.marginK - b.lowestMargin!.marginK ||
        a.lowestMargin!.at.localeCompare(b.lowestMargin!.at),
    )[0];
  const coveredMs = zoneFigures.reduce((sum, z) => sum + (z.coveragePct / 100) * periodMs, 0);
  const shopWide = {
    zones: zones.length,
    coveragePct:
      zones.length > 0 && periodMs > 0 ? (coveredMs / (zones.length * periodMs)) * 100 : 0,
    lowestMargin: lowest?.lowestMargin
      ? {
          zoneId: lowest.zoneId,
          zoneName: lowest.name,
          marginK: lowest.lowestMargin.marginK,
          at: lowest.lowestMargin.at,
        }
      : null,
    zonesWet: zoneFigures.filter((z) => z.levelHours.wet > 0).length,
    wetHours: zoneFigures.reduce((sum, z) => sum + z.levelHours.wet, 0),
    closeHours: zoneFigures.reduce((sum, z) => sum + z.levelHours.close, 0),
    alarmsOpened: alarms.shop.opened,
    medianAckMinutes: alarms.shop.medianAckMinutes,
    unacknowledged: alarms.shop.unacknowledged,
  };

  return {
    shop: { id: shop.id, name: shop.name, timeZone: shop.timeZone, paperSize: shop.paperSize },
    week: {
      start: week.start,
      from: iso(week.fromMs),
      to: iso(week.toMs),
      hours: week.hours,
      periodEnd: iso(endMs),
      note: weekNote(week.start, shop.timeZone),
    },
    unit: input.unit,
    generatedAt: input.now.toISOString(),
    shopWide: { ...shopWide, verdict: shopVerdict(shopWide, input.unit, shop.timeZone) },
    zones: zoneFigures,
  };
}

/**
 * Each zone's series over the report's week, as the app's history chart gets it (querySeries,
 * at most REPORT_SERIES_POINTS points): the PDF's small charts and the Report screen draw these.
 */
export async function weekReportSeries(
  db: Db,
  report: WeekReport,
): Promise<Map<string, ReadingPoint[]>> {
  const from = new Date(report.week.from);
  const to = new Date(report.week.periodEnd);
  const entries = await Promise.all(
    report.zones.map(async (zone) => {
      const series = await querySeries(db, {
        zoneId: zone.zoneId,
        from,
        to,
        points: REPORT_SERIES_POINTS,
      });
      return [zone.zoneId, series.rows.map(toReadingPoint)] as const;
    }),
  );
  return new Map(entries);
}
