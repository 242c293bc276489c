import { useRouter } from 'expo-router';
import { useEffect, useRef } from 'react';

import { alarmNotification } from '@/ingest/words';
import { shopSectionHref } from '@/components/hrefs';
import { useAlarmsQuery, useUnitPref } from '@/components/queries';

import { showAlarmNotification } from './alarmNotifications';
import { alarmFacts, formatAlarmTime } from './alarmText';

interface AlarmNotifierProps {
  shopId: string;
  shopName: string;
  timeZone: string;
}

/**
 * Notifies this browser of each alarm that opens while the shop is open in it (opted in on
 * Profile). Only openings: the alarms open at the first answer are known already, and an
 * update to a known alarm is not news. A tap opens the Alarms page with that alarm in view.
 */
export function AlarmNotifier({ shopId, shopName, timeZone }: AlarmNotifierProps) {
  const alarms = useAlarmsQuery(shopId, 'open');
  const unit = useUnitPref();
  const router = useRouter();
  const known = useRef<Set<string> | null>(null);

  useEffect(() => {
    const list = alarms.data?.alarms;
    if (!list) return;
    if (known.current === null) {
      known.current = new Set(list.map((a) => a.id));
      return;
    }
    for (const alarm of list) {
      if (known.current.has(alarm.id)) continue;
      known.current.add(alarm.id);
      const words = alarmNotification(
        alarmFacts(alarm),
        { unit, since: formatAlarmTime(alarm.sinceAt, Date.now(), timeZone) },
        shopName,
      );
      showAlarmNotification(words, alarm.id, () =>
        router.push(`${shopSectionHref(shopId, 'alarms')}?alarm=${encodeURIComponent(alarm.id)}`),
      );
    }
  }, [alarms.data, unit, router, shopId, shopName, timeZone]);

  return null;
}
