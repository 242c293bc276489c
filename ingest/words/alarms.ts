/**
 * Alarms in plain words, the same in the app and in e-mail: the kind's name, the headline
 * ("Machine room: wet in about 40 min"), what happened in a sentence or two, and the numbers
 * behind it, in the reader's temperature unit. Pure: times come in already written in the shop's
 * time zone (the callers own the time-zone library), values come in as numbers.
 */
import { isSensorKind, type AlarmKind } from '../alarmKinds';
import type { TemperatureUnit } from '../units';
import type { SurfaceSource } from '../wire/levels';
import type { Level } from '../wire/levels';
import { capitalised, dewPointLabel } from './dewPoint';
import { formatMargin, formatPercent, formatTemperature, formatVolts } from './format';
import { levelWordInline } from './levels';

export const ALARM_KIND_WORDS: Record<AlarmKind, string> = {
  dew_risk: 'Dew risk',
  wet_surface: 'Wet surface',
  humid_air: 'Humid air',
  sensor_silent: 'Sensor silent',
  battery_low: 'Battery low',
};

/** An alarm's values as the words need them (margins K, RH %, battery V). */
export interface AlarmFacts {
  kind: AlarmKind;
  cleared: boolean;
  zoneName: string;
  sensorName: string | null;
  minutesToWet: number | null;
  worstMarginK: number | null;
  latestMarginK: number | null;
  peakRhPct: number | null;
  latestRhPct: number | null;
  lowestBatteryV: number | null;
  latestBatteryV: number | null;
}

/** The reading behind an alarm (°C, K, %, V). */
export interface ReadingFacts {
  airC: number;
  rhPct: number;
  surfaceC: number | null;
  surfaceSource: SurfaceSource | null;
  dewPointC: number | null;
  marginK: number | null;
  batteryV: number | null;
}

export interface AlarmWordsContext {
  unit: TemperatureUnit;
  /** When the condition began, as a clock in the shop's zone: "06:12". */
  since: string;
  /** The same with its date, for text read later (a mail): "06:12 on Tue 3 Mar". */
  sinceWithDate?: string;
  /** The reading's dew (or frost) point, °C, when one is known: it names the point. */
  dewPointC?: number | null;
}

/** "about 40 min": whole minutes under 10, then steps of 5 (a trend fit is no finer), then half hours. */
export function aboutMinutes(minutes: number): string {
  if (minutes < 10) return `about ${Math.max(1, Math.round(minutes))} min`;
  if (minutes < 90) return `about ${Math.round(minutes / 5) * 5} min`;
  return `about ${(Math.round(minutes / 30) / 2).toFixed(1).replace(/\.0$/, '')} h`;
}

/** What the alarm is about: the zone, or the sensor for the sensor kinds. */
export function alarmSubject(a: Pick<AlarmFacts, 'kind' | 'zoneName' | 'sensorName'>): string {
  if (!isSensorKind(a.kind)) return a.zoneName;
  return a.sensorName ?? `A sensor in ${a.zoneName}`;
}

/**
 * One line: what is wrong, where, and how bad; with the shop's name it is a mail's subject. A
 * cleared alarm names only what it was: its values at the clear would read as if the iron were
 * still wet.
 */
export function alarmHeadline(a: AlarmFacts, ctx: AlarmWordsContext): string {
  const subject = alarmSubject(a);
  if (a.cleared) {
    return a.kind === 'sensor_silent'
      ? `${subject} was silent`
      : `${subject}: ${ALARM_KIND_WORDS[a.kind].toLowerCase()}`;
  }
  switch (a.kind) {
    // Without a latest value (the screen shows the zone's current one on its own line) the
    // headline names only the condition, so it never quotes a number that is no longer true.
    case 'dew_risk':
      if (a.minutesToWet !== null && a.minutesToWet > 0) {
        return `${subject}: wet in ${aboutMinutes(a.minutesToWet)}`;
      }
      return a.latestMarginK === null
        ? `${subject}: dew risk`
        : `${subject}: dew risk, margin ${formatMargin(a.latestMarginK, ctx.unit)}`;
    case 'wet_surface':
      return a.latestMarginK === null
        ? `${subject}: wet`
        : `${subject}: wet, margin ${formatMargin(a.latestMarginK, ctx.unit)}`;
    case 'humid_air':
      return a.latestRhPct === null
        ? `${subject}: humid air since ${ctx.since}`
        : `${subject}: humid air since ${ctx.since}, ${formatPercent(a.latestRhPct)} RH`;
    case 'sensor_silent':
      return `${subject} silent since ${ctx.since}`;
    case 'battery_low':
      return `${subject}: battery low, ${formatVolts(a.latestBatteryV)}`;
  }
}

/** What happened, in a sentence or two. */
export function alarmStory(a: AlarmFacts, ctx: AlarmWordsContext): string {
  const zone = a.zoneName;
  const subject = alarmSubject(a);
  const margin = formatMargin(a.latestMarginK, ctx.unit);
  switch (a.kind) {
    case 'dew_risk':
      return a.minutesToWet !== null && a.minutesToWet > 0
        ? `The dew margin in ${zone} is falling: at this rate the iron reaches the wet limit in ${aboutMinutes(a.minutesToWet)}, before water condenses on it.`
        : `The iron in ${zone} is close to the ${dewPointLabel(ctx.dewPointC)}: the dew margin is ${margin}, inside the caution limit.`;
    case 'wet_surface': {
      const water =
        dewPointLabel(ctx.dewPointC) === 'frost point'
          ? 'frost may be forming'
          : 'water may be condensing';
      return `The iron in ${zone} is at or below the wet limit since ${ctx.since}: the dew margin is ${margin}, so ${water} on the machine tops now.`;
    }
    case 'humid_air':
      return `The air in ${zone} has been above the zone’s humidity limit since ${ctx.since} (peak ${formatPercent(a.peakRhPct)} RH). Damp air speeds up rust even when nothing condenses.`;
    case 'sensor_silent':
      return `${subject} in ${zone} has sent nothing since ${ctx.sinceWithDate ?? ctx.since}. A silent sensor looks like a dry shop: until it posts again, Drybench cannot warn you about this zone.`;
    case 'battery_low':
      return `${subject} in ${zone} reports a low battery: ${formatVolts(a.latestBatteryV)} (lowest ${formatVolts(a.lowestBatteryV)}). A sensor whose battery runs out goes silent.`;
  }
}

/** The numbers as label–value rows, in the reader's unit; "Frost point" below 0.01 °C. */
export function alarmNumbers(
  a: AlarmFacts,
  r: ReadingFacts | null,
  unit: TemperatureUnit,
): [string, string][] {
  const rows: [string, string][] = [];
  if (r) {
    if (r.marginK !== null) rows.push(['Dew margin', formatMargin(r.marginK, unit)]);
    if (a.worstMarginK !== null && a.worstMarginK !== r.marginK) {
      rows.push(['Lowest margin so far', formatMargin(a.worstMarginK, unit)]);
    }
    if (r.dewPointC !== null) {
      rows.push([capitalised(dewPointLabel(r.dewPointC)), formatTemperature(r.dewPointC, unit)]);
    }
    if (r.surfaceC !== null) {
      const how = r.surfaceSource === 'estimate' ? ' (estimated)' : '';
      rows.push(['Surface', `${formatTemperature(r.surfaceC, unit)}${how}`]);
    }
    rows.push(
      ['Air', formatTemperature(r.airC, unit)],
      ['Relative humidity', formatPercent(r.rhPct)],
    );
    if (r.batteryV !== null) rows.push(['Battery', formatVolts(r.batteryV)]);
  }
  if (a.kind === 'humid_air' && a.peakRhPct !== null) {
    rows.push(['Peak RH', formatPercent(a.peakRhPct)]);
  }
  return rows;
}

/** What the zone reads now (its newest reading), beside which an alarm's worst value stands. */
export interface CurrentFacts {
  marginK: number | null;
  level: Level;
  rhPct: number | null;
}

/**
 * The value now beside the worst one, each labelled, so an alarm that is clearing does not read
 * as if the iron were still wet: "Now +8.3 °C, dry · worst −2.7 °C". Null for a silent sensor
 * (it has no now). Without a current reading only the worst is said.
 */
export function alarmNowAndWorst(
  a: AlarmFacts,
  now: CurrentFacts | null,
  unit: TemperatureUnit,
): string | null {
  switch (a.kind) {
    case 'dew_risk':
    case 'wet_surface': {
      const worst = `worst margin ${formatMargin(a.worstMarginK, unit)}`;
      if (!now || now.marginK === null) return capitalised(worst);
      return `Now margin ${formatMargin(now.marginK, unit)}, ${levelWordInline(now.level)} · ${worst}`;
    }
    case 'humid_air': {
      const worst = `worst ${formatPercent(a.peakRhPct)} RH`;
      if (!now || now.rhPct === null) return capitalised(worst);
      return `Now ${formatPercent(now.rhPct)} RH · ${worst}`;
    }
    case 'battery_low':
      return `Now ${formatVolts(a.latestBatteryV)} · lowest ${formatVolts(a.lowestBatteryV)}`;
    case 'sensor_silent':
      return null;
  }
}

/** A kind's state in a few words, after its subject: "Machine room wet". */
const SHORT_STATE: Record<AlarmKind, string> = {
  wet_surface: 'wet',
  dew_risk: 'dew risk',
  humid_air: 'humid air',
  sensor_silent: 'silent',
  battery_low: 'battery low',
};

/**
 * The phone banner's one line, the worst alarm first: "2 alarms — Machine room wet". The
 * alarms come in worst first; null when there are none.
 */
export function alarmsSummaryLine(
  worstFirst: readonly Pick<AlarmFacts, 'kind' | 'zoneName' | 'sensorName'>[],
): string | null {
  const worst = worstFirst[0];
  if (!worst) return null;
  const count = worstFirst.length === 1 ? '1 alarm' : `${worstFirst.length} alarms`;
  return `${count} — ${alarmSubject(worst)} ${SHORT_STATE[worst.kind]}`;
}

/** A notification for a newly opened alarm: its kind as the title, the headline as the body. */
export function alarmNotification(
  a: AlarmFacts,
  ctx: AlarmWordsContext,
  shopName: string,
): { title: string; body: string } {
  return {
    title: `${ALARM_KIND_WORDS[a.kind]} — ${shopName}`,
    body: alarmHeadline(a, ctx),
  };
}
