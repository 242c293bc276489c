/**
 * Turns a zone's reading points into the chart's lines and bands. A gap in the data (a silent
 * sensor) becomes a break in every line rather than a straight line across the silence.
 */
import type { ReadingPoint } from '@/components/queries';
import { cToF, type TemperatureUnit } from '@/ingest/units';

export interface XY {
  x: Date;
  y: number | null;
}

export interface Band {
  x: Date;
  y: number | null;
  y0: number | null;
}

export interface ChartSeries {
  air: XY[];
  surface: XY[];
  dewPoint: XY[];
  /** From dew + wet limit up to dew + caution limit: the close colour. */
  closeBand: Band[];
  /** From the dew point up to dew + wet limit: the wet colour. */
  wetBand: Band[];
  /**
   * From dew + the bucket's lowest margin to dew + its highest: where the surface went inside
   * each bucket, so a short dip shows below the averaged surface line. Empty for raw readings.
   */
  marginBand: Band[];
  yDomain: [number, number];
  hasData: boolean;
}

const MIN_GAP_MS = 5 * 60_000;

/** Spacing above which two neighbouring points count as a silence, not a slope. */
export function gapThresholdMs(timesMs: number[], bucketSeconds: number): number {
  const steps: number[] = [];
  for (let i = 1; i < timesMs.length; i += 1) steps.push(timesMs[i]! - timesMs[i - 1]!);
  steps.sort((a, b) => a - b);
  const median = steps.length ? steps[Math.floor(steps.length / 2)]! : 0;
  return Math.max(MIN_GAP_MS, 3 * median, 2.5 * bucketSeconds * 1000);
}

export function chartSeries(
  points: ReadingPoint[],
  limits: { wetK: number; cautionK: number },
  bucketSeconds = 0,
): ChartSeries {
  const times = points.map((p) => Date.parse(p.at));
  const gapMs = gapThresholdMs(times, bucketSeconds);
  const series: ChartSeries = {
    air: [],
    surface: [],
    dewPoint: [],
    closeBand: [],
    wetBand: [],
    marginBand: [],
    yDomain: [0, 20],
    hasData: points.length > 0,
  };
  let low = Infinity;
  let high = -Infinity;
  const see = (value: number | null) => {
    if (value === null || !Number.isFinite(value)) return;
    low = Math.min(low, value);
    high = Math.max(high, value);
  };

  points.forEach((point, i) => {
    const t = times[i]!;
    const previous = i > 0 ? times[i - 1]! : null;
    if (previous !== null && t - previous > gapMs) {
      const x = new Date(previous + (t - previous) / 2);
      series.air.push({ x, y: null });
      series.surface.push({ x, y: null });
      series.dewPoint.push({ x, y: null });
      series.closeBand.push({ x, y: null, y0: null });
      series.wetBand.push({ x, y: null, y0: null });
      if (bucketSeconds > 0) series.marginBand.push({ x, y: null, y0: null });
    }
    const x = new Date(t);
    const dew = point.dewPoint;
    series.air.push({ x, y: point.air });
    series.surface.push({ x, y: point.surface });
    series.dewPoint.push({ x, y: dew });
    // The band is drawn with the zone's limits of today; a point's level is the one stored with
    // it when it arrived (ingest/derive.ts), so changing the limits never rewrites history.
    series.closeBand.push(
      dew === null
        ? { x, y: null, y0: null }
        : { x, y: dew + limits.cautionK, y0: dew + limits.wetK },
    );
    series.wetBand.push(
      dew === null ? { x, y: null, y0: null } : { x, y: dew + limits.wetK, y0: dew },
    );
    if (bucketSeconds > 0) {
      const low = point.marginMin ?? point.margin;
      const high = point.marginMax ?? point.margin;
      series.marginBand.push(
        dew === null || low === null || high === null
          ? { x, y: null, y0: null }
          : { x, y: dew + high, y0: dew + low },
      );
      see(dew === null || low === null ? null : dew + low);
      see(dew === null || high === null ? null : dew + high);
    }
    see(point.air);
    see(point.surface);
    see(dew);
    see(dew === null ? null : dew + limits.cautionK);
  });

  if (Number.isFinite(low) && Number.isFinite(high)) {
    const pad = Math.max(1, (high - low) * 0.08);
    series.yDomain = [Math.floor(low - pad), Math.ceil(high + pad)];
  }
  return series;
}

/**
 * The series in the person's unit. Every line and band edge is an absolute temperature (the
 * bands are dew point + a limit), so each converts on its own; the domain is widened to whole
 * degrees again.
 */
export function seriesInUnit(series: ChartSeries, unit: TemperatureUnit): ChartSeries {
  if (unit === 'C') return series;
  const f = (v: number | null) => (v === null ? null : cToF(v));
  const line = (xs: XY[]) => xs.map((p) => ({ x: p.x, y: f(p.y) }));
  const band = (xs: Band[]) => xs.map((p) => ({ x: p.x, y: f(p.y), y0: f(p.y0) }));
  return {
    air: line(series.air),
    surface: line(series.surface),
    dewPoint: line(series.dewPoint),
    closeBand: band(series.closeBand),
    wetBand: band(series.wetBand),
    marginBand: band(series.marginBand),
    yDomain: [Math.floor(cToF(series.yDomain[0])), Math.ceil(cToF(series.yDomain[1]))],
    hasData: series.hasData,
  };
}

/** The index of the time in `timesMs` (ascending) nearest to `atMs`; -1 for none. */
export function nearestIndex(timesMs: readonly number[], atMs: number): number {
  if (timesMs.length === 0) return -1;
  let lo = 0;
  let hi = timesMs.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (timesMs[mid]! < atMs) lo = mid + 1;
    else hi = mid;
  }
  if (lo > 0 && atMs - timesMs[lo - 1]! <= timesMs[lo]! - atMs) return lo - 1;
  return lo;
}
