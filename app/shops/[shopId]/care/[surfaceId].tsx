import { useLocalSearchParams } from 'expo-router';

import { SurfaceScreen } from '@/components/care/SurfaceScreen';

export default function ShopSurface() {
  const { surfaceId } = useLocalSearchParams<{ surfaceId: string }>();
  return <SurfaceScreen surfaceId={surfaceId} />;
}
