import { SignInScreen } from '@/components/people/SignInScreen';

export default function SignIn() {
  return <SignInScreen />;
}
