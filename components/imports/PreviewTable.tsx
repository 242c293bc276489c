import { ScrollView, StyleSheet, Text, View, type ScrollViewProps } from 'react-native';

import type { ImportPreview } from '@/components/queries';
import { colors, fonts, space, tabular, type } from '@/components/theme';
import { IMPORT_WORDS } from '@/ingest/words';

/** Rows shown of the server's 20: enough to see the time steps and the values' shape. */
export const PREVIEW_ROWS_SHOWN = 10;

// JetBrains Mono at 12 px advances 7.2 px per character (0.6 em); a column fits its longest
// cell, between a short number's width and one that still leaves room for the next on a phone.
const CHAR_PX = 7.2;
const CELL_MIN_PX = 64;
const CELL_MAX_PX = 240;
const CELL_PAD_PX = space.sm * 2;

/** The width of each column: its longest cell (header or first rows) in the table's font. */
export function previewColumnWidths(preview: ImportPreview, rowsShown: number): number[] {
  return preview.columns.map((name, index) => {
    const longest = Math.max(
      name.length,
      ...preview.rows.slice(0, rowsShown).map((row) => (row[index] ?? '').length),
    );
    return Math.min(CELL_MAX_PX, Math.max(CELL_MIN_PX, Math.ceil(longest * CHAR_PX) + CELL_PAD_PX));
  });
}

interface PreviewTableProps {
  preview: ImportPreview;
  /** The role each chosen column plays ("Time"), shown under its name. */
  rolesByColumn: ReadonlyMap<string, string>;
}

/**
 * The file's first rows as the server split them, so the person can see which column is which
 * before choosing. On a phone the table scrolls sideways inside its card (the region takes the
 * keyboard focus, so arrow keys scroll it too); the page itself never does.
 */
export function PreviewTable({ preview, rolesByColumn }: PreviewTableProps) {
  const widths = previewColumnWidths(preview, PREVIEW_ROWS_SHOWN);
  const rows = preview.rows.slice(0, PREVIEW_ROWS_SHOWN);
  // react-native-web passes tabIndex to the scrolling element; React Native's types leave it out.
  const focusable = { tabIndex: 0 } as Partial<ScrollViewProps>;
  return (
    <View style={styles.box}>
      <Text style={type.small}>{IMPORT_WORDS.previewHint(rows.length, preview.lineCount)}</Text>
      <ScrollView
        horizontal
        {...focusable}
        aria-label={IMPORT_WORDS.previewTitle}
        style={styles.scroller}
        testID="import-preview"
      >
        <View role="table" aria-label={IMPORT_WORDS.previewTitle}>
          <View role="row" style={[styles.row, styles.head]}>
            {preview.columns.map((name, index) => (
              <View
                key={`${index}-${name}`}
                role="columnheader"
                style={[styles.cell, { width: widths[index] }]}
              >
                <Text style={styles.headText} numberOfLines={2}>
                  {name}
                </Text>
                {rolesByColumn.has(name) ? (
                  <Text style={styles.role} testID="import-preview-role">
                    {rolesByColumn.get(name)}
                  </Text>
                ) : null}
              </View>
            ))}
          </View>
          {rows.map((row, rowIndex) => (
            <View key={rowIndex} role="row" style={styles.row}>
              {preview.columns.map((name, index) => (
                <Text
                  key={`${index}-${name}`}
                  role="cell"
                  numberOfLines={1}
                  style={[styles.cell, styles.cellText, tabular, { width: widths[index] }]}
                >
                  {row[index] ?? ''}
                </Text>
              ))}
            </View>
          ))}
        </View>
      </ScrollView>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
  scroller: { borderWidth: 1, borderColor: colors.border, borderRadius: 6 },
  row: { flexDirection: 'row', borderBottomWidth: 1, borderBottomColor: colors.border },
  head: { backgroundColor: colors.paper },
  cell: { paddingHorizontal: space.sm, paddingVertical: space.xs },
  headText: { fontFamily: fonts.medium, fontSize: 12, lineHeight: 16, color: colors.ink },
  role: { fontFamily: fonts.medium, fontSize: 11, lineHeight: 14, color: colors.air },
  cellText: { fontFamily: fonts.regular, fontSize: 12, lineHeight: 16, color: colors.ink },
});
