import { useRouter } from 'expo-router';
import { StyleSheet, Text } from 'react-native';

import { Button, Form, FormError, FormField, SubmitButton, useApiForm } from '@/components/forms';
import { signUpSchema } from '@/components/forms/schemas';
import { useSignUpMutation } from '@/components/queries';
import { fonts, space, type } from '@/components/theme';
import { useDocumentTitle } from '@/components/ui';

import { AuthLayout } from './AuthLayout';

interface SignUpValues {
  name: string;
  email: string;
  password: string;
}

/**
 * A new account. Sign-up signs nobody in (its answer is the same for a taken address, so it
 * cannot): the person is told to check their inbox, where the link confirms the address and
 * signs them in.
 */
export function SignUpScreen() {
  useDocumentTitle('Create an account');
  const signUp = useSignUpMutation();
  const { control, submit, sending, formError } = useApiForm<SignUpValues>({
    schema: signUpSchema,
    defaultValues: { name: '', email: '', password: '' },
    fields: ['name', 'email', 'password'],
    send: async (values) => {
      await signUp.mutateAsync({ ...values, email: values.email.trim() });
    },
  });

  if (signUp.data) return <CheckInbox email={signUp.data.email} />;
  return (
    <AuthLayout
      title="Create an account"
      links={[{ href: '/sign-in', label: 'I have an account: sign in' }]}
    >
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="name"
          label="Your name"
          testID="sign-up-name"
          autoComplete="name"
          editable={!sending}
        />
        <FormField
          control={control}
          name="email"
          label="Email"
          testID="sign-up-email"
          autoCapitalize="none"
          autoComplete="email"
          inputMode="email"
          keyboardType="email-address"
          editable={!sending}
        />
        <FormField
          control={control}
          name="password"
          label="Password (at least 10 characters)"
          testID="sign-up-password"
          secureTextEntry
          autoComplete="new-password"
          editable={!sending}
          onSubmitEditing={submit}
        />
        <FormError message={formError} testID="sign-up-error" />
        <SubmitButton
          label="Create account"
          sendingLabel="Creating…"
          sending={sending}
          onPress={submit}
          testID="sign-up-submit"
        />
        <Text style={type.small}>Your e-mail is used to sign in and for password resets.</Text>
      </Form>
    </AuthLayout>
  );
}

/** After sign-up: where the link went, what it does, and the way in without it. */
function CheckInbox({ email }: { email: string }) {
  useDocumentTitle('Check your inbox');
  const router = useRouter();
  return (
    <AuthLayout title="Check your inbox">
      <Text style={type.body} testID="check-inbox" role="status">
        We sent an e-mail to <Text style={styles.email}>{email}</Text>. Open its link to confirm
        your address: the link also signs you in. It works once, for 24{'\u00a0'}hours.
      </Text>
      <Text style={type.small}>
        No mail after a few minutes? Look in the spam folder. You can also sign in with your
        password now and send a new link from your profile.
      </Text>
      <Button
        label="Sign in with your password"
        variant="quiet"
        onPress={() => router.replace('/sign-in')}
        testID="check-inbox-sign-in"
      />
    </AuthLayout>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  email: { fontFamily: fonts.bold },
});
