import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/forms';
import { fetchWeekReportFile } from '@/components/queries';
import { colors, space, type } from '@/components/theme';

import { saveFile } from './saveFile';

type Format = 'csv' | 'pdf';

const FORMAT_WORDS: Record<Format, string> = { csv: 'CSV', pdf: 'PDF' };

interface DownloadButtonProps {
  shopId: string;
  /** The week's Monday, shop-local, YYYY-MM-DD. */
  start: string;
  format: Format;
}

type State = { step: 'idle' } | { step: 'busy' } | { step: 'failed'; message: string };

/**
 * Fetches the week's CSV or PDF with the session and saves it under the server's file name.
 * While the file is made the button says so and is busy; a failure keeps the server's sentence
 * beside a retry.
 */
export function DownloadButton({ shopId, start, format }: DownloadButtonProps) {
  const [state, setState] = useState<State>({ step: 'idle' });
  const words = FORMAT_WORDS[format];
  const busy = state.step === 'busy';

  const download = async () => {
    setState({ step: 'busy' });
    try {
      const file = await fetchWeekReportFile(shopId, start, format);
      await saveFile(file.blob, file.filename ?? `drybench-week-${start}.${format}`);
      setState({ step: 'idle' });
    } catch (error) {
      setState({
        step: 'failed',
        message: error instanceof Error ? error.message : `The ${words} could not be made.`,
      });
    }
  };

  return (
    <View style={styles.box} testID={`report-download-${format}`}>
      <Button
        label={busy ? `Preparing ${words}…` : `Download ${words}`}
        variant="quiet"
        disabled={busy}
        busy={busy}
        onPress={() => void download()}
        testID={`report-download-${format}-button`}
      />
      {state.step === 'failed' ? (
        <View style={styles.error} role="alert" testID={`report-download-${format}-error`}>
          <Text style={[type.body, styles.errorText]}>
            The {words} could not be downloaded: {state.message}
          </Text>
          <Button
            label="Try again"
            variant="quiet"
            accessibilityLabel={`Try again to download the ${words}`}
            onPress={() => void download()}
            testID={`report-download-${format}-retry`}
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
