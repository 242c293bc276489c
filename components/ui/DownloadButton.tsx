import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/forms';
import type { DownloadedFile, FileFormat } from '@/components/queries';
import { colors, space, type } from '@/components/theme';

import { saveFile } from './saveFile';

const FORMAT_WORDS: Record<FileFormat, string> = { csv: 'CSV', pdf: 'PDF' };

interface DownloadButtonProps {
  format: FileFormat;
  /** The button's words when "Download CSV" alone does not say what ("Download rejected rows (CSV)"). */
  label?: string;
  /** Fetches the file with the session (components/queries: fetchWeekReportFile, fetchTrialFile). */
  fetchFile: () => Promise<DownloadedFile>;
  /** The name the file is saved under when the server names none. */
  fallbackName: string;
  /** Test ids: `<testID>-<format>`, `…-button`, `…-error`, `…-retry`. */
  testID: string;
}

type State = { step: 'idle' } | { step: 'busy' } | { step: 'failed'; message: string };

/**
 * Fetches a CSV or PDF the server makes (a week report, a trial) with the session and saves it
 * under the server's file name. While the file is made the button says so and is busy; a
 * failure keeps the server's sentence beside a retry.
 */
export function DownloadButton({
  format,
  label,
  fetchFile,
  fallbackName,
  testID,
}: DownloadButtonProps) {
  const [state, setState] = useState<State>({ step: 'idle' });
  const words = FORMAT_WORDS[format];
  const busy = state.step === 'busy';
  const id = `${testID}-${format}`;

  const download = async () => {
    setState({ step: 'busy' });
    try {
      const file = await fetchFile();
      await saveFile(file.blob, file.filename ?? fallbackName);
      setState({ step: 'idle' });
    } catch (error) {
      setState({
        step: 'failed',
        message: error instanceof Error ? error.message : `The ${words} could not be made.`,
      });
    }
  };

  return (
    <View style={styles.box} testID={id}>
      <Button
        label={busy ? `Preparing ${words}…` : (label ?? `Download ${words}`)}
        variant="quiet"
        disabled={busy}
        busy={busy}
        onPress={() => void download()}
        testID={`${id}-button`}
      />
      {state.step === 'failed' ? (
        <View style={styles.error} role="alert" testID={`${id}-error`}>
          <Text style={[type.body, styles.errorText]}>
            The {words} could not be downloaded: {state.message}
          </Text>
          <Button
            label="Try again"
            variant="quiet"
            accessibilityLabel={`Try again to download the ${words}`}
            onPress={() => void download()}
            testID={`${id}-retry`}
          />
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm, flexShrink: 1, alignItems: 'flex-start' },
  error: { gap: space.sm, alignItems: 'flex-start' },
  errorText: { color: colors.wet },
});
