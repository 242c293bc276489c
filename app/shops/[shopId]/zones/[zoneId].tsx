import { useLocalSearchParams, useRouter } from 'expo-router';

import { rangeFromParam } from '@/components/zones/chartRange';
import { ZonesScreen } from '@/components/zones/ZonesScreen';

export default function ZoneDetail() {
  const { zoneId, range } = useLocalSearchParams<{ zoneId: string; range?: string }>();
  const router = useRouter();
  return (
    <ZonesScreen
      zoneId={zoneId}
      range={rangeFromParam(range)}
      onRangeChange={(next) => router.setParams({ range: next })}
    />
  );
}
