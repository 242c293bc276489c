import { StyleSheet, Text, View } from 'react-native';

import { colors, space, tabular, type } from '@/components/theme';
import { formatRowCount, IMPORT_WORDS } from '@/ingest/words';

import type { RejectedRow } from './rejectedRows';

interface RejectedListProps {
  rows: RejectedRow[];
  /** How many rows the import rejected in all (the list shows the first few). */
  total: number;
}

/** The first rejected rows: the file's line number, the reason and the line as it was. */
export function RejectedList({ rows, total }: RejectedListProps) {
  if (rows.length === 0) return null;
  return (
    <View style={styles.box} testID="import-rejected-list">
      <Text style={type.label} role="heading" aria-level={4}>
        {IMPORT_WORDS.rejectedTitle}
      </Text>
      <View role="list">
        {rows.map((row) => (
          <View key={row.line} role="listitem" style={styles.item} testID="import-rejected-row">
            <Text style={[type.body, tabular, styles.line]}>
              {IMPORT_WORDS.line} {formatRowCount(row.line)}
            </Text>
            <View style={styles.text}>
              <Text style={type.body}>{row.reason}</Text>
              {row.row ? (
                <Text style={[type.small, tabular]} numberOfLines={1}>
                  {row.row}
                </Text>
              ) : null}
            </View>
          </View>
        ))}
      </View>
      {total > rows.length ? (
        <Text style={type.small}>{IMPORT_WORDS.rejectedMore(rows.length, total)}</Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.xs },
  item: {
    flexDirection: 'row',
    gap: space.md,
    paddingVertical: space.xs,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
  },
  line: { width: 96 },
  text: { flex: 1, minWidth: 0 },
});
