import { useLocalSearchParams } from 'expo-router';

import { AlarmsScreen } from '@/components/alarms/AlarmsScreen';

export default function ShopAlarms() {
  // ?alarm=<id>: the alarm a notification opened.
  const { alarm } = useLocalSearchParams<{ alarm?: string }>();
  return <AlarmsScreen focusAlarmId={typeof alarm === 'string' ? alarm : undefined} />;
}
