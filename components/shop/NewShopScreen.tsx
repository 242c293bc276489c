import { Redirect, useRouter } from 'expo-router';
import { StyleSheet, Text } from 'react-native';

import {
  browserTimeZone,
  Form,
  FormError,
  FormField,
  SubmitButton,
  TimeZoneField,
  useApiForm,
} from '@/components/forms';
import { shopSchema } from '@/components/forms/schemas';
import { shopHref } from '@/components/hrefs';
import { AuthLayout } from '@/components/people/AuthLayout';
import { isSignedOut, useMeQuery, useShopCreateMutation } from '@/components/queries';
import { space, type } from '@/components/theme';
import { Splash, useDocumentTitle } from '@/components/ui';

/** Creates a shop (its creator owns it) and opens its overview with the getting-started steps. */
export function NewShopScreen() {
  useDocumentTitle('New shop');
  const router = useRouter();
  const me = useMeQuery();
  const create = useShopCreateMutation();
  const { control, submit, sending, formError } = useApiForm<{ name: string; timeZone: string }>({
    schema: shopSchema,
    defaultValues: { name: '', timeZone: browserTimeZone() },
    fields: ['name', 'timeZone'],
    send: async (values) => {
      const shop = await create.mutateAsync({
        name: values.name.trim(),
        timeZone: values.timeZone.trim(),
      });
      // The overview, where the getting-started steps wait.
      router.replace(shopHref(shop.id));
    },
  });

  if (me.isPending) return <Splash />;
  if (isSignedOut(me.error)) return <Redirect href="/sign-in" />;
  const back = me.data?.shops.length ? [{ href: '/', label: 'Back to my shops' }] : [];
  return (
    <AuthLayout title="New shop" links={back}>
      <Form onSubmit={submit} style={styles.form}>
        <Text style={type.body}>
          A shop is one workshop location. You will be its owner and can invite others.
        </Text>
        <FormField
          control={control}
          name="name"
          label="Shop name"
          testID="shop-create-name"
          editable={!sending}
        />
        <TimeZoneField
          control={control}
          name="timeZone"
          label="Time zone"
          testID="shop-create-timezone"
          disabled={sending}
        />
        <FormError message={formError} testID="shop-create-error" />
        <SubmitButton
          label="Create shop"
          sendingLabel="Creating…"
          sending={sending}
          onPress={submit}
          testID="shop-create-submit"
        />
      </Form>
    </AuthLayout>
  );
}

const styles = StyleSheet.create({ form: { gap: space.lg } });
