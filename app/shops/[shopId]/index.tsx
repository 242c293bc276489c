import { useLocalSearchParams } from 'expo-router';

import { ShopScreen } from '@/components/ShopScreen';

export default function ShopOverview() {
  const { shopId } = useLocalSearchParams<{ shopId: string }>();
  return <ShopScreen shopId={shopId} />;
}
