import { useLocalSearchParams, useRouter } from 'expo-router';

import { rangeFromParam } from '@/components/zones/chartRange';
import { ZonesScreen } from '@/components/zones/ZonesScreen';

export default function ShopOverview() {
  const { range } = useLocalSearchParams<{ range?: string }>();
  const router = useRouter();
  return (
    <ZonesScreen
      range={rangeFromParam(range)}
      onRangeChange={(next) => router.setParams({ range: next })}
    />
  );
}
