import { useLocalSearchParams } from 'expo-router';

import { ShopSettingsScreen } from '@/components/shop/ShopSettingsScreen';

export default function ShopSettings() {
  const { shopId } = useLocalSearchParams<{ shopId: string }>();
  return <ShopSettingsScreen shopId={shopId} />;
}
