/**
 * When each alarm opens and clears, in words built from the engine's own numbers
 * (ingest/alarmRules.ts) and the zone's limits, in the reader's unit: shown on the alarm cards,
 * the banner and in the alarm e-mails, so what people read is the rule the engine applies.
 * Limits are dew-margin differences and are labelled so ("the dew margin is below 5.4 °F"):
 * a bare "5.4 °F" would read like an air temperature.
 */
import type { AlarmKind } from '../alarmKinds';
import { ALARM_RULE_NUMBERS } from '../alarmRules';
import type { TemperatureUnit } from '../units';
import { deltaInUnit, formatPercent } from './format';

/** The zone's limits: dew-margin differences in K, humidity in % RH. */
export interface RuleLimits {
  cautionK: number;
  wetK: number;
  humidRhPct: number;
}

/** A difference with its unit and no sign: "3 °C", "5.4 °F" (a limit, not a reading). */
export function formatDelta(deltaK: number, unit: TemperatureUnit): string {
  return `${deltaInUnit(deltaK, unit).replace(/\.0$/, '')} °${unit}`;
}

/** "5 min", "1 h", "90 min": the hold as people say it. */
export function formatDuration(ms: number): string {
  const minutes = Math.round(ms / 60_000);
  return minutes >= 60 && minutes % 60 === 0 ? `${minutes / 60} h` : `${minutes} min`;
}

const volts = (v: number) => `${v.toFixed(2)} V`;

/** "for 3 readings or 5 min": how long the level hysteresis needs a level to hold. */
function levelHold(): string {
  const { minCount, minHoldMs } = ALARM_RULE_NUMBERS.level;
  return `for ${minCount} readings or ${formatDuration(minHoldMs)}, whichever comes first`;
}

/** "for 3 readings or 5 min", without the rest. */
function levelHoldShort(): string {
  const { minCount, minHoldMs } = ALARM_RULE_NUMBERS.level;
  return `for ${minCount} readings or ${formatDuration(minHoldMs)}`;
}

export interface AlarmRuleWords {
  opens: string;
  clears: string;
  /** The clear rule in a few words, for the banner: "Clears when the margin stays above 1.5 °C for 5 min". */
  clearsShort: string;
}

/** The whole rule of one kind, two sentences. */
export function alarmRule(
  kind: AlarmKind,
  limits: RuleLimits,
  unit: TemperatureUnit,
): AlarmRuleWords {
  const n = ALARM_RULE_NUMBERS;
  const caution = formatDelta(limits.cautionK, unit);
  const wet = formatDelta(limits.wetK, unit);
  switch (kind) {
    case 'dew_risk':
      return {
        opens: `Opens when the dew margin is below ${caution} (the caution limit) ${levelHold()}, or when its trend reaches the wet limit within ${formatDuration(n.lookAheadMs)}.`,
        clears: `Clears when the dew margin stays at or above ${formatDelta(limits.cautionK + n.level.bandK, unit)} ${levelHold()}, and then ${formatDuration(n.warningQuietMs)} pass with no trend towards the wet limit.`,
        clearsShort: `Clears when the margin stays at or above ${formatDelta(limits.cautionK + n.level.bandK, unit)} ${levelHoldShort()}, then ${formatDuration(n.warningQuietMs)} with no falling trend`,
      };
    case 'wet_surface':
      return {
        opens: `Opens when the dew margin is at or below ${wet} (the wet limit) ${levelHold()}.`,
        clears: `Clears when the dew margin stays above ${formatDelta(limits.wetK + n.level.bandK, unit)} ${levelHold()}.`,
        clearsShort: `Clears when the margin stays above ${formatDelta(limits.wetK + n.level.bandK, unit)} ${levelHoldShort()}`,
      };
    case 'humid_air':
      return {
        opens: `Opens when the relative humidity stays above ${formatPercent(limits.humidRhPct)} for ${formatDuration(n.humid.openHoldMs)}.`,
        clears: `Clears when it stays at or below ${formatPercent(limits.humidRhPct - n.humid.bandPct)} for ${formatDuration(n.humid.clearHoldMs)}.`,
        clearsShort: `Clears when RH stays at or below ${formatPercent(limits.humidRhPct - n.humid.bandPct)} for ${formatDuration(n.humid.clearHoldMs)}`,
      };
    case 'sensor_silent':
      return {
        opens: `Opens when the sensor has sent nothing for ${n.silentFactor} of its posting intervals (at least ${formatDuration(n.silentMinMs)} unless its owner set the interval).`,
        clears: 'Clears with its next reading.',
        clearsShort: 'Clears with its next reading',
      };
    case 'battery_low':
      return {
        opens: `Opens when the battery stays below ${volts(n.battery.lowV)} for ${formatDuration(n.battery.openHoldMs)}.`,
        clears: `Clears when it stays at or above ${volts(n.battery.lowV + n.battery.bandV)} for ${formatDuration(n.battery.clearHoldMs)}.`,
        clearsShort: `Clears at or above ${volts(n.battery.lowV + n.battery.bandV)} for ${formatDuration(n.battery.clearHoldMs)}`,
      };
  }
}

/** The zone limits as one sentence, for the limits form: what the numbers mean. */
export function limitsSentence(limits: RuleLimits, unit: TemperatureUnit): string {
  return `Caution when the dew margin is below ${formatDelta(limits.cautionK, unit)}; wet when it is at or below ${formatDelta(limits.wetK, unit)}; humid when the relative humidity is above ${formatPercent(limits.humidRhPct)}.`;
}

/** The limits form's labels: differences of the dew margin, in the reader's unit. */
export function limitLabels(unit: TemperatureUnit): {
  caution: string;
  wet: string;
  humid: string;
} {
  return {
    caution: `Caution when the dew margin is below (°${unit} difference)`,
    wet: `Wet when the dew margin is at or below (°${unit} difference)`,
    humid: 'Humid when the relative humidity is above (%)',
  };
}
