/** The public surface of the alarm engine. */
export { createAlarmEngine, type AlarmEngine, type SweepOutcome } from './engine';
export { evaluateZone, readZoneState, type ZoneAlarmState } from './evaluate';
export { ALARM_RULES, postingIntervalMs, silentAfterMs } from './rules';
