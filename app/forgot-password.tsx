import { ForgotPasswordScreen } from '@/components/PasswordResetScreens';

export default function ForgotPassword() {
  return <ForgotPasswordScreen />;
}
