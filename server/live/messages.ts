/**
 * The live messages the server builds, once, where the data is committed; their shapes are
 * ingest/wire/live.ts, which the app reads them with too.
 */
import { LIVE_CHANNEL, NOTIFY_MAX_BYTES, notify, type NotifyExecutor } from '@/db/notify';
import type { Alarm as AlarmView } from '@/ingest/wire/alarms';
import type { ReadingRow } from '@/db/queries/readings';
import type {
  AlarmMessage,
  ReadingMessage,
  ShopChangeKind,
  ShopChangeMessage,
} from '@/ingest/wire/live';

export type {
  AccessMessage,
  AlarmMessage,
  HelloMessage,
  LiveMessage,
  LiveReading,
  ReadingMessage,
  ShopChangeMessage,
} from '@/ingest/wire/live';

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

/** One message per stored batch keeps the payload far below pg_notify's cap (db/notify.ts). */
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

/**
 * Tells every open tab of the shop that its zones or sensors changed. Called after the write
 * has committed (or inside its transaction, where PostgreSQL holds the notification until the
 * commit), so a tab never refetches before the change is there to read.
 */
export async function announceShopChange(
  executor: NotifyExecutor,
  shopId: string,
  kinds: readonly ShopChangeKind[],
): Promise<void> {
  await notify(
    executor,
    LIVE_CHANNEL,
    kinds.map((type) => JSON.stringify({ type, shopId } satisfies ShopChangeMessage)),
  );
}
