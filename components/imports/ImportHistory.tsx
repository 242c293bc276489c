import { StyleSheet, Text, View } from 'react-native';

import type { Import } from '@/components/queries';
import { colors, space, tabular, type } from '@/components/theme';
import { Notice, Panel } from '@/components/ui';
import { IMPORT_STATUS_WORDS, IMPORT_WORDS } from '@/ingest/words';

import { formatImportCreated, formatImportSpan, importFigures } from './importText';

interface ImportHistoryProps {
  imports: Import[] | undefined;
  error: string | null;
  timeZone: string;
}

/** The sensor's past imports, newest first: file, when, status, figures and the span brought in. */
export function ImportHistory({ imports, error, timeZone }: ImportHistoryProps) {
  if (error) {
    return (
      <Notice title="Past imports could not be loaded" testID="import-history-error">
        {error}
      </Notice>
    );
  }
  return (
    <Panel title={IMPORT_WORDS.historyTitle} testID="import-history">
      {!imports ? (
        <Text style={type.body}>Loading…</Text>
      ) : imports.length === 0 ? (
        <Text style={type.body} testID="import-history-empty">
          {IMPORT_WORDS.historyEmpty}
        </Text>
      ) : (
        <View role="list" style={styles.list}>
          {imports.map((imp) => (
            <View key={imp.id} role="listitem" style={styles.item} testID="import-history-item">
              <View style={styles.head}>
                <Text style={[type.body, styles.name]} numberOfLines={1}>
                  {imp.fileName}
                </Text>
                <Text
                  style={[type.label, imp.status === 'failed' && styles.failed]}
                  testID="import-history-status"
                >
                  {IMPORT_STATUS_WORDS[imp.status]}
                </Text>
              </View>
              <Text style={type.small}>{formatImportCreated(imp, timeZone)}</Text>
              {imp.status === 'uploaded' ? null : (
                <>
                  <Text style={[type.small, tabular]} testID="import-history-figures">
                    {importFigures(imp)
                      .map((f) => `${f.label} ${f.value}`)
                      .join(' · ')}
                  </Text>
                  <Text style={[type.small, tabular]}>{formatImportSpan(imp, timeZone)}</Text>
                </>
              )}
              {imp.error ? (
                <Text style={[type.small, styles.failed]}>{imp.error.message}</Text>
              ) : null}
            </View>
          ))}
        </View>
      )}
    </Panel>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  item: {
    gap: 2,
    paddingBottom: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
  },
  head: { flexDirection: 'row', gap: space.md, alignItems: 'baseline' },
  name: { flex: 1, fontWeight: '600' },
  failed: { color: colors.wet },
});
