import { useRef, useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button, FormError } from '@/components/forms';
import { usePhotoUploadMutation } from '@/components/queries';
import { space, type } from '@/components/theme';

import type { PhotoPickerProps } from './PhotoPicker';

/**
 * "Add a photo": a 44 px button in front of a hidden file input (the input itself cannot be
 * styled to the app's look, and its own button is too small to tap). The chosen file is sent
 * with the session; while it goes, "Uploading…" is announced; a refusal shows the server's own
 * sentence (too large, not an image, storage away) with a retry of the same file.
 */
export function PhotoPicker({ path, refresh, accessibilityLabel, testID }: PhotoPickerProps) {
  const input = useRef<HTMLInputElement>(null);
  const upload = usePhotoUploadMutation(path, refresh);
  // Kept for "Try again": the input is cleared after each pick so the same file can be re-picked.
  const [last, setLast] = useState<File | null>(null);
  const send = (file: File) => {
    setLast(file);
    upload.mutate({ file, filename: file.name || 'photo.jpg' });
  };
  return (
    <View style={styles.picker}>
      <input
        ref={input}
        type="file"
        accept="image/*"
        hidden
        tabIndex={-1}
        aria-hidden
        data-testid={testID ? `${testID}-input` : undefined}
        onChange={(event) => {
          const file = event.currentTarget.files?.[0];
          event.currentTarget.value = '';
          if (file) send(file);
        }}
      />
      <View style={styles.row}>
        <Button
          label="Add a photo"
          variant="quiet"
          accessibilityLabel={accessibilityLabel}
          disabled={upload.isPending}
          busy={upload.isPending}
          onPress={() => input.current?.click()}
          testID={testID}
        />
        {upload.isPending ? (
          <Text
            style={type.body}
            aria-live="polite"
            testID={testID ? `${testID}-status` : undefined}
          >
            Uploading…
          </Text>
        ) : null}
      </View>
      {upload.isError ? (
        <View style={styles.row}>
          <FormError
            message={upload.error.message}
            testID={testID ? `${testID}-error` : undefined}
          />
          {last ? (
            <Button
              label="Try again"
              variant="quiet"
              onPress={() => send(last)}
              testID={testID ? `${testID}-retry` : undefined}
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
