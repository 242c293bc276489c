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

import { ApiError, NETWORK_ERROR_STATUS, apiRequest, parseErrorBody } from './api';
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

/** A downloaded report: its bytes and the name the server gave it. */
export interface ReportFile {
  blob: Blob;
  /** From Content-Disposition; null when the server named none. */
  filename: string | null;
}

/**
 * The CSV or PDF of a week, fetched with the session cookie. A failure becomes an ApiError with
 * the server's sentence, as every other request does.
 */
export async function fetchWeekReportFile(
  shopId: string,
  start: string,
  format: Exclude<ReportFormat, 'json'>,
): Promise<ReportFile> {
  let response: Response;
  try {
    response = await fetch(weekReportPath(shopId, start, format), {
      credentials: 'same-origin',
      headers: { Accept: format === 'csv' ? 'text/csv' : 'application/pdf' },
    });
  } catch {
    throw new ApiError(
      NETWORK_ERROR_STATUS,
      'network',
      'Drybench cannot be reached. Check the connection and try again.',
    );
  }
  if (!response.ok) {
    let body: unknown = undefined;
    try {
      body = JSON.parse(await response.text());
    } catch {
      body = undefined;
    }
    throw parseErrorBody(response.status, body);
  }
  return {
    blob: await response.blob(),
    filename: filenameFromDisposition(response.headers.get('Content-Disposition')),
  };
}

/**
 * The file name in a Content-Disposition header (RFC 6266): the UTF-8 `filename*` when given,
 * else the plain `filename`, quoted or not. Any path is cut off, so a name never climbs folders.
 */
export function filenameFromDisposition(header: string | null): string | null {
  if (!header) return null;
  let name: string | null = null;
  const extended = /filename\*\s*=\s*([^']*)'[^']*'([^;]+)/i.exec(header);
  if (extended) {
    try {
      name = decodeURIComponent(extended[2]!.trim().replace(/^"|"$/g, ''));
    } catch {
      name = null;
    }
  }
  if (name === null) {
    const plain = /filename\s*=\s*(?:"((?:[^"\\]|\\.)*)"|([^;]+))/i.exec(header);
    if (plain) name = plain[1] !== undefined ? plain[1].replace(/\\(.)/g, '$1') : plain[2]!.trim();
  }
  const base = name?.split(/[\\/]/).pop()?.trim();
  return base ? base : null;
}
