import { StyleSheet, Text, View } from 'react-native';

import { fDeltaToK } from '@/ingest/units';
import { formatDelta, limitLabels, limitsSentence } from '@/ingest/words';
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

/** ISO 8502-4: steel at least 3 K above the dew point before coating. */
const ISO_8502_4_K = 3;

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
  const labels = limitLabels(unit);
  const limits: { name: Exclude<keyof LimitValues, 'name'>; label: string }[] = [
    { name: 'caution', label: labels.caution },
    { name: 'wet', label: labels.wet },
    { name: 'humid', label: labels.humid },
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
      <Text style={type.small} testID="zone-edit-limits">
        {limitsSentence(zone, unit)} The dew margin is the surface temperature minus the dew point;
        ISO 8502-4 asks for at least {formatDelta(ISO_8502_4_K, unit)} before coating.
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
