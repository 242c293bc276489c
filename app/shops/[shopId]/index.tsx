import { useLocalSearchParams } from 'expo-router';

import { ZonesScreen } from '@/components/zones/ZonesScreen';

export default function ShopOverview() {
  const { shopId } = useLocalSearchParams<{ shopId: string }>();
  return <ZonesScreen shopId={shopId} />;
}
