/**
 * The week report as the API answers it: GET /shops/:shopId/reports/week?start=YYYY-MM-DD.
 * Numbers in °C, K, %, hours and minutes whatever the reader's unit (the API speaks °C); only
 * the sentences (`verdict`, `week.note`) are written in the reader's unit, named in `unit`.
 * The CSV and the PDF are made from this same object, so the three never disagree.
 */
import type { AlarmKind } from '../alarmKinds';
import type { TowCategory } from '../wetness';

import type { UnitPref } from './people';
import type { ZonePurpose } from './zones';

export const REPORT_FORMATS = ['json', 'csv', 'pdf'] as const;
export type ReportFormat = (typeof REPORT_FORMATS)[number];

/** The sheet the PDF is laid out on: a shop setting (PATCH /shops/:shopId `paperSize`). */
export const PAPER_SIZES = ['a4', 'letter'] as const;
export type PaperSize = (typeof PAPER_SIZES)[number];

/** Lowest, time-weighted mean and highest; all null when the zone sent nothing usable. */
export interface MinMeanMax {
  min: number | null;
  mean: number | null;
  max: number | null;
}

/**
 * Hours in each level from `week.from` to `week.periodEnd` (gaps count as unknown): they add up
 * to `week.hours` for a past week and to the hours so far for the current one.
 */
export interface LevelHours {
  dry: number;
  close: number;
  wet: number;
  unknown: number;
}

/** Alarms of the zone opened inside the week, and how fast people acknowledged them. */
export interface AlarmWeekFigures {
  opened: number;
  openedByKind: Record<AlarmKind, number>;
  acknowledged: number;
  /** Of those acknowledged; null when none was. */
  medianAckMinutes: number | null;
  longestAckMinutes: number | null;
  /** Opened in the week and still not acknowledged when the report was made. */
  unacknowledged: number;
}

/** A stretch with no reading for longer than the gap cap (ingest/wetness.ts TOW_MAX_GAP_MS). */
export interface SilentPeriod {
  from: string;
  to: string;
  hours: number;
}

export interface TimeOfWetnessFigures {
  /** ISO 9223: hours with RH > 80 % and air > 0 °C, readings weighted by their interval. */
  hours: number;
  /** The week's wet fraction of covered time, over a year (8,760 h); null without coverage. */
  annualHours: number | null;
  /** ISO 9223:1992 Table 1 category of `annualHours`; an indication from one week only. */
  category: TowCategory | null;
}

export interface ZoneWeekFigures {
  zoneId: string;
  name: string;
  purpose: ZonePurpose;
  /** Readings in the period. */
  readings: number;
  /** Covered hours (each reading's interval, capped) over the period's hours, 0–100. */
  coveragePct: number;
  airC: MinMeanMax;
  rhPct: MinMeanMax;
  emcPct: MinMeanMax;
  /** The closest approach to the dew point (surface minus dew point, K) and when. */
  lowestMargin: { marginK: number; at: string } | null;
  levelHours: LevelHours;
  timeOfWetness: TimeOfWetnessFigures;
  alarms: AlarmWeekFigures;
  silentPeriods: SilentPeriod[];
  /** A few plain sentences written from the figures (ingest/words), in the reader's unit. */
  verdict: string;
}

/** The line on top: the whole shop at a glance. */
export interface ShopWeekFigures {
  zones: number;
  /** Covered hours of all zones over all zones' hours, 0–100. */
  coveragePct: number;
  /** The lowest margin of any zone, with its zone. */
  lowestMargin: { zoneId: string; zoneName: string; marginK: number; at: string } | null;
  /** Zones that spent any time wet. */
  zonesWet: number;
  wetHours: number;
  closeHours: number;
  alarmsOpened: number;
  medianAckMinutes: number | null;
  unacknowledged: number;
  verdict: string;
}

export interface WeekReport {
  shop: { id: string; name: string; timeZone: string; paperSize: PaperSize };
  week: {
    /** The Monday, shop-local, YYYY-MM-DD. */
    start: string;
    /** Monday 00:00 and the next Monday 00:00 in the shop's time zone, as instants (UTC). */
    from: string;
    to: string;
    /** 168, or 167 / 169 across a daylight-saving change. */
    hours: number;
    /** Figures cover [from, periodEnd): the report of the current week stops at its making. */
    periodEnd: string;
    /** Says when the week has 167 or 169 hours, else null. */
    note: string | null;
  };
  /** The unit the sentences use (the reader's). */
  unit: UnitPref;
  generatedAt: string;
  shopWide: ShopWeekFigures;
  zones: ZoneWeekFigures[];
}
