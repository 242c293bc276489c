import { useLocalSearchParams } from 'expo-router';

import { AlarmsScreen } from '@/components/alarms/AlarmsScreen';

export default function ShopAlarms() {
  const { shopId } = useLocalSearchParams<{ shopId: string }>();
  return <AlarmsScreen shopId={shopId} />;
}
