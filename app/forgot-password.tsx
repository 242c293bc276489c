import { ForgotPasswordScreen } from '@/components/people/PasswordResetScreens';

export default function ForgotPassword() {
  return <ForgotPasswordScreen />;
}
