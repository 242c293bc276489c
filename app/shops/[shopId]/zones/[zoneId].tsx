import { useLocalSearchParams } from 'expo-router';

import { ZonesScreen } from '@/components/zones/ZonesScreen';

export default function ZoneDetail() {
  const { shopId, zoneId } = useLocalSearchParams<{ shopId: string; zoneId: string }>();
  return <ZonesScreen shopId={shopId} zoneId={zoneId} />;
}
