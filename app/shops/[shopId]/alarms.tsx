import { AlarmsScreen } from '@/components/alarms/AlarmsScreen';

export default function ShopAlarms() {
  return <AlarmsScreen />;
}
