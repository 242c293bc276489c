import { useLocalSearchParams } from 'expo-router';

import { VerifyEmailScreen } from '@/components/people/VerifyEmailScreen';

export default function Verify() {
  const { token } = useLocalSearchParams<{ token?: string }>();
  return <VerifyEmailScreen token={token} />;
}
