/** The public surface of the alarm engine. */
export { createAlarmEngine, type AlarmEngine, type SweepOutcome } from './engine';
export { ALARM_RULES, postingIntervalMs, silentAfterMs } from './rules';
