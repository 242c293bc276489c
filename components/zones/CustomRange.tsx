import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button, TextField } from '@/components/forms';
import { space } from '@/components/theme';
import { HISTORY_WORDS } from '@/ingest/words';

import { checkCustomRange, toLocalInput } from './chartRange';

interface CustomRangeProps {
  timeZone: string;
  initial: { fromMs: number; toMs: number };
  onApply: (range: { fromMs: number; toMs: number }) => void;
}

/** Two clock times on the shop's clock, checked before anything is asked of the server. */
export function CustomRange({ timeZone, initial, onApply }: CustomRangeProps) {
  const [fromText, setFromText] = useState(() =>
    toLocalInput(initial.fromMs, timeZone).replace('T', ' '),
  );
  const [toText, setToText] = useState(() =>
    toLocalInput(initial.toMs, timeZone).replace('T', ' '),
  );
  const [error, setError] = useState<{ field: 'from' | 'to'; message: string } | null>(null);
  const apply = () => {
    const check = checkCustomRange(fromText, toText, timeZone);
    if (!check.ok) {
      setError({ field: check.field, message: check.message });
      return;
    }
    setError(null);
    onApply({ fromMs: check.fromMs, toMs: check.toMs });
  };
  return (
    <View style={styles.custom} testID="zone-custom-range">
      <View style={styles.customFields}>
        <View style={styles.customField}>
          <TextField
            label={`${HISTORY_WORDS.customFrom} (${timeZone})`}
            value={fromText}
            onChangeText={setFromText}
            placeholder={HISTORY_WORDS.customHint}
            error={error?.field === 'from' ? error.message : undefined}
            onSubmitEditing={apply}
            testID="zone-custom-from"
          />
        </View>
        <View style={styles.customField}>
          <TextField
            label={`${HISTORY_WORDS.customTo} (${timeZone})`}
            value={toText}
            onChangeText={setToText}
            placeholder={HISTORY_WORDS.customHint}
            error={error?.field === 'to' ? error.message : undefined}
            onSubmitEditing={apply}
            testID="zone-custom-to"
          />
        </View>
      </View>
      <View style={styles.show}>
        <Button label={HISTORY_WORDS.customShow} onPress={apply} testID="zone-custom-show" />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  custom: { gap: space.sm },
  customFields: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  customField: { flexGrow: 1, flexBasis: 220 },
  show: { alignSelf: 'flex-start' },
});
