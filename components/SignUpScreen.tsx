import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, Text } from 'react-native';

import { AuthLayout } from './AuthLayout';
import { Button, Form, FormError, FormField, applyServerErrors } from './forms';
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
  const [formError, setFormError] = useState<string | null>(null);
  const form = useForm<SignUpValues>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { name: '', email: '', password: '' },
  });
  const sending = form.formState.isSubmitting || signUp.isPending;

  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    try {
      await signUp.mutateAsync({ ...values, email: values.email.trim() });
      router.replace('/');
    } catch (error) {
      setFormError(applyServerErrors(error, ['name', 'email', 'password'], form.setError));
    }
  });

  return (
    <AuthLayout
      title="Create an account"
      links={[{ href: '/sign-in', label: 'I have an account: sign in' }]}
    >
      <Form onSubmit={() => void submit()} style={styles.form}>
        <FormField
          control={form.control}
          name="name"
          label="Your name"
          testID="sign-up-name"
          autoComplete="name"
          editable={!sending}
        />
        <FormField
          control={form.control}
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
          control={form.control}
          name="password"
          label="Password (at least 10 characters)"
          testID="sign-up-password"
          secureTextEntry
          autoComplete="new-password"
          editable={!sending}
          onSubmitEditing={() => void submit()}
        />
        <FormError message={formError} testID="sign-up-error" />
        <Button
          label={sending ? 'Creating…' : 'Create account'}
          onPress={() => void submit()}
          disabled={sending}
          testID="sign-up-submit"
        />
        <Text style={type.small}>Your e-mail is used to sign in and for password resets.</Text>
      </Form>
    </AuthLayout>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
