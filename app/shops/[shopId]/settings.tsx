import { ShopSettingsScreen } from '@/components/shop/ShopSettingsScreen';

export default function ShopSettings() {
  return <ShopSettingsScreen />;
}
