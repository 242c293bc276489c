import { useLocalSearchParams } from 'expo-router';

import { ResetPasswordScreen } from '@/components/people/PasswordResetScreens';

export default function ResetPassword() {
  const { token } = useLocalSearchParams<{ token: string }>();
  return <ResetPasswordScreen token={token} />;
}
