import { formatInTimeZone } from 'date-fns-tz';
import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import type { CareEntry } from '@/components/queries';
import { colors, space, type } from '@/components/theme';
import { Panel } from '@/components/ui';

import { careEntryTitle } from './careText';

interface CareTimelineProps {
  care: readonly CareEntry[];
  timeZone: string;
  /** Extra content under an entry (its photos), so the row grows without changing here. */
  renderExtra?: (entry: CareEntry) => ReactNode;
}

/** The care log, newest first: what was done, with what, by whom, when on the shop's clock, the note. */
export function CareTimeline({ care, timeZone, renderExtra }: CareTimelineProps) {
  return (
    <Panel title="Care log" testID="care-timeline">
      {care.length === 0 ? (
        <Text style={type.body}>Nothing logged yet.</Text>
      ) : (
        <View role="list" style={styles.list}>
          {care.map((entry) => (
            <CareEntryRow key={entry.id} entry={entry} timeZone={timeZone}>
              {renderExtra?.(entry)}
            </CareEntryRow>
          ))}
        </View>
      )}
    </Panel>
  );
}

interface CareEntryRowProps {
  entry: CareEntry;
  timeZone: string;
  children?: ReactNode;
}

export function CareEntryRow({ entry, timeZone, children }: CareEntryRowProps) {
  const when = formatInTimeZone(Date.parse(entry.at), timeZone, 'd MMM yyyy HH:mm');
  return (
    <View role="listitem" style={styles.row} testID="care-entry">
      <Text style={styles.glyph} aria-hidden>
        {entry.kind === 'coating' ? '▲' : '◆'}
      </Text>
      <View style={styles.body}>
        <Text style={type.heading} testID="care-entry-title">
          {careEntryTitle(entry)}
        </Text>
        <Text style={type.small} testID="care-entry-when">
          {when} ({timeZone}) · {entry.by ? entry.by.name : 'a former member'}
        </Text>
        {entry.note ? <Text style={type.body}>{entry.note}</Text> : null}
        {children}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  row: {
    flexDirection: 'row',
    gap: space.md,
    paddingBottom: space.md,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
  },
  glyph: { ...type.body, color: colors.ink, width: 16, textAlign: 'center' },
  body: { flex: 1, minWidth: 0, gap: space.xs },
});
