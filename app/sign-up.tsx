import { SignUpScreen } from '@/components/SignUpScreen';

export default function SignUp() {
  return <SignUpScreen />;
}
