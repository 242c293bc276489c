import { StyleSheet, Text, View } from 'react-native';

import { fDeltaToK } from '@/ingest/units';
import { deltaInUnit } from '@/components/format';
import {
  Form,
  FormError,
  FormField,
  FormStatus,
  SubmitButton,
  useApiForm,
} from '@/components/forms';
import { parseDecimal, zoneLimitsSchema } from '@/components/forms/schemas';
import { useZoneUpdateMutation, type UnitPref, type Zone } from '@/components/queries';
import { space, type } from '@/components/theme';

// The server names its fields cautionK/wetK/humidRhPct; the form names them for people.
const SERVER_FIELDS: Record<string, keyof LimitValues> = {
  name: 'name',
  cautionK: 'caution',
  wetK: 'wet',
  humidRhPct: 'humid',
};

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
  const toK = (text: string) => {
    const value = parseDecimal(text);
    return unit === 'F' ? fDeltaToK(value) : value;
  };
  const { control, submit, sending, formError, done } = useApiForm<LimitValues>({
    schema: zoneLimitsSchema,
    defaultValues: {
      name: zone.name,
      caution: deltaInUnit(zone.cautionK, unit),
      wet: deltaInUnit(zone.wetK, unit),
      humid: String(zone.humidRhPct),
    },
    fields: ['name', 'caution', 'wet', 'humid'],
    fieldOf: (path) => SERVER_FIELDS[path],
    send: (values) =>
      update.mutateAsync({
        zoneId: zone.id,
        name: values.name.trim(),
        cautionK: toK(values.caution),
        wetK: toK(values.wet),
        humidRhPct: parseDecimal(values.humid),
      }),
  });
  const deg = `°${unit}`;
  const limits: { name: Exclude<keyof LimitValues, 'name'>; label: string }[] = [
    { name: 'caution', label: `Caution below (${deg})` },
    { name: 'wet', label: `Wet at (${deg})` },
    { name: 'humid', label: 'Humid above (% RH)' },
  ];
  return (
    <Form onSubmit={submit} style={styles.form}>
      <FormField
        control={control}
        name="name"
        label="Zone name"
        testID="zone-edit-name"
        editable={!sending}
      />
      <View style={styles.row}>
        {limits.map((limit) => (
          <View key={limit.name} style={styles.cell}>
            <FormField
              control={control}
              name={limit.name}
              label={limit.label}
              testID={`zone-edit-${limit.name}`}
              inputMode="decimal"
              editable={!sending}
            />
          </View>
        ))}
      </View>
      <Text style={type.small}>
        Dew margin limits: close below the caution limit (ISO 8502-4 asks for 3 K before coating),
        wet at or below the wet limit.
      </Text>
      <FormError message={formError} />
      <FormStatus message={done ? 'Saved.' : null} />
      <SubmitButton
        label={`Save ${zone.name}`}
        sendingLabel="Saving…"
        sending={sending}
        onPress={submit}
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
