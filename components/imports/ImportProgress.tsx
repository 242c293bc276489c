import { StyleSheet, Text, View } from 'react-native';

import { ConfirmButton, FormError } from '@/components/forms';
import type { Import } from '@/components/queries';
import { colors, radius, space, tabular, type } from '@/components/theme';
import {
  formatRowCount,
  IMPORT_STATUS_WORDS,
  IMPORT_WORDS,
  importProgressText,
} from '@/ingest/words';

import { importShare } from './importText';

interface ProgressBarProps {
  rowsRead: number;
  /** Data rows in the file, when the upload counted them. */
  dataRows: number | null;
  label: string;
}

/**
 * A bar of the rows read out of the file's data rows, with the words beside it, as an ARIA
 * progressbar (its value the rows read, so a screen reader says "1,200 of 5,000 rows read").
 * Without a row count it has no share to show and says how many rows are read so far.
 */
export function ProgressBar({ rowsRead, dataRows, label }: ProgressBarProps) {
  const share = importShare(rowsRead, dataRows);
  const text = importProgressText(rowsRead, share === null ? null : dataRows);
  return (
    <View style={styles.bar}>
      <View
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={share === null ? undefined : (dataRows ?? undefined)}
        aria-valuenow={share === null ? undefined : rowsRead}
        aria-valuetext={text}
        style={styles.track}
        testID="import-progress-bar"
      >
        <View
          style={[styles.fill, share === null ? styles.unknown : { width: `${share * 100}%` }]}
          testID="import-progress-fill"
        />
      </View>
      <Text style={[type.body, tabular]} testID="import-progress-text">
        {text}
      </Text>
    </View>
  );
}

interface ImportProgressProps {
  imp: Import;
  dataRows: number | null;
  /** Owners and members may cancel; viewers watch. */
  canCancel: boolean;
  cancelling: boolean;
  cancelError: string | null;
  onCancel: () => void;
}

/** A queued or running import: its bar, stored and rejected so far, and Cancel (asked first). */
export function ImportProgress({
  imp,
  dataRows,
  canCancel,
  cancelling,
  cancelError,
  onCancel,
}: ImportProgressProps) {
  return (
    <View style={styles.box} testID="import-progress">
      <Text style={type.heading} role="heading" aria-level={3}>
        {IMPORT_WORDS.progressTitle(imp.fileName)}
      </Text>
      <Text style={type.small} role="status" testID="import-progress-status">
        {IMPORT_STATUS_WORDS[imp.status]}
      </Text>
      <ProgressBar
        rowsRead={imp.rowsRead}
        dataRows={dataRows}
        label={IMPORT_WORDS.progressTitle(imp.fileName)}
      />
      <View style={styles.counts}>
        <Count
          label={IMPORT_WORDS.rowsStored}
          value={imp.rowsStored}
          testID="import-progress-stored"
        />
        <Count
          label={IMPORT_WORDS.rowsRejected}
          value={imp.rowsRejected}
          testID="import-progress-rejected"
        />
      </View>
      {canCancel ? (
        <ConfirmButton
          label={IMPORT_WORDS.cancel}
          confirmLabel="Yes, cancel it"
          question={IMPORT_WORDS.cancelQuestion}
          disabled={cancelling}
          onConfirm={onCancel}
          testID="import-cancel"
        />
      ) : null}
      <FormError message={cancelError} testID="import-cancel-error" />
    </View>
  );
}

function Count({ label, value, testID }: { label: string; value: number; testID: string }) {
  return (
    <View style={styles.count}>
      <Text style={type.small}>{label}</Text>
      <Text style={[type.heading, tabular]} testID={testID}>
        {formatRowCount(value)}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.md },
  bar: { gap: space.xs },
  track: {
    height: 12,
    borderRadius: radius.control,
    backgroundColor: colors.paper,
    borderWidth: 1,
    borderColor: colors.iron,
    overflow: 'hidden',
  },
  fill: { height: '100%', backgroundColor: colors.air },
  // No share known: a quarter-width band says "working" without claiming how far.
  unknown: { width: '25%', backgroundColor: colors.air, opacity: 0.5 },
  counts: { flexDirection: 'row', gap: space.xl },
  count: { gap: 2 },
});
