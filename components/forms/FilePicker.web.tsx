import { useRef, useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { space, type } from '@/components/theme';

import { Button } from './Button';
import type { FilePickerProps } from './FilePicker';
import { FormError } from './FormError';

/**
 * A 44 px button in front of a hidden file input (the input itself cannot be styled to the
 * app's look, and its own button is too small to tap). The chosen file goes up at once; while
 * it goes, `uploading` is announced; a refusal shows the server's own sentence with a retry of
 * the same file.
 */
export function FilePicker({
  accept,
  label,
  accessibilityLabel,
  variant,
  send,
  pending,
  error,
  uploading,
  retryAccessibilityLabel,
  testID,
}: FilePickerProps) {
  const input = useRef<HTMLInputElement>(null);
  // Kept for "Try again": the input is cleared after each pick so the same file can be re-picked.
  const [last, setLast] = useState<File | null>(null);
  const pick = (file: File) => {
    setLast(file);
    send(file);
  };
  const part = (name: string) => (testID ? `${testID}-${name}` : undefined);
  return (
    <View style={styles.picker}>
      <input
        ref={input}
        type="file"
        accept={accept}
        hidden
        tabIndex={-1}
        aria-hidden
        data-testid={part('input')}
        onChange={(event) => {
          const file = event.currentTarget.files?.[0];
          event.currentTarget.value = '';
          if (file) pick(file);
        }}
      />
      <View style={styles.row}>
        <Button
          label={label}
          variant={last ? 'quiet' : variant}
          accessibilityLabel={accessibilityLabel}
          disabled={pending}
          busy={pending}
          onPress={() => input.current?.click()}
          testID={testID}
        />
        {pending && last ? (
          <Text style={type.body} aria-live="polite" testID={part('status')}>
            {uploading(last)}
          </Text>
        ) : null}
      </View>
      {error !== null ? (
        <View style={styles.row}>
          <FormError message={error} testID={part('error')} />
          {last ? (
            <Button
              label="Try again"
              variant="quiet"
              accessibilityLabel={retryAccessibilityLabel?.(last)}
              onPress={() => pick(last)}
              testID={part('retry')}
            />
          ) : null}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  picker: { gap: space.sm },
  row: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md },
});
