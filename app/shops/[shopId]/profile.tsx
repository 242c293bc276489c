import { useLocalSearchParams } from 'expo-router';

import { ProfileScreen } from '@/components/people/ProfileScreen';

export default function Profile() {
  const { shopId } = useLocalSearchParams<{ shopId: string }>();
  return <ProfileScreen shopId={shopId} />;
}
