import { useLocalSearchParams } from 'expo-router';

import { ShopScreen } from '@/components/ShopScreen';

export default function ZoneDetail() {
  const { shopId, zoneId } = useLocalSearchParams<{ shopId: string; zoneId: string }>();
  return <ShopScreen shopId={shopId} zoneId={zoneId} />;
}
