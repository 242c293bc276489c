import { useRef, useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button, FormError } from '@/components/forms';
import { useImportUploadMutation } from '@/components/queries';
import { space, type } from '@/components/theme';
import { formatFileSize, IMPORT_WORDS } from '@/ingest/words';

import type { ImportFilePickerProps } from './ImportFilePicker';

/**
 * A 44 px button in front of a hidden file input (the input cannot be styled to the app's look,
 * and its own button is too small to tap). The chosen file goes up at once; while it goes,
 * "Uploading <file>…" is announced; a refusal (too large, empty, not text, no header, one
 * column) shows the server's own sentence with a retry of the same file.
 */
export function ImportFilePicker({
  shopId,
  sensorId,
  label,
  onUploaded,
  testID = 'import-file',
}: ImportFilePickerProps) {
  const input = useRef<HTMLInputElement>(null);
  const upload = useImportUploadMutation(shopId, sensorId);
  // Kept for "Try again": the input is cleared after each pick so the same file can be re-picked.
  const [last, setLast] = useState<File | null>(null);
  const send = (file: File) => {
    setLast(file);
    upload.mutate({ file, fileName: file.name || 'logger.csv' }, { onSuccess: onUploaded });
  };
  return (
    <View style={styles.picker}>
      <input
        ref={input}
        type="file"
        accept=".csv,.txt,.tsv,text/csv,text/plain,text/tab-separated-values"
        hidden
        tabIndex={-1}
        aria-hidden
        data-testid={`${testID}-input`}
        onChange={(event) => {
          const file = event.currentTarget.files?.[0];
          event.currentTarget.value = '';
          if (file) send(file);
        }}
      />
      <View style={styles.row}>
        <Button
          label={label}
          variant={last ? 'quiet' : 'primary'}
          disabled={upload.isPending}
          busy={upload.isPending}
          onPress={() => input.current?.click()}
          testID={testID}
        />
        {upload.isPending && last ? (
          <Text style={type.body} aria-live="polite" testID={`${testID}-status`}>
            {IMPORT_WORDS.uploading(last.name)} ({formatFileSize(last.size)})
          </Text>
        ) : null}
      </View>
      {upload.isError ? (
        <View style={styles.row}>
          <FormError message={upload.error.message} testID={`${testID}-error`} />
          {last ? (
            <Button
              label="Try again"
              variant="quiet"
              accessibilityLabel={`Try again to upload ${last.name}`}
              onPress={() => send(last)}
              testID={`${testID}-retry`}
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
