import { Link, useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { membersHref } from '@/components/hrefs';
import { limitsSentence } from '@/ingest/words';
import {
  Button,
  Choice,
  ConfirmButton,
  Form,
  FormError,
  FormField,
  FormStatus,
  SubmitButton,
  TextField,
  TimeZoneField,
  useApiForm,
} from '@/components/forms';
import { shopSchema, zoneNameSchema } from '@/components/forms/schemas';
import {
  useLeaveShopMutation,
  useMembersQuery,
  useShopDeleteMutation,
  useShopUpdateMutation,
  useUnitPref,
  useZoneCreateMutation,
  useZoneDeleteMutation,
  useZonesQuery,
  type ShopSummary,
  type ZonePurpose,
  type Zone,
} from '@/components/queries';
import { colors, space, type } from '@/components/theme';
import { canonicalTimeZone } from '@/ingest/timeZones';
import { Panel, useDocumentTitle } from '@/components/ui';
import { ZONE_PURPOSES } from '@/ingest/wire/zones';
import { PAPER_SIZE_WORDS, PURPOSE_WORDS } from '@/ingest/words';

import { useFrameShop } from './ShopFrame';
import { PaperSizeForm } from './PaperSizeForm';
import { ShopTabs } from './ShopTabs';
import { ZoneLimitsForm } from './ZoneLimitsForm';
import { ZonePurposeForm } from './ZonePurposeForm';

const NEW_ZONE_PURPOSES = ZONE_PURPOSES.map((value) => ({ value, label: PURPOSE_WORDS[value] }));

/**
 * The shop's name and time zone, the week report's paper, its zones and their limits, leaving and
 * deleting it.
 */
export function ShopSettingsScreen() {
  const shop = useFrameShop();
  useDocumentTitle('Shop settings', shop.name);
  return <SettingsBody shop={shop} />;
}

function SettingsBody({ shop }: { shop: ShopSummary }) {
  const owner = shop.role === 'owner';
  const zones = useZonesQuery(shop.id);
  const unit = useUnitPref();
  return (
    <>
      <ShopTabs shop={shop} current="settings" />
      {owner ? (
        <>
          <ShopForm shop={shop} />
          <Panel title="Week report" testID="report-settings">
            <PaperSizeForm shop={shop} />
          </Panel>
        </>
      ) : (
        <Panel title={shop.name}>
          <Text style={type.body}>Time zone: {shop.timeZone}</Text>
          <Text style={type.body}>Report paper: {PAPER_SIZE_WORDS[shop.paperSize]}</Text>
          <Text style={type.body}>Your role: {shop.role}</Text>
        </Panel>
      )}
      <Panel
        title="Zones and limits"
        hint="A zone is an area with its own air: the machine room, the lumber rack."
        testID="zone-settings"
      >
        {zones.data?.zones.length === 0 ? <Text style={type.body}>No zones yet.</Text> : null}
        {zones.data?.zones.map((zone) => (
          <View key={zone.id} style={styles.zone}>
            {owner ? (
              <>
                <ZoneLimitsForm shopId={shop.id} zone={zone} unit={unit} />
                <ZonePurposeForm shopId={shop.id} zone={zone} />
                {zone.latest === null ? <ZoneDeleteButton shopId={shop.id} zone={zone} /> : null}
              </>
            ) : (
              <Text style={type.body}>
                {zone.name}: {limitsSentence(zone, unit)}
              </Text>
            )}
          </View>
        ))}
        {owner ? <NewZoneForm shopId={shop.id} /> : null}
      </Panel>
      <LeavePanel shop={shop} />
      {owner ? <DeletePanel shop={shop} /> : null}
    </>
  );
}

function ShopForm({ shop }: { shop: ShopSummary }) {
  const update = useShopUpdateMutation(shop.id);
  const { control, submit, sending, formError, done } = useApiForm<{
    name: string;
    timeZone: string;
  }>({
    schema: shopSchema,
    // A zone stored before names were checked exactly ("america/chicago") shows as IANA spells it.
    defaultValues: { name: shop.name, timeZone: canonicalTimeZone(shop.timeZone) },
    fields: ['name', 'timeZone'],
    send: async (values) => {
      await update.mutateAsync({ name: values.name.trim(), timeZone: values.timeZone.trim() });
    },
  });
  return (
    <Panel title="Shop">
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="name"
          label="Shop name"
          testID="shop-edit-name"
          editable={!sending}
        />
        <TimeZoneField
          control={control}
          name="timeZone"
          label="Time zone"
          testID="shop-edit-timezone"
          disabled={sending}
        />
        <FormError message={formError} />
        <FormStatus message={done ? 'Saved.' : null} />
        <SubmitButton
          label="Save shop"
          sendingLabel="Saving…"
          sending={sending}
          onPress={submit}
          testID="shop-edit-submit"
        />
      </Form>
    </Panel>
  );
}

function NewZoneForm({ shopId }: { shopId: string }) {
  const create = useZoneCreateMutation(shopId);
  const [purpose, setPurpose] = useState<ZonePurpose>('machines');
  const { form, control, submit, sending, formError } = useApiForm<{ name: string }>({
    schema: zoneNameSchema,
    defaultValues: { name: '' },
    fields: ['name'],
    send: async ({ name }) => {
      await create.mutateAsync({ name: name.trim(), purpose });
      form.reset({ name: '' });
    },
  });
  return (
    <Form onSubmit={submit} style={styles.form}>
      <FormField
        control={control}
        name="name"
        label="New zone"
        placeholder="e.g. Machine room"
        testID="zone-create-name"
        editable={!sending}
        onSubmitEditing={submit}
      />
      <Choice
        label="What it holds"
        options={NEW_ZONE_PURPOSES}
        value={purpose}
        disabled={sending}
        onChange={setPurpose}
        testID="zone-create-purpose"
      />
      <FormError message={formError} />
      <SubmitButton
        label="Add zone"
        sendingLabel="Adding…"
        sending={sending}
        onPress={submit}
        testID="zone-create-submit"
      />
    </Form>
  );
}

/** A zone without readings can go (made by mistake); the server also refuses one with a sensor. */
function ZoneDeleteButton({ shopId, zone }: { shopId: string; zone: Zone }) {
  const remove = useZoneDeleteMutation(shopId);
  return (
    <>
      <ConfirmButton
        label={`Delete ${zone.name}`}
        question={`Delete the zone ${zone.name}? It has no readings yet.`}
        confirmLabel={`Yes, delete ${zone.name}`}
        disabled={remove.isPending}
        onConfirm={() => remove.mutate(zone.id)}
        testID="zone-delete"
      />
      <FormError message={remove.error?.message} testID="zone-delete-error" />
    </>
  );
}

function LeavePanel({ shop }: { shop: ShopSummary }) {
  const router = useRouter();
  const leave = useLeaveShopMutation(shop.id);
  const owner = shop.role === 'owner';
  // Only an owner can be the last one; others need not wait for the list.
  const members = useMembersQuery(shop.id, owner);
  const owners = members.data?.members.filter((m) => m.role === 'owner').length;
  if (owner && members.isPending) return null;
  // A shop always keeps an owner (the server refuses with last_owner as the backstop): say so
  // instead of offering a button that can only fail after the confirmation.
  if (owner && owners === 1) {
    return (
      <Panel title="Leave the shop" testID="shop-leave-sole-owner">
        <Text style={type.body}>
          You are the only owner of {shop.name}, so you cannot leave it. Make another member an
          owner first, or delete the shop below.
        </Text>
        <Link href={membersHref(shop.id)} style={styles.link}>
          Members
        </Link>
      </Panel>
    );
  }
  return (
    <Panel title="Leave the shop" hint="You lose access to its zones, sensors and alarms.">
      <ConfirmButton
        label="Leave"
        question={`Leave ${shop.name}?`}
        disabled={leave.isPending}
        onConfirm={() => leave.mutate(undefined, { onSuccess: () => router.replace('/') })}
        testID="shop-leave"
      />
      <FormError message={leave.error?.message} testID="shop-leave-error" />
    </Panel>
  );
}

function DeletePanel({ shop }: { shop: ShopSummary }) {
  const router = useRouter();
  const remove = useShopDeleteMutation(shop.id);
  const [typed, setTyped] = useState('');
  const matches = typed.trim() === shop.name;
  return (
    <Panel
      title="Delete the shop"
      hint="Deletes every zone, sensor, reading and alarm of the shop, for every member. It cannot be undone."
    >
      <TextField
        label={`Type the shop's name, ${shop.name}, to confirm`}
        value={typed}
        onChangeText={setTyped}
        autoCapitalize="none"
        testID="shop-delete-name"
      />
      <FormError message={remove.error?.message} />
      <Button
        label={remove.isPending ? 'Deleting…' : 'Delete the shop'}
        disabled={!matches || remove.isPending}
        onPress={() =>
          remove.mutate({ confirmName: typed.trim() }, { onSuccess: () => router.replace('/') })
        }
        testID="shop-delete-submit"
      />
    </Panel>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  link: {
    ...type.body,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
    paddingVertical: space.md,
  },
  zone: {
    gap: space.sm,
    paddingBottom: space.md,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
  },
});
