import { useLocalSearchParams } from 'expo-router';

import { ZonesScreen } from '@/components/zones/ZonesScreen';

export default function ZoneDetail() {
  const { zoneId } = useLocalSearchParams<{ zoneId: string }>();
  return <ZonesScreen zoneId={zoneId} />;
}
