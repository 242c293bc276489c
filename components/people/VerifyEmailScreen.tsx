import { useRouter } from 'expo-router';
import { useEffect, useRef } from 'react';
import { Text } from 'react-native';

import { useVerifyEmailMutation } from '@/components/queries';
import { type } from '@/components/theme';
import { Splash, useDocumentTitle } from '@/components/ui';

import { AuthLayout } from './AuthLayout';

/**
 * The page a verification link opens: confirms the address (which signs the person in), then
 * goes to the front door. A used, expired or broken link says so and offers the way in.
 */
export function VerifyEmailScreen({ token }: { token: string | undefined }) {
  useDocumentTitle('Confirm your address');
  const router = useRouter();
  const verify = useVerifyEmailMutation();
  const { mutate } = verify;
  // The token works once: a second mount in development must not spend it twice.
  const sent = useRef(false);

  useEffect(() => {
    if (!token || sent.current) return;
    sent.current = true;
    mutate({ token }, { onSuccess: () => router.replace('/') });
  }, [token, mutate, router]);

  const failure = !token
    ? 'This link is incomplete: open the whole address from the e-mail, or sign in and send a new link from your profile.'
    : verify.error?.message;
  if (!failure) return <Splash />;
  return (
    <AuthLayout
      title="This link does not work"
      links={[
        { href: '/sign-in', label: 'Sign in with your password', testID: 'verify-sign-in' },
        { href: '/forgot-password', label: 'Forgot the password?' },
      ]}
    >
      <Text style={type.body} testID="verify-error" role="alert">
        {failure}
      </Text>
    </AuthLayout>
  );
}
