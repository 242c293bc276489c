import { SignUpScreen } from '@/components/people/SignUpScreen';

export default function SignUp() {
  return <SignUpScreen />;
}
