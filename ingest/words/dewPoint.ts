/**
 * What to call the temperature a surface collects water at. ingest/psychrometrics.ts returns the
 * dew point over liquid water, and below the triple point (0.01 °C) the frost point over ice,
 * following ASHRAE Handbook — Fundamentals 2017, ch. 1, eq. 5 and 6 (Hyland–Wexler 1983). The
 * wire carries only the value, so the word follows from the value and the same switch point:
 * below 0.01 °C it is a frost point.
 */
import { TRIPLE_POINT_C } from '../psychrometrics';

export type DewPointWord = 'dew point' | 'frost point';

// At exactly 100 % RH and 0.01 °C air the inversion over water returns 0.01 °C less 7e-14 K.
// Within a micro-kelvin of the triple point dew and frost point are the same temperature, so
// the word there follows the water side, as psychrometrics.ts does at the switch itself.
const SWITCH_TOLERANCE_K = 1e-6;

/** "frost point" below the triple point, else "dew point" (also when the value is unknown). */
export function dewPointLabel(dewPointC: number | null | undefined): DewPointWord {
  return dewPointC !== null &&
    dewPointC !== undefined &&
    Number.isFinite(dewPointC) &&
    dewPointC < TRIPLE_POINT_C - SWITCH_TOLERANCE_K
    ? 'frost point'
    : 'dew point';
}

/**
 * The word for a series of values (a chart's line): "frost point" when every known value is
 * one, "dew / frost point" when the series crosses the switch, else "dew point".
 */
export function dewPointSeriesLabel(
  dewPointsC: readonly (number | null | undefined)[],
): 'dew point' | 'frost point' | 'dew / frost point' {
  const words = new Set(
    dewPointsC
      .filter((v): v is number => v !== null && v !== undefined && Number.isFinite(v))
      .map(dewPointLabel),
  );
  if (words.size === 2) return 'dew / frost point';
  return words.has('frost point') ? 'frost point' : 'dew point';
}

/** "Dew point" / "Frost point", for a label at the start of a line. */
export function capitalised(words: string): string {
  return words.charAt(0).toUpperCase() + words.slice(1);
}
