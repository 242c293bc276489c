import { useLocalSearchParams } from 'expo-router';

import { MembersScreen } from '@/components/people/MembersScreen';

export default function Members() {
  const { shopId } = useLocalSearchParams<{ shopId: string }>();
  return <MembersScreen shopId={shopId} />;
}
