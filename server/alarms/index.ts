/** The public surface of the alarm engine. */
export {
  createAlarmEngine,
  type AlarmEngine,
  type AlarmsOpenedHook,
  type SweepOutcome,
} from './engine';
export { evaluateZone, readZoneState, zoneLevelOf, type ZoneAlarmState } from './evaluate';
export {
  ALARM_MAIL_RULES,
  decideAlarmMail,
  deliverAlarmMail,
  mailDueAtMs,
  type AlarmMailDeps,
  type AlarmMailReport,
} from './mailDecision';
export { ALARM_RULES, silentAfterMs } from './rules';
