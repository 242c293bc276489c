/**
 * What the live socket (GET /api/v1/live) sends a browser: the one definition the server
 * builds its messages with (server/live/) and the app reads them with (components/live/).
 * Types only, besides the path, so the app's bundle gets nothing from here but a string.
 */
import type { Alarm } from './alarms';
import type { ImportMessage } from './imports';
import type { LatestReading } from './zones';

/** Where the live socket upgrades; the server answers 404 on any other path. */
export const LIVE_PATH = '/api/v1/live';

/**
 * A zone's newest reading as the zone list shows it, so a client can put it straight into that
 * list; the sensor travels beside it in the message.
 */
export type LiveReading = Omit<LatestReading, 'sensorId'>;

/** An alarm as the alarm list shows it (GET /api/v1/shops/:id/alarms lists the same). */
export type LiveAlarm = Alarm;

/** A sensor's stored batch: one message per request, however many readings it carried. */
export interface ReadingMessage {
  type: 'reading';
  shopId: string;
  zoneId: string;
  sensorId: string;
  /** The newest reading of the batch: what a card shows. */
  reading: LiveReading;
  /** How many readings the batch stored; a chart refetches when more than one arrived. */
  count: number;
}

/** An alarm as it stands after a change (opened, updated, acknowledged, cleared). */
export interface AlarmMessage {
  type: 'alarm';
  shopId: string;
  alarm: LiveAlarm;
  /** Set when the alarm did not fit pg_notify's cap and was cut: the client refetches. */
  partial?: true;
}

/** This person's shops changed (invited, removed, a role changed): read /me again. */
export interface AccessMessage {
  type: 'access';
  shopIds: string[];
}

/** The first message on every socket: the shops whose messages it will carry. */
export interface HelloMessage {
  type: 'hello';
  shopIds: string[];
}

/**
 * A shop's zones or sensors changed (created, renamed, limits or placement changed, removed):
 * read that list again. An invalidation rather than the new row keeps one mapper per resource
 * (server/wire/) and every payload tiny, and such changes are rare next to readings.
 */
export interface ShopChangeMessage {
  type: 'zones' | 'sensors';
  shopId: string;
}

export type ShopChangeKind = ShopChangeMessage['type'];

export type LiveMessage =
  ReadingMessage | AlarmMessage | AccessMessage | HelloMessage | ShopChangeMessage | ImportMessage;
