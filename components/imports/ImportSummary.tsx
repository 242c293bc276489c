import { StyleSheet, Text, View } from 'react-native';

import { fetchRejectedRows, useRejectedRowsQuery, type Import } from '@/components/queries';
import { colors, space, tabular, type } from '@/components/theme';
import { DownloadButton } from '@/components/ui';
import { IMPORT_STATUS_WORDS, IMPORT_WORDS } from '@/ingest/words';

import { formatImportSpan, importFigures } from './importText';
import { readRejectedRows } from './rejectedRows';
import { RejectedList } from './RejectedList';

/** Rejected rows listed on the page; the CSV holds every one. */
const REJECTED_SHOWN = 10;

interface ImportSummaryProps {
  shopId: string;
  imp: Import;
  timeZone: string;
}

/**
 * A finished import: stored, already there, rejected (with the first rejected rows and the CSV
 * of all of them), the time span it brought in, and the note that past readings raise no alarm.
 * A failed import says why in the server's words; a cancelled one that nothing was stored.
 */
export function ImportSummary({ shopId, imp, timeZone }: ImportSummaryProps) {
  const rejected = useRejectedRowsQuery(shopId, imp.sensorId, imp.id, imp.rowsRejected > 0);
  const rows = rejected.data ? readRejectedRows(rejected.data, REJECTED_SHOWN) : [];
  return (
    <View style={styles.box} testID="import-summary">
      <View style={styles.head}>
        <Text style={[type.heading, styles.grow]} role="heading" aria-level={3}>
          {imp.fileName}
        </Text>
        <Text
          style={[type.label, imp.status === 'failed' && styles.failed]}
          testID="import-summary-status"
        >
          {IMPORT_STATUS_WORDS[imp.status]}
        </Text>
      </View>
      {imp.error ? (
        <Text style={[type.body, styles.failed]} role="alert" testID="import-summary-error">
          {imp.error.message}
        </Text>
      ) : null}
      <View style={styles.figures}>
        {importFigures(imp).map((figure) => (
          <View key={figure.key} style={styles.figure}>
            <Text style={type.small}>{figure.label}</Text>
            <Text style={[type.title, tabular]} testID={`import-summary-${figure.key}`}>
              {figure.value}
            </Text>
          </View>
        ))}
      </View>
      <View style={styles.figure}>
        <Text style={type.small}>{IMPORT_WORDS.span}</Text>
        <Text style={[type.body, tabular]} testID="import-summary-span">
          {formatImportSpan(imp, timeZone)}
        </Text>
      </View>
      {imp.rowsRejected > 0 ? (
        <>
          <RejectedList rows={rows} total={imp.rowsRejected} />
          {rejected.isError ? (
            <Text style={[type.small, styles.failed]}>{rejected.error.message}</Text>
          ) : null}
          <DownloadButton
            format="csv"
            label={IMPORT_WORDS.downloadRejected}
            fetchFile={() => fetchRejectedRows(shopId, imp.sensorId, imp.id)}
            fallbackName={`rejected-rows-${imp.fileName.replace(/\.[^.]*$/, '')}.csv`}
            testID="import-rejected"
          />
        </>
      ) : null}
      {imp.status === 'done' ? (
        <Text style={type.small} testID="import-summary-note">
          {IMPORT_WORDS.noAlarms}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.md },
  head: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md },
  grow: { flex: 1 },
  failed: { color: colors.wet },
  figures: { flexDirection: 'row', flexWrap: 'wrap', rowGap: space.sm },
  figure: { minWidth: 110, flexGrow: 1, gap: 2 },
});
