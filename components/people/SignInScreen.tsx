import { Redirect, useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, Text } from 'react-native';

import { Button, Form, FormError, FormField, useApiForm } from '@/components/forms';
import { signInSchema } from '@/components/forms/schemas';
import { homeHrefFor } from '@/components/hrefs';
import { useFetchMe, useMeQuery, useSignInMutation } from '@/components/queries';
import { space, type } from '@/components/theme';
import { Splash, useDocumentTitle } from '@/components/ui';

import { AuthLayout } from './AuthLayout';

/** A path inside this app to return to after signing in (e.g. an invitation), or null. */
function localPath(next: unknown): string | null {
  return typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : null;
}

/** E-mail and password; on success, where the person came from or their first shop. */
export function SignInScreen() {
  useDocumentTitle('Sign in');
  const router = useRouter();
  const nextPath = localPath(useLocalSearchParams<{ next?: string }>().next);
  const me = useMeQuery();
  const signIn = useSignInMutation();
  const fetchMe = useFetchMe();
  const [leaving, setLeaving] = useState(false);
  const { control, submit, sending, formError } = useApiForm<{ email: string; password: string }>({
    schema: signInSchema,
    defaultValues: { email: '', password: '' },
    fields: ['email', 'password'],
    send: async ({ email, password }) => {
      await signIn.mutateAsync({ email: email.trim(), password });
      setLeaving(true);
      try {
        const signedIn = await fetchMe();
        router.replace(nextPath ?? homeHrefFor(signedIn.shops));
      } catch {
        router.replace('/');
      }
    },
  });
  const busy = sending || leaving;

  if (me.isPending) return <Splash />;
  // Already signed in (e.g. a bookmarked sign-in page): straight to the shop.
  if (me.isSuccess && !busy) {
    return <Redirect href={nextPath ?? homeHrefFor(me.data.shops)} />;
  }

  return (
    <AuthLayout
      title="Sign in"
      links={[
        { href: '/sign-up', label: 'Create an account', testID: 'to-sign-up' },
        { href: '/forgot-password', label: 'Forgot your password?', testID: 'to-forgot-password' },
      ]}
    >
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="email"
          label="Email"
          testID="sign-in-email"
          autoCapitalize="none"
          autoCorrect={false}
          autoComplete="email"
          inputMode="email"
          keyboardType="email-address"
          textContentType="emailAddress"
          editable={!busy}
          returnKeyType="next"
        />
        <FormField
          control={control}
          name="password"
          label="Password"
          testID="sign-in-password"
          secureTextEntry
          autoComplete="current-password"
          textContentType="password"
          editable={!busy}
          returnKeyType="go"
          onSubmitEditing={submit}
        />
        <FormError message={formError} testID="sign-in-error" />
        <Button label="Sign in" onPress={submit} disabled={busy} testID="sign-in-submit" />
        {busy ? <Text style={type.small}>Signing in…</Text> : null}
      </Form>
    </AuthLayout>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
