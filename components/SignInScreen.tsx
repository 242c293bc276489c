import { Link, Redirect, useLocalSearchParams, useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button, Form, TextField } from './forms';
import { homeHrefFor } from './hrefs';
import { Content, FORM_MAX_WIDTH, Screen } from './layout';
import {
  isApiError,
  useFetchMe,
  useMeQuery,
  useSignInMutation,
  type ApiErrorDetail,
} from './queries';
import { Splash } from './Splash';
import { colors, radius, space, type } from './theme';
import { useDocumentTitle } from './useDocumentTitle';

function detailFor(details: ApiErrorDetail[], path: string): string | undefined {
  return details.find((detail) => detail.path === path)?.message;
}

/** E-mail and password; on success, the first shop's overview. */
export function SignInScreen() {
  useDocumentTitle('Sign in');
  const router = useRouter();
  // Where to go after signing in, when a page sent the person here (e.g. an invitation).
  const { next } = useLocalSearchParams<{ next?: string }>();
  const nextPath =
    typeof next === 'string' && next.startsWith('/') && !next.startsWith('//') ? next : null;
  const me = useMeQuery();
  const signIn = useSignInMutation();
  const fetchMe = useFetchMe();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [leaving, setLeaving] = useState(false);

  const sending = signIn.isPending || leaving;
  const error = signIn.error;
  const details = isApiError(error) ? error.details : [];

  const submit = () => {
    if (sending) return;
    signIn.mutate(
      { email: email.trim(), password },
      {
        onSuccess: async () => {
          setLeaving(true);
          try {
            const signedIn = await fetchMe();
            router.replace(nextPath ?? homeHrefFor(signedIn.shops));
          } catch {
            router.replace('/');
          }
        },
      },
    );
  };

  if (me.isPending) return <Splash />;
  // Already signed in (e.g. a bookmarked sign-in page): straight to the shop.
  if (me.isSuccess && !signIn.isPending && !leaving) {
    return <Redirect href={nextPath ?? homeHrefFor(me.data.shops)} />;
  }

  return (
    <Screen>
      <Content maxWidth={FORM_MAX_WIDTH} style={styles.column}>
        <View style={styles.brand}>
          <Text style={type.title}>Drybench</Text>
          <Text style={type.small}>Dew margin and wood moisture for your shop.</Text>
        </View>
        <Form style={styles.card} onSubmit={submit}>
          <Text style={type.heading} accessibilityRole="header">
            Sign in
          </Text>
          <TextField
            label="Email"
            testID="sign-in-email"
            value={email}
            onChangeText={setEmail}
            autoCapitalize="none"
            autoCorrect={false}
            autoComplete="email"
            inputMode="email"
            keyboardType="email-address"
            textContentType="emailAddress"
            editable={!sending}
            error={detailFor(details, 'email')}
            returnKeyType="next"
          />
          <TextField
            label="Password"
            testID="sign-in-password"
            value={password}
            onChangeText={setPassword}
            secureTextEntry
            autoComplete="current-password"
            textContentType="password"
            editable={!sending}
            error={detailFor(details, 'password')}
            returnKeyType="go"
            onSubmitEditing={submit}
          />
          {error ? (
            <Text
              style={[type.body, styles.error]}
              testID="sign-in-error"
              accessibilityLiveRegion="polite"
              aria-live="polite"
            >
              {error.message}
            </Text>
          ) : null}
          <Button
            label="Sign in"
            onPress={submit}
            disabled={sending || email.trim() === '' || password === ''}
            testID="sign-in-submit"
          />
          {sending ? <Text style={type.small}>Signing in…</Text> : null}
        </Form>
        <View style={styles.links}>
          <Link href="/sign-up" style={styles.link} testID="to-sign-up">
            Create an account
          </Link>
          <Link href="/forgot-password" style={styles.link} testID="to-forgot-password">
            Forgot your password?
          </Link>
        </View>
      </Content>
    </Screen>
  );
}

const styles = StyleSheet.create({
  column: { paddingTop: space.xxl, gap: space.xl },
  brand: { gap: space.xs },
  card: {
    backgroundColor: colors.card,
    borderColor: colors.border,
    borderWidth: 1,
    borderRadius: radius.card,
    padding: space.xl,
    gap: space.lg,
  },
  error: { color: colors.wet },
  links: { gap: space.md },
  link: {
    ...type.body,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
  },
});
