/**
 * The alarm as the API answers it (GET /shops/:id/alarms, POST …/ack) and the live `alarm`
 * message carries it: one definition for the server, which builds it (server/alarms/wire.ts),
 * and the app, which reads it. Types and one list of names, so the web bundle gets a few bytes.
 */
import type { AlarmKind } from '../alarmKinds';

export type { AlarmKind };

/**
 * What an alarm's condition measured; each kind fills its own pair and leaves the rest null.
 * Margins K, RH %, battery V, minutes to a wet surface.
 */
export const ALARM_VALUE_KEYS = [
  'worstMarginK',
  'latestMarginK',
  'minutesToWet',
  'peakRhPct',
  'latestRhPct',
  'lowestBatteryV',
  'latestBatteryV',
] as const;
export type AlarmValues = Record<(typeof ALARM_VALUE_KEYS)[number], number | null>;

export interface AlarmAcknowledgement {
  /** Null when the person who acknowledged it has since been removed. */
  by: { id: string; name: string } | null;
  at: string;
  note: string;
}

/** An alarm as the server describes it. Times ISO 8601. */
export interface Alarm extends AlarmValues {
  id: string;
  kind: AlarmKind;
  state: 'open' | 'cleared';
  zone: { id: string; name: string };
  sensor: { id: string; name: string } | null;
  sinceAt: string;
  openedAt: string;
  updatedAt: string;
  clearedAt: string | null;
  acknowledgement: AlarmAcknowledgement | null;
}

/** GET /api/v1/shops/:shopId/alarms?state=open|all */
export interface AlarmsResponse {
  alarms: Alarm[];
}

/** POST /api/v1/shops/:shopId/alarms/:alarmId/ack */
export interface AlarmAckResponse {
  alarm: Alarm;
}
