import { useRouter } from 'expo-router';
import { StyleSheet, Text } from 'react-native';

import { Button, Form, FormError, FormField, SubmitButton, useApiForm } from '@/components/forms';
import { acceptNewAccountSchema } from '@/components/forms/schemas';
import { shopHref } from '@/components/hrefs';
import {
  useAcceptInvitationMutation,
  useInvitationLinkQuery,
  useMeQuery,
  useSignOutMutation,
  type InvitationLink,
} from '@/components/queries';
import { space, type } from '@/components/theme';
import { Splash, useDocumentTitle } from '@/components/ui';

import { AuthLayout } from './AuthLayout';

const ROLE_WORDS = {
  owner: 'an owner',
  member: 'a member',
  viewer: 'a viewer',
} as const;

/**
 * The page an invitation link opens. Signed in as the invited address: one button. Signed
 * out with no account yet: a name and a password make one. Otherwise: what to do instead.
 */
export function AcceptInvitationScreen({ token }: { token: string }) {
  useDocumentTitle('Invitation');
  const link = useInvitationLinkQuery(token);
  const me = useMeQuery();

  if (link.isPending || me.isPending) return <Splash />;
  if (link.isError) {
    return (
      <AuthLayout
        title="This link no longer works"
        links={[{ href: '/', label: 'Go to Drybench' }]}
      >
        <Text style={type.body} testID="invitation-gone">
          {link.error.message}
        </Text>
      </AuthLayout>
    );
  }
  const invitation = link.data;
  const title = `Join ${invitation.shopName}`;
  const intro = (
    <Text style={type.body}>
      You are invited to {invitation.shopName} as {ROLE_WORDS[invitation.role]}, as{' '}
      {invitation.email}.
    </Text>
  );
  const signedInAs = me.data?.user.email;

  if (signedInAs === invitation.email) {
    return (
      <AuthLayout title={title}>
        {intro}
        <AcceptButton token={token} />
      </AuthLayout>
    );
  }
  if (signedInAs) {
    return (
      <AuthLayout title={title}>
        {intro}
        <Text style={type.body} testID="invitation-wrong-account">
          You are signed in as {signedInAs}. Sign out, then open the link again to accept as{' '}
          {invitation.email}.
        </Text>
        <SignOutButton />
      </AuthLayout>
    );
  }
  if (invitation.accountExists) {
    return (
      <AuthLayout
        title={title}
        links={[
          {
            href: `/sign-in?next=${encodeURIComponent(`/invite/${token}`)}`,
            label: `Sign in as ${invitation.email}`,
          },
        ]}
      >
        {intro}
        <Text style={type.body}>This address already has an account: sign in to accept.</Text>
      </AuthLayout>
    );
  }
  return (
    <AuthLayout title={title}>
      {intro}
      <NewAccountForm token={token} invitation={invitation} />
    </AuthLayout>
  );
}

function AcceptButton({ token }: { token: string }) {
  const router = useRouter();
  const accept = useAcceptInvitationMutation(token);
  return (
    <>
      <FormError message={accept.error?.message} />
      <Button
        label={accept.isPending ? 'Joining…' : 'Accept the invitation'}
        disabled={accept.isPending}
        testID="invitation-accept"
        onPress={() =>
          accept.mutate({}, { onSuccess: (result) => router.replace(shopHref(result.shop.id)) })
        }
      />
    </>
  );
}

function SignOutButton() {
  const signOut = useSignOutMutation();
  return (
    <Button
      label="Sign out"
      variant="quiet"
      disabled={signOut.isPending}
      onPress={() => signOut.mutate()}
    />
  );
}

function NewAccountForm({ token, invitation }: { token: string; invitation: InvitationLink }) {
  const router = useRouter();
  const accept = useAcceptInvitationMutation(token);
  const { control, submit, sending, formError } = useApiForm<{ name: string; password: string }>({
    schema: acceptNewAccountSchema,
    defaultValues: { name: '', password: '' },
    fields: ['name', 'password'],
    send: async (values) => {
      const result = await accept.mutateAsync(values);
      router.replace(shopHref(result.shop.id));
    },
  });
  return (
    <Form onSubmit={submit} style={styles.form}>
      <Text style={type.small}>Create your account for {invitation.email}.</Text>
      <FormField
        control={control}
        name="name"
        label="Your name"
        testID="invitation-name"
        autoComplete="name"
        editable={!sending}
      />
      <FormField
        control={control}
        name="password"
        label="Password (at least 10 characters)"
        testID="invitation-password"
        secureTextEntry
        autoComplete="new-password"
        editable={!sending}
        onSubmitEditing={submit}
      />
      <FormError message={formError} testID="invitation-error" />
      <SubmitButton
        label="Create account and join"
        sendingLabel="Joining…"
        sending={sending}
        onPress={submit}
        testID="invitation-accept"
      />
    </Form>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
