import { useLocalSearchParams } from 'expo-router';

import { SensorsScreen } from '@/components/sensors/SensorsScreen';

export default function Sensors() {
  const { shopId } = useLocalSearchParams<{ shopId: string }>();
  return <SensorsScreen shopId={shopId} />;
}
