import { Controller, useWatch } from 'react-hook-form';
import { StyleSheet } from 'react-native';
import * as z from 'zod/mini';

import {
  Choice,
  Form,
  FormError,
  FormField,
  FormStatus,
  SubmitButton,
  useApiForm,
} from '@/components/forms';
import { nameSchema } from '@/components/forms/schemas';
import {
  useSensorsQuery,
  useSurfaceCreateMutation,
  type ShopSummary,
  type Zone,
} from '@/components/queries';
import { space } from '@/components/theme';
import { Panel } from '@/components/ui';

const NO_PROBE = 'none';

const addSurfaceSchema = z.object({
  name: nameSchema,
  zoneId: z.string().check(z.minLength(1, 'Pick the zone the surface is in')),
  material: z.string().check(z.trim(), z.maxLength(100, 'At most 100 characters')),
  sensorId: z.string(),
});
type AddSurfaceValues = { name: string; zoneId: string; material: string; sensorId: string };

const EMPTY: AddSurfaceValues = { name: '', zoneId: '', material: '', sensorId: NO_PROBE };

/** Adds a surface to a zone: its name, material, and the probe on it if it has one. */
export function AddSurfaceForm({ shop, zones }: { shop: ShopSummary; zones: readonly Zone[] }) {
  const create = useSurfaceCreateMutation(shop.id);
  const sensors = useSensorsQuery(shop.id);
  const { form, control, submit, sending, formError, done } = useApiForm<AddSurfaceValues>({
    schema: addSurfaceSchema,
    defaultValues: EMPTY,
    fields: ['name', 'zoneId', 'material', 'sensorId'],
    send: async (values) => {
      const material = values.material.trim();
      await create.mutateAsync({
        name: values.name.trim(),
        zoneId: values.zoneId,
        ...(material ? { material } : {}),
        ...(values.sensorId !== NO_PROBE ? { sensorId: values.sensorId } : {}),
      });
      form.reset({ ...EMPTY, zoneId: values.zoneId });
    },
  });
  const zoneId = useWatch({ control, name: 'zoneId' });
  // Only a sensor of the surface's own zone can be its probe (the server refuses others).
  const probes = (sensors.data?.sensors ?? []).filter((s) => s.zoneId === zoneId && !s.revokedAt);
  const probeOptions = [
    { value: NO_PROBE, label: 'No probe' },
    ...probes.map((s) => ({ value: s.id, label: s.name })),
  ];
  return (
    <Panel title="Add a surface" hint="A machine top, a bed or a shelf of tools you protect.">
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="name"
          label="Surface name"
          placeholder="e.g. Table saw top"
          editable={!sending}
          testID="surface-name"
        />
        <Controller
          control={control}
          name="zoneId"
          render={({ field, fieldState }) => (
            <Choice
              label="Zone"
              options={zones.map((z) => ({ value: z.id, label: z.name }))}
              value={field.value || null}
              onChange={(value) => {
                field.onChange(value);
                form.setValue('sensorId', NO_PROBE);
              }}
              disabled={sending}
              error={fieldState.error?.message}
              testID="surface-zone"
            />
          )}
        />
        <FormField
          control={control}
          name="material"
          label="Material (optional)"
          placeholder="e.g. Cast iron, ground"
          editable={!sending}
          testID="surface-material"
        />
        {zoneId ? (
          <Controller
            control={control}
            name="sensorId"
            render={({ field, fieldState }) => (
              <Choice
                label="Probe on this surface (optional)"
                options={probeOptions}
                value={field.value || NO_PROBE}
                onChange={field.onChange}
                disabled={sending}
                error={fieldState.error?.message}
                testID="surface-probe"
              />
            )}
          />
        ) : null}
        <FormError message={formError} />
        <FormStatus message={done ? 'Surface added.' : null} />
        <SubmitButton
          label="Add surface"
          sendingLabel="Adding…"
          sending={sending}
          onPress={submit}
          testID="surface-submit"
        />
      </Form>
    </Panel>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
});
