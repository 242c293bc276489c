import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { space, type } from '@/components/theme';

import { Button } from './Button';

interface ConfirmButtonProps {
  label: string;
  /** What will happen, asked before doing it: "Revoke Saw-top probe's token?" */
  question: string;
  onConfirm: () => void;
  /** The confirming press; "Yes, <label in lower case>" unless given (a name keeps its case). */
  confirmLabel?: string;
  disabled?: boolean;
  /** The first button's accessible name when `label` does not name its object; starts with it. */
  accessibilityLabel?: string;
  testID?: string;
}

/** An action that cannot be undone: the first press asks, the second does it. */
export function ConfirmButton({
  label,
  question,
  onConfirm,
  confirmLabel,
  disabled,
  accessibilityLabel,
  testID,
}: ConfirmButtonProps) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <View style={styles.start}>
        <Button
          label={label}
          accessibilityLabel={accessibilityLabel}
          variant="quiet"
          disabled={disabled}
          onPress={() => setAsking(true)}
          testID={testID}
        />
      </View>
    );
  }
  return (
    <View style={styles.ask} role="group" aria-label={question}>
      <Text style={type.body}>{question}</Text>
      <View style={styles.row}>
        <Button
          label={confirmLabel ?? `Yes, ${label.toLowerCase()}`}
          onPress={() => {
            setAsking(false);
            onConfirm();
          }}
          testID={testID ? `${testID}-confirm` : undefined}
        />
        <Button label="Cancel" variant="quiet" onPress={() => setAsking(false)} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  start: { alignSelf: 'flex-start' },
  // Full width: in a row of actions the question takes its own line and wraps.
  ask: { gap: space.sm, width: '100%' },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
