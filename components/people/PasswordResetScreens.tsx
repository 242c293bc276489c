import { useRouter } from 'expo-router';
import { StyleSheet, Text } from 'react-native';

import { Form, FormError, FormField, SubmitButton, useApiForm } from '@/components/forms';
import { newPasswordFormSchema, resetRequestSchema } from '@/components/forms/schemas';
import {
  usePasswordResetConfirmMutation,
  usePasswordResetRequestMutation,
} from '@/components/queries';
import { space, type } from '@/components/theme';
import { useDocumentTitle } from '@/components/ui';

import { AuthLayout } from './AuthLayout';

/** Asks for a reset link. The answer is the same whether or not the address has an account. */
export function ForgotPasswordScreen() {
  useDocumentTitle('Reset your password');
  const request = usePasswordResetRequestMutation();
  const { form, control, submit, sending, formError } = useApiForm<{ email: string }>({
    schema: resetRequestSchema,
    defaultValues: { email: '' },
    fields: ['email'],
    send: ({ email }) => request.mutateAsync({ email: email.trim() }),
  });

  return (
    <AuthLayout
      title="Reset your password"
      links={[{ href: '/sign-in', label: 'Back to sign in' }]}
    >
      {request.isSuccess ? (
        <Text style={type.body} testID="reset-sent" role="status">
          If an account uses {form.getValues('email').trim()}, a link to choose a new password is on
          its way. It works once, for 60 minutes.
        </Text>
      ) : (
        <Form onSubmit={submit} style={styles.form}>
          <Text style={type.body}>We will e-mail you a link to choose a new password.</Text>
          <FormField
            control={control}
            name="email"
            label="Email"
            testID="reset-email"
            autoCapitalize="none"
            autoComplete="email"
            inputMode="email"
            editable={!sending}
            onSubmitEditing={submit}
          />
          <FormError message={formError} />
          <SubmitButton
            label="Send the link"
            sendingLabel="Sending…"
            sending={sending}
            onPress={submit}
            testID="reset-submit"
          />
        </Form>
      )}
    </AuthLayout>
  );
}

interface NewPasswordValues {
  password: string;
  repeat: string;
}

/** The page a reset link opens: a new password, then straight into the app. */
export function ResetPasswordScreen({ token }: { token: string }) {
  useDocumentTitle('Choose a new password');
  const router = useRouter();
  const confirm = usePasswordResetConfirmMutation();
  const { control, submit, sending, formError } = useApiForm<NewPasswordValues>({
    schema: newPasswordFormSchema,
    defaultValues: { password: '', repeat: '' },
    fields: ['password'],
    send: async ({ password }) => {
      await confirm.mutateAsync({ token, password });
      router.replace('/');
    },
  });

  return (
    <AuthLayout
      title="Choose a new password"
      links={[{ href: '/forgot-password', label: 'Ask for a new link' }]}
    >
      <Form onSubmit={submit} style={styles.form}>
        <Text style={type.body}>Signing in with the new password ends every other session.</Text>
        <FormField
          control={control}
          name="password"
          label="New password (at least 10 characters)"
          testID="new-password"
          secureTextEntry
          autoComplete="new-password"
          editable={!sending}
        />
        <FormField
          control={control}
          name="repeat"
          label="The same again"
          testID="new-password-repeat"
          secureTextEntry
          autoComplete="new-password"
          editable={!sending}
          onSubmitEditing={submit}
        />
        <FormError message={formError} testID="new-password-error" />
        <SubmitButton
          label="Save and sign in"
          sendingLabel="Saving…"
          sending={sending}
          onPress={submit}
          testID="new-password-submit"
        />
      </Form>
    </AuthLayout>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
