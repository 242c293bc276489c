/** Messages the live hub pushes to browsers; built once, where the data is committed. */
import type { Alarm as AlarmView } from '@/ingest/wire/alarms';
import type { ReadingRow } from '@/db/queries/readings';
import type { LatestReading } from '@/ingest/wire/zones';

/**
 * A zone's newest reading as the zone list shows it, so a client can put it straight into that
 * list; the sensor travels beside it in the message.
 */
export type LiveReading = Omit<LatestReading, 'sensorId'>;

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
  alarm: AlarmView;
  /** Set when the alarm did not fit pg_notify's cap and was cut: the client refetches. */
  partial?: true;
}

export type LiveMessage = ReadingMessage | AlarmMessage;

/** pg_notify refuses payloads of 8,000 bytes or more; keep a margin for the channel name. */
const NOTIFY_MAX_BYTES = 7_900;

/**
 * The alarm message as JSON. A long note and long names could pass the cap (a 500-character
 * note is up to 2,000 bytes of UTF-8), so an oversized message drops them and says so.
 */
export function alarmMessageJson(shopId: string, alarm: AlarmView): string {
  const json = JSON.stringify({ type: 'alarm', shopId, alarm } satisfies AlarmMessage);
  if (Buffer.byteLength(json) <= NOTIFY_MAX_BYTES) return json;
  const cut: AlarmView = {
    ...alarm,
    zone: { ...alarm.zone, name: alarm.zone.name.slice(0, 100) },
    sensor: alarm.sensor && { ...alarm.sensor, name: alarm.sensor.name.slice(0, 100) },
    acknowledgement: alarm.acknowledgement && {
      ...alarm.acknowledgement,
      by: alarm.acknowledgement.by && {
        ...alarm.acknowledgement.by,
        name: alarm.acknowledgement.by.name.slice(0, 100),
      },
      note: '',
    },
  };
  return JSON.stringify({
    type: 'alarm',
    shopId,
    alarm: cut,
    partial: true,
  } satisfies AlarmMessage);
}

/** One message per stored batch keeps the payload far below pg_notify's 8,000-byte cap. */
export function readingMessage(fresh: ReadingRow[]): ReadingMessage {
  const newest = fresh.reduce((a, b) => (b.at > a.at ? b : a));
  return {
    type: 'reading',
    shopId: newest.shopId,
    zoneId: newest.zoneId,
    sensorId: newest.sensorId,
    reading: {
      at: newest.at.toISOString(),
      air: newest.airC,
      rh: newest.rhPct,
      surface: newest.surfaceC,
      dewPoint: newest.dewPointC,
      margin: newest.marginK,
      emc: newest.emcPct,
      level: newest.level,
      surfaceSource: newest.surfaceSource,
    },
    count: fresh.length,
  };
}
