import { SensorsScreen } from '@/components/sensors/SensorsScreen';

export default function Sensors() {
  return <SensorsScreen />;
}
