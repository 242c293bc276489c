/**
 * A shop's week report: GET /api/v1/shops/:shopId/reports/week?start=YYYY-MM-DD&format=…
 * The JSON answer is cached per week and unit (its sentences are written in the reader's
 * unit); the CSV and PDF are files, fetched on request with the session and never cached. The
 * zones' week charts read the readings route over the report's own instants, under keys of
 * their own so live readings (which patch the sliding 24 h windows) never touch a past week.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';

import type { ReadingsResponse } from '@/ingest/wire';
import type { UnitPref } from '@/ingest/wire/people';
import type { ReportFormat, WeekReport } from '@/ingest/wire/reports';

import { apiRequest } from './api';
import { fetchFile, type DownloadedFile } from './files';
import { shopPath } from './shops';
import { zonePath } from './zones';

export type {
  AlarmWeekFigures,
  LevelHours,
  MinMeanMax,
  ReportFormat,
  ShopWeekFigures,
  SilentPeriod,
  TimeOfWetnessFigures,
  WeekReport,
  ZoneWeekFigures,
} from '@/ingest/wire/reports';

/** A week chart's points: one per half hour of a 168 h week, finer than a phone can draw. */
export const WEEK_CHART_POINTS = 336;

export const reportKeys = {
  all: ['reports'] as const,
  shop: (shopId: string) => [...reportKeys.all, shopId] as const,
  /** `start` null: the week the server picks (the last complete one). */
  week: (shopId: string, start: string | null, unit: UnitPref) =>
    [...reportKeys.shop(shopId), 'week', start ?? 'last', unit] as const,
  readings: (shopId: string, zoneId: string, fromIso: string, toIso: string) =>
    [...reportKeys.shop(shopId), 'readings', zoneId, fromIso, toIso] as const,
};

/** The report's address; without `start` the server answers for the last complete week. */
export function weekReportPath(shopId: string, start: string | null, format: ReportFormat) {
  const params = new URLSearchParams();
  if (start) params.set('start', start);
  if (format !== 'json') params.set('format', format);
  const query = params.toString();
  return `${shopPath(shopId)}/reports/week${query ? `?${query}` : ''}`;
}

export function weekReportQueryOptions(shopId: string, start: string | null, unit: UnitPref) {
  return queryOptions({
    queryKey: reportKeys.week(shopId, start, unit),
    queryFn: ({ signal }) =>
      apiRequest<WeekReport>(weekReportPath(shopId, start, 'json'), { signal }),
    // A past week no longer changes; the current one is re-read when the screen comes back.
    staleTime: 60_000,
  });
}

export function useWeekReportQuery(shopId: string, start: string | null, unit: UnitPref) {
  return useQuery(weekReportQueryOptions(shopId, start, unit));
}

export function weekReadingsQueryOptions(
  shopId: string,
  zoneId: string,
  fromIso: string,
  toIso: string,
) {
  return queryOptions({
    queryKey: reportKeys.readings(shopId, zoneId, fromIso, toIso),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({
        from: fromIso,
        to: toIso,
        points: String(WEEK_CHART_POINTS),
      });
      return apiRequest<ReadingsResponse>(
        `${zonePath(shopId, zoneId)}/readings?${params.toString()}`,
        { signal },
      );
    },
    staleTime: 5 * 60_000,
  });
}

export function useWeekReadingsQuery(
  shopId: string,
  zoneId: string,
  fromIso: string,
  toIso: string,
) {
  return useQuery(weekReadingsQueryOptions(shopId, zoneId, fromIso, toIso));
}

/**
 * The CSV or PDF of a week, fetched with the session cookie. A failure becomes an ApiError with
 * the server's sentence, as every other request does.
 */
export function fetchWeekReportFile(
  shopId: string,
  start: string,
  format: Exclude<ReportFormat, 'json'>,
): Promise<DownloadedFile> {
  return fetchFile(weekReportPath(shopId, start, format), format);
}
