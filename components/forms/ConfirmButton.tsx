import { useEffect, useRef, useState } from 'react';
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

/**
 * An action that cannot be undone: the first press asks, the second does it. Focus follows:
 * asking puts it on the confirming button (the pressed one is gone), Cancel puts it back on the
 * first, so a keyboard user is never dropped at the top of the page. On a narrow card the
 * question wraps and the two buttons stack.
 */
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
  const start = useRef<View>(null);
  const confirm = useRef<View>(null);
  // Only after a press here: the first render must not steal focus from the page.
  const pressed = useRef(false);
  useEffect(() => {
    if (!pressed.current) return;
    (asking ? confirm : start).current?.focus();
  }, [asking]);
  const ask = (next: boolean) => {
    pressed.current = true;
    setAsking(next);
  };
  if (!asking) {
    return (
      <View style={styles.start}>
        <Button
          ref={start}
          label={label}
          accessibilityLabel={accessibilityLabel}
          variant="quiet"
          disabled={disabled}
          onPress={() => ask(true)}
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
          ref={confirm}
          label={confirmLabel ?? `Yes, ${label.toLowerCase()}`}
          onPress={() => {
            setAsking(false);
            onConfirm();
          }}
          testID={testID ? `${testID}-confirm` : undefined}
        />
        <Button label="Cancel" variant="quiet" onPress={() => ask(false)} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  start: { alignSelf: 'flex-start' },
  // Full width: in a row of actions the question takes its own line and wraps.
  ask: { gap: space.sm, width: '100%' },
  // Wraps: two buttons that do not fit side by side stack, each at most the card's width.
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
