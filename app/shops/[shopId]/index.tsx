import { ZonesScreen } from '@/components/zones/ZonesScreen';

export default function ShopOverview() {
  return <ZonesScreen />;
}
