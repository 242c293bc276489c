import { useLocalSearchParams } from 'expo-router';

import { SensorScreen } from '@/components/sensors/SensorScreen';

export default function ShopSensor() {
  const { sensorId } = useLocalSearchParams<{ sensorId: string }>();
  return <SensorScreen sensorId={sensorId} />;
}
