import { useRouter } from 'expo-router';
import { StyleSheet, Text } from 'react-native';

import { AuthLayout } from './AuthLayout';
import { Form, FormError, FormField, SubmitButton, useApiForm } from './forms';
import { signUpSchema } from './forms/schemas';
import { useSignUpMutation } from './queries';
import { space, type } from './theme';
import { useDocumentTitle } from './useDocumentTitle';

interface SignUpValues {
  name: string;
  email: string;
  password: string;
}

/** A new account; then the front door, which offers to create a first shop. */
export function SignUpScreen() {
  useDocumentTitle('Create an account');
  const router = useRouter();
  const signUp = useSignUpMutation();
  const { control, submit, sending, formError } = useApiForm<SignUpValues>({
    schema: signUpSchema,
    defaultValues: { name: '', email: '', password: '' },
    fields: ['name', 'email', 'password'],
    send: async (values) => {
      await signUp.mutateAsync({ ...values, email: values.email.trim() });
      router.replace('/');
    },
  });

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

const styles = StyleSheet.create({ form: { gap: space.lg } });
