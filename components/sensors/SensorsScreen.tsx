import { Link } from 'expo-router';
import { useEffect, useState } from 'react';
import { Controller } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import {
  Button,
  Choice,
  ConfirmButton,
  Form,
  FormError,
  FormField,
  SubmitButton,
  useApiForm,
} from '@/components/forms';
import { sensorSchema } from '@/components/forms/schemas';
import { Columns } from '@/components/layout';
import {
  useSensorCreateMutation,
  useSensorIntervalMutation,
  useSensorMoveMutation,
  useSensorRemoveMutation,
  useSensorRevokeMutation,
  useSensorRotateMutation,
  useSensorsQuery,
  useUnitPref,
  useZonesQuery,
  type Sensor,
  type ShopSummary,
  type Zone,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { sensorHref } from '@/components/hrefs';
import { colors, space, TAP_TARGET_PX, type } from '@/components/theme';
import { Notice, Panel, useDocumentTitle } from '@/components/ui';

import { SensorFacts } from './SensorFacts';
import { SensorWaysIn } from './SensorWaysIn';
import { TokenReveal } from './TokenReveal';

/** A shop's sensors: where each sits, when it was last heard, its battery; owners manage them. */
export function SensorsScreen() {
  const shop = useFrameShop();
  useDocumentTitle('Sensors', shop.name);
  return <SensorsBody shop={shop} />;
}

function SensorsBody({ shop }: { shop: ShopSummary }) {
  const sensors = useSensorsQuery(shop.id);
  const zones = useZonesQuery(shop.id);
  const [issued, setIssued] = useState<{
    sensorId: string;
    sensorName: string;
    token: string;
  } | null>(null);
  const owner = shop.role === 'owner';
  const zoneList = zones.data?.zones ?? [];
  const unit = useUnitPref();
  const mqttUrl = sensors.data?.mqtt?.url ?? null;
  const firstSensor = sensors.data?.sensors.find((s) => s.revokedAt === null) ?? null;

  const reveal = issued ? (
    <TokenReveal
      {...issued}
      shopId={shop.id}
      timeZone={shop.timeZone}
      mqttUrl={mqttUrl}
      onDone={() => setIssued(null)}
    />
  ) : null;
  const list = (
    <>
      {sensors.isError ? (
        <Notice title="Sensors could not be loaded">{sensors.error.message}</Notice>
      ) : !sensors.data ? (
        <Notice title="Loading sensors…" />
      ) : sensors.data.sensors.length === 0 ? (
        <Notice title="No sensors yet" testID="sensors-empty">
          {owner
            ? 'Add a sensor below; it gets a token to post its readings with.'
            : 'The shop owner adds sensors.'}
        </Notice>
      ) : (
        <View style={styles.list} testID="sensor-list">
          {sensors.data.sensors.map((sensor) => (
            <SensorCard
              key={sensor.id}
              sensor={sensor}
              shop={shop}
              zones={zoneList}
              mqttOn={mqttUrl !== null}
              onToken={(token) =>
                setIssued({ sensorId: sensor.id, sensorName: sensor.name, token })
              }
            />
          ))}
        </View>
      )}
      {owner ? (
        <NewSensorForm
          shopId={shop.id}
          zones={zoneList}
          onCreated={(sensorId, sensorName, token) => setIssued({ sensorId, sensorName, token })}
        />
      ) : null}
    </>
  );
  const waysIn = sensors.data ? (
    <SensorWaysIn mqttUrl={mqttUrl} example={firstSensor} unit={unit} />
  ) : null;

  // Wide: the ways in beside the list, so the page uses the width instead of a narrow column
  // with empty sides.
  return (
    <>
      {reveal}
      <Columns first={list} second={waysIn} />
    </>
  );
}

interface SensorCardProps {
  sensor: Sensor;
  shop: ShopSummary;
  zones: Zone[];
  /** Show the sensor's MQTT topic (the server takes MQTT). */
  mqttOn: boolean;
  onToken: (token: string) => void;
}

function SensorCard({ sensor, shop, zones, mqttOn, onToken }: SensorCardProps) {
  const rotate = useSensorRotateMutation(shop.id);
  const revoke = useSensorRevokeMutation(shop.id);
  const move = useSensorMoveMutation(shop.id);
  const remove = useSensorRemoveMutation(shop.id);
  const interval = useSensorIntervalMutation(shop.id);
  const [moving, setMoving] = useState(false);
  const [timing, setTiming] = useState(false);
  const busy =
    rotate.isPending ||
    revoke.isPending ||
    move.isPending ||
    remove.isPending ||
    interval.isPending;
  const error = rotate.error ?? revoke.error ?? move.error ?? remove.error ?? interval.error;
  const revoked = sensor.revokedAt !== null;

  return (
    <Panel testID="sensor-card">
      <View style={styles.cardTop}>
        <Text style={[type.heading, styles.grow]} role="heading" aria-level={2}>
          <Link href={sensorHref(shop.id, sensor.id)} style={styles.nameLink} testID="sensor-name">
            {sensor.name}
          </Link>
        </Text>
        {revoked ? (
          <Text style={[type.label, styles.revoked]} testID="sensor-revoked">
            token revoked
          </Text>
        ) : null}
      </View>
      <SensorFacts sensor={sensor} timeZone={shop.timeZone} mqttOn={mqttOn} />
      {shop.role === 'owner' ? (
        <View style={styles.actions}>
          <ConfirmButton
            label={revoked ? 'Issue a token' : 'New token'}
            accessibilityLabel={`${revoked ? 'Issue a token' : 'New token'} for ${sensor.name}`}
            question={`Give ${sensor.name} a new token? The old one stops working at once.`}
            disabled={busy}
            onConfirm={() => rotate.mutate(sensor.id, { onSuccess: (r) => onToken(r.token) })}
            testID="sensor-rotate"
          />
          {revoked ? null : (
            <ConfirmButton
              label="Revoke"
              accessibilityLabel={`Revoke the token of ${sensor.name}`}
              question={`Revoke ${sensor.name}'s token? Its posts are refused until it gets a new one.`}
              disabled={busy}
              onConfirm={() => revoke.mutate(sensor.id)}
              testID="sensor-revoke"
            />
          )}
          {zones.length > 1 ? (
            <Button
              label={moving ? 'Keep it here' : 'Move…'}
              accessibilityLabel={moving ? `Keep ${sensor.name} here` : `Move ${sensor.name}…`}
              variant="quiet"
              disabled={busy}
              onPress={() => setMoving((m) => !m)}
              testID="sensor-move"
            />
          ) : null}
          <Button
            label={timing ? 'Close interval' : 'Interval…'}
            accessibilityLabel={
              timing ? `Close interval of ${sensor.name}` : `Interval of ${sensor.name}…`
            }
            variant="quiet"
            disabled={busy}
            onPress={() => setTiming((m) => !m)}
            testID="sensor-interval-open"
          />
          <ConfirmButton
            label={`Remove ${sensor.name}`}
            confirmLabel={`Yes, remove ${sensor.name}`}
            question={`Remove ${sensor.name} from the shop? Its token stops working at once; its readings stay in ${sensor.zoneName}'s history.`}
            disabled={busy}
            onConfirm={() => remove.mutate(sensor.id)}
            testID="sensor-remove"
          />
        </View>
      ) : null}
      {moving ? (
        <Choice
          label={`Move ${sensor.name} to`}
          options={zones.map((z) => ({ value: z.id, label: z.name }))}
          value={sensor.zoneId}
          disabled={busy}
          onChange={(zoneId) =>
            zoneId !== sensor.zoneId &&
            move.mutate({ sensorId: sensor.id, zoneId }, { onSuccess: () => setMoving(false) })
          }
          testID="sensor-move-zone"
        />
      ) : null}
      {timing ? (
        <Choice
          label={`How often ${sensor.name} posts`}
          options={INTERVAL_CHOICES}
          value={sensor.interval.setS === null ? 'learn' : String(sensor.interval.setS)}
          disabled={busy}
          onChange={(value) =>
            interval.mutate({
              sensorId: sensor.id,
              expectedIntervalS: value === 'learn' ? null : Number(value),
            })
          }
          testID="sensor-interval-choice"
        />
      ) : null}
      <FormError message={error?.message} />
    </Panel>
  );
}

/** Set intervals offered on the card; the API takes any from 10 s to a day. */
const INTERVAL_CHOICES = [
  { value: 'learn', label: 'Learn it' },
  { value: '60', label: '1 min' },
  { value: '300', label: '5 min' },
  { value: '900', label: '15 min' },
  { value: '3600', label: '1 h' },
] as const;

interface NewSensorFormProps {
  shopId: string;
  zones: Zone[];
  onCreated: (sensorId: string, sensorName: string, token: string) => void;
}

function NewSensorForm({ shopId, zones, onCreated }: NewSensorFormProps) {
  const create = useSensorCreateMutation(shopId);
  const { form, control, submit, sending, formError } = useApiForm<{
    name: string;
    zoneId: string;
  }>({
    schema: sensorSchema,
    defaultValues: { name: '', zoneId: '' },
    fields: ['name', 'zoneId'],
    send: async (values) => {
      const created = await create.mutateAsync({ name: values.name.trim(), zoneId: values.zoneId });
      form.reset({ name: '', zoneId: values.zoneId });
      onCreated(created.id, created.name, created.token);
    },
  });
  // The only zone is the answer: choose it, whenever the zones arrive.
  const onlyZoneId = zones.length === 1 ? zones[0]!.id : null;
  useEffect(() => {
    if (onlyZoneId && !form.getValues('zoneId')) form.setValue('zoneId', onlyZoneId);
  }, [onlyZoneId, form]);

  if (zones.length === 0) {
    return (
      <Notice title="Add a zone first">
        A sensor sits in a zone. Add zones under Shop, then come back here.
      </Notice>
    );
  }
  return (
    <Panel title="Add a sensor" hint="It gets a token to post readings with, shown once.">
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="name"
          label="Sensor name"
          testID="sensor-create-name"
          placeholder="e.g. Saw-top probe"
          editable={!sending}
        />
        <Controller
          control={control}
          name="zoneId"
          render={({ field, fieldState }) => (
            <Choice
              label="Zone"
              options={zones.map((z) => ({ value: z.id, label: z.name }))}
              value={field.value || null}
              onChange={field.onChange}
              disabled={sending}
              error={fieldState.error?.message}
              testID="sensor-create-zone"
            />
          )}
        />
        <FormError message={formError} />
        <SubmitButton
          label="Add sensor"
          sendingLabel="Adding…"
          sending={sending}
          onPress={submit}
          testID="sensor-create-submit"
        />
      </Form>
    </Panel>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  cardTop: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md },
  grow: { flex: 1 },
  // A block link at least a tap target high, underlined so it reads as one without colour.
  nameLink: {
    ...type.heading,
    color: colors.air,
    textDecorationLine: 'underline',
    display: 'flex',
    minHeight: TAP_TARGET_PX,
    paddingVertical: (TAP_TARGET_PX - type.heading.lineHeight) / 2,
  },
  revoked: { color: colors.wet },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  form: { gap: space.lg },
});
