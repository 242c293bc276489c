/**
 * A logger file's lines as readings: which delimiter splits it and whether its first line names
 * the columns (`sniffCsv`, from the head of the file), then each line's cells through the chosen
 * columns, unit and time format (`readImportRow`). The per-reading checks and derived values are
 * the live ones (derive.ts `deriveAir`); `rowReasonOf` names their refusals in import words.
 */
import { createTimeReader, type ReadTime } from './importTime';
import type { Rejection, SensorReading } from './payload';
import { fToC } from './units';
import type { ImportMapping } from './wire/imports';
import type { ImportRowReason } from './words/importReasons';

/** The delimiters a logger's CSV export uses, in the order they win a tie. */
export const IMPORT_DELIMITERS = [',', ';', '\t', '|'] as const;
export type ImportDelimiter = (typeof IMPORT_DELIMITERS)[number];

/** Splits one line on `delimiter` outside double quotes ("a ""b""" is one cell `a "b"`). */
export function splitCsvLine(line: string, delimiter: string): string[] {
  const cells: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!;
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"' && cell.trim() === '') {
      quoted = true;
      cell = '';
    } else if (ch === delimiter) {
      cells.push(cell);
      cell = '';
    } else cell += ch;
  }
  cells.push(cell);
  return cells;
}

/**
 * The delimiter that splits the sample's lines into the same number (≥ 2) of cells most often,
 * the most cells winning a tie; null when none splits the header (a "wrong delimiter" file).
 */
export function detectDelimiter(lines: readonly string[]): ImportDelimiter | null {
  let best: { delimiter: ImportDelimiter; score: number; cells: number } | null = null;
  const sample = lines.filter((l) => l.trim() !== '').slice(0, 20);
  if (sample.length === 0) return null;
  for (const delimiter of IMPORT_DELIMITERS) {
    const headerCells = splitCsvLine(sample[0]!, delimiter).length;
    if (headerCells < 2) continue;
    const score = sample.filter((l) => splitCsvLine(l, delimiter).length === headerCells).length;
    if (!best || score > best.score || (score === best.score && headerCells > best.cells)) {
      best = { delimiter, score, cells: headerCells };
    }
  }
  return best?.delimiter ?? null;
}

// A data cell: a number, or a date or time (starts with a digit, a sign or a point).
const LOOKS_LIKE_DATA = /^[+\-.]?\d/;

/** True when the first line names columns: some cell is a name, not a number or a time. */
export function isHeaderLine(cells: readonly string[]): boolean {
  return cells.some((c) => {
    const t = c.trim();
    return t !== '' && !LOOKS_LIKE_DATA.test(t);
  });
}

/** Where each chosen column sits in a line, and how its cells are read. */
export interface ColumnPlan {
  time: number;
  air: number;
  rh: number;
  surface: number | null;
  /** Cells a line must have: the header's count. */
  columnCount: number;
  /** A decimal comma is read as a point when the cells are not split on commas. */
  decimalComma: boolean;
  mapping: ImportMapping;
  /** The time format and zone's reader (importTime.ts), made once per file. */
  readTime: (cell: string) => ReadTime | null;
}

/** The plan for a header, or the first chosen column the header lacks. */
export function planColumns(
  header: readonly string[],
  mapping: ImportMapping,
  delimiter: string,
): { ok: true; plan: ColumnPlan } | { ok: false; missing: string } {
  const names = header.map((h) => h.trim());
  const at = (name: string) => names.indexOf(name.trim());
  const chosen = [mapping.timeColumn, mapping.airColumn, mapping.rhColumn];
  if (mapping.surfaceColumn !== null) chosen.push(mapping.surfaceColumn);
  const missing = chosen.find((c) => at(c) < 0);
  if (missing !== undefined) return { ok: false, missing };
  return {
    ok: true,
    plan: {
      time: at(mapping.timeColumn),
      air: at(mapping.airColumn),
      rh: at(mapping.rhColumn),
      surface: mapping.surfaceColumn === null ? null : at(mapping.surfaceColumn),
      columnCount: header.length,
      decimalComma: delimiter !== ',',
      mapping,
      readTime: createTimeReader(mapping.timeFormat, mapping.timeZone),
    },
  };
}

const NUMBER = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** A cell as a number; NaN when it is not one (an empty cell is not a number either). */
export function readNumber(cell: string, decimalComma: boolean): number {
  let t = cell.trim();
  if (decimalComma) t = t.replace(',', '.');
  return NUMBER.test(t) ? Number(t) : NaN;
}

export type RowVerdict =
  | { ok: true; time: ReadTime; reading: Omit<SensorReading, 'atMs'> }
  | { ok: false; reason: ImportRowReason };

/**
 * One line's cells as a reading (°C, %; the time still to be placed across a clock change by
 * `resolveFold`), or why it cannot be one. An empty surface cell means no probe value on that
 * line: the surface is estimated as for a live reading without one.
 */
export function readImportRow(cells: readonly string[], plan: ColumnPlan): RowVerdict {
  if (cells.length !== plan.columnCount) return { ok: false, reason: 'column_count' };
  const { mapping } = plan;
  const time = plan.readTime(cells[plan.time]!);
  if (!time) return { ok: false, reason: 'time_unreadable' };
  const air = readNumber(cells[plan.air]!, plan.decimalComma);
  if (Number.isNaN(air)) return { ok: false, reason: 'air_unreadable' };
  const rh = readNumber(cells[plan.rh]!, plan.decimalComma);
  if (Number.isNaN(rh)) return { ok: false, reason: 'rh_unreadable' };
  let surface: number | null = null;
  if (plan.surface !== null && cells[plan.surface]!.trim() !== '') {
    surface = readNumber(cells[plan.surface]!, plan.decimalComma);
    if (Number.isNaN(surface)) return { ok: false, reason: 'surface_unreadable' };
  }
  const toC = (v: number) => (mapping.temperatureUnit === 'F' ? fToC(v) : v);
  return {
    ok: true,
    time,
    reading: {
      airC: toC(air),
      rhPct: rh,
      surfaceC: surface === null ? null : toC(surface),
      batteryV: null,
    },
  };
}

/** The live checks' refusal (payload.ts `checkReading`, derive.ts) as an import reason. */
export function rowReasonOf(rejection: Rejection): ImportRowReason {
  switch (rejection.code) {
    case 'time_too_early':
    case 'time_in_future':
    case 'rh_out_of_range':
    case 'air_out_of_range':
    case 'surface_out_of_range':
    case 'not_computable':
      return rejection.code;
    // An import never sends a battery or a field of its own; a time that is no date was
    // caught when the cell was read.
    default:
      return 'time_unreadable';
  }
}
