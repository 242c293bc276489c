/**
 * The zone history's words: the range switch, the humidity panel's labels and the readout of
 * one point (what the crosshair or keyboard points at). A point of a bucketed series stands for
 * many readings: its margin is shown as the bucket's mean with the lowest and highest in it, so
 * a two-minute dip inside a half-hour bucket is still read out.
 */
import type { TemperatureUnit } from '../units';
import { dewPointLabel } from './dewPoint';
import { formatMargin, formatPercent, formatTemperature } from './format';

export const HISTORY_WORDS = {
  rangeLabel: 'Span',
  customFrom: 'From',
  customTo: 'To',
  customShow: 'Show span',
  customHint: 'YYYY-MM-DD HH:MM',
  humidityHeading: 'Humidity and wood moisture',
  rhSeries: 'RH %',
  emcSeries: 'wood EMC %',
  marginBand: 'surface low–high',
  readoutHint: 'Point at the chart, or focus it and use the arrow keys, to read a point.',
} as const;

/** What the readout needs of a point (ingest/wire/readings.ts ReadingPoint). */
export interface ReadoutPoint {
  air: number;
  rh: number;
  surface: number | null;
  dewPoint: number | null;
  margin: number | null;
  marginMin: number | null;
  marginMax: number | null;
  emc: number | null;
  count: number;
}

/**
 * One point in words, in the reader's unit: "Tue 06:10 · air 18.2 °C · surface 9.1 °C · frost
 * point -2.4 °C · margin +0.7 °C (low -0.5 °C, high +1.2 °C) · RH 72 % · EMC 13.4 % · 40 readings".
 */
export function pointReadout(point: ReadoutPoint, unit: TemperatureUnit, clock: string): string {
  const parts = [
    clock,
    `air ${formatTemperature(point.air, unit)}`,
    `surface ${formatTemperature(point.surface, unit)}`,
    `${dewPointLabel(point.dewPoint)} ${formatTemperature(point.dewPoint, unit)}`,
  ];
  const low = formatMargin(point.marginMin, unit);
  const high = formatMargin(point.marginMax, unit);
  // A bucket's low and high, unless they read the same (a steady bucket, or one reading).
  const spread =
    point.count > 1 && point.marginMin !== null && point.marginMax !== null && low !== high
      ? ` (low ${low}, high ${high})`
      : '';
  parts.push(`margin ${formatMargin(point.margin, unit)}${spread}`);
  parts.push(`RH ${formatPercent(point.rh)}`, `EMC ${formatPercent(point.emc, 1)}`);
  if (point.count > 1) parts.push(`${point.count} readings`);
  return parts.join(' · ');
}
