import { useLocalSearchParams } from 'expo-router';

import { AcceptInvitationScreen } from '@/components/people/AcceptInvitationScreen';

export default function Invite() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return <AcceptInvitationScreen token={token} />;
}
