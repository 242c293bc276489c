import { SignInScreen } from '@/components/SignInScreen';

export default function SignIn() {
  return <SignInScreen />;
}
