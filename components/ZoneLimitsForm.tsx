import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import { fDeltaToK } from '@/ingest/units';

import { deltaInUnit } from './format';
import { Button, Form, FormError, FormField, applyServerErrors } from './forms';
import { parseDecimal, zoneLimitsSchema } from './forms/schemas';
import { useZoneUpdateMutation, type UnitPref, type Zone } from './queries';
import { space, type } from './theme';

interface LimitValues {
  name: string;
  caution: string;
  wet: string;
  humid: string;
}

/**
 * A zone's name and limits. The margin limits are differences, typed in the person's unit
 * (°C or °F difference) and sent in kelvin; the server checks that wet stays below caution.
 */
export function ZoneLimitsForm({
  shopId,
  zone,
  unit,
}: {
  shopId: string;
  zone: Zone;
  unit: UnitPref;
}) {
  const update = useZoneUpdateMutation(shopId);
  const [formError, setFormError] = useState<string | null>(null);
  const [saved, setSaved] = useState(false);
  const defaults = {
    name: zone.name,
    caution: deltaInUnit(zone.cautionK, unit),
    wet: deltaInUnit(zone.wetK, unit),
    humid: String(zone.humidRhPct),
  };
  const form = useForm<LimitValues>({
    resolver: zodResolver(zoneLimitsSchema),
    defaultValues: defaults,
  });
  const sending = form.formState.isSubmitting;
  const toK = (text: string) => {
    const value = parseDecimal(text);
    return unit === 'F' ? fDeltaToK(value) : value;
  };
  const submit = form.handleSubmit(async (values) => {
    setFormError(null);
    setSaved(false);
    try {
      await update.mutateAsync({
        zoneId: zone.id,
        name: values.name.trim(),
        cautionK: toK(values.caution),
        wetK: toK(values.wet),
        humidRhPct: parseDecimal(values.humid),
      });
      setSaved(true);
    } catch (error) {
      // The server names its fields cautionK/wetK/humidRhPct; the form calls them otherwise.
      const renamed = {
        caution: 'cautionK',
        wet: 'wetK',
        humid: 'humidRhPct',
        name: 'name',
      } as const;
      const fieldOf = (path: string) =>
        (Object.keys(renamed) as (keyof typeof renamed)[]).find((k) => renamed[k] === path);
      const message = applyServerErrors(
        error,
        ['name', 'caution', 'wet', 'humid'],
        form.setError,
        fieldOf,
      );
      setFormError(message);
    }
  });
  const deg = `°${unit}`;
  return (
    <Form onSubmit={() => void submit()} style={styles.form}>
      <FormField
        control={form.control}
        name="name"
        label="Zone name"
        testID="zone-edit-name"
        editable={!sending}
      />
      <View style={styles.row}>
        <View style={styles.cell}>
          <FormField
            control={form.control}
            name="caution"
            label={`Caution below (${deg})`}
            testID="zone-edit-caution"
            inputMode="decimal"
            editable={!sending}
          />
        </View>
        <View style={styles.cell}>
          <FormField
            control={form.control}
            name="wet"
            label={`Wet at (${deg})`}
            testID="zone-edit-wet"
            inputMode="decimal"
            editable={!sending}
          />
        </View>
        <View style={styles.cell}>
          <FormField
            control={form.control}
            name="humid"
            label="Humid above (% RH)"
            testID="zone-edit-humid"
            inputMode="decimal"
            editable={!sending}
          />
        </View>
      </View>
      <Text style={type.small}>
        Dew margin limits: close below the caution limit (ISO 8502-4 asks for 3 K before coating),
        wet at or below the wet limit.
      </Text>
      <FormError message={formError} />
      {saved ? (
        <Text style={type.small} role="status">
          Saved.
        </Text>
      ) : null}
      <Button
        label={sending ? 'Saving…' : `Save ${zone.name}`}
        onPress={() => void submit()}
        disabled={sending}
        variant="quiet"
        testID="zone-edit-submit"
      />
    </Form>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 150 },
});
