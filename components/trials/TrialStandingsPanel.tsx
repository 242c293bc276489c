import { StyleSheet, Text, View } from 'react-native';

import type { Trial } from '@/components/queries';
import { colors, space, tabular, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import { TRIAL_PAIRS_METHOD, formatP, trialPairText } from '@/ingest/words';

/**
 * The standings the server computed (ingest/trials/standings.ts): rank totals and mean ranks
 * (lower is better), the verdict, the Friedman test with Kendall's W, and the pairs that differ
 * when the Friedman p is below 0.05.
 */
export function TrialStandingsPanel({ trial }: { trial: Trial }) {
  const { standings } = trial;
  const nameOf = (id: string) => trial.treatments.find((t) => t.id === id)?.name ?? '—';
  const rows = [...standings.rankTotals].sort((a, b) => a.meanRank - b.meanRank);
  return (
    <Panel title="Standings" testID="trial-standings">
      <Text style={type.body} testID="trial-verdict">
        {standings.verdict}
      </Text>
      <Text style={type.small}>
        {standings.tests} {standings.tests === 1 ? 'test' : 'tests'} ranked; 1 = best.
      </Text>
      {standings.tests > 0 ? (
        <View role="table" aria-label="Rank totals">
          <View role="row" style={[styles.row, styles.head]}>
            <Text role="columnheader" style={[type.label, styles.name]}>
              Treatment
            </Text>
            <Text role="columnheader" style={[type.label, styles.num]}>
              Rank total
            </Text>
            <Text role="columnheader" style={[type.label, styles.num]}>
              Mean rank
            </Text>
          </View>
          {rows.map((r) => (
            <View role="row" key={r.treatmentId} style={styles.row} testID="trial-standing">
              <Text role="cell" style={[type.body, styles.name]}>
                {nameOf(r.treatmentId)}
              </Text>
              <Text role="cell" style={[type.body, tabular, styles.num]}>
                {fmt(r.total, 1)}
              </Text>
              <Text role="cell" style={[type.body, tabular, styles.num]}>
                {r.meanRank.toFixed(2)}
              </Text>
            </View>
          ))}
        </View>
      ) : null}
      {standings.friedman ? (
        <View style={styles.figures}>
          <Figure
            label="Friedman χ²"
            value={fmt(standings.friedman.statistic, 2)}
            testID="trial-friedman"
          />
          <Figure label="df" value={String(standings.friedman.df)} testID="trial-df" />
          <Figure label="Chance" value={formatP(standings.friedman.p)} testID="trial-p" />
          {standings.kendallW !== null ? (
            <Figure label="Kendall's W" value={fmt(standings.kendallW, 2)} testID="trial-w" />
          ) : null}
        </View>
      ) : null}
      {standings.pairs.length > 0 ? (
        <View style={styles.pairs} testID="trial-pairs">
          <Text style={type.heading} role="heading" aria-level={3}>
            Pairs (Holm-adjusted)
          </Text>
          {standings.pairs.map((pair) => (
            <Text key={`${pair.better}-${pair.worse}`} style={type.body} testID="trial-pair">
              {trialPairText(nameOf(pair.better), nameOf(pair.worse), pair)}
            </Text>
          ))}
          <Text style={type.small}>{TRIAL_PAIRS_METHOD}</Text>
        </View>
      ) : null}
    </Panel>
  );
}

function fmt(value: number, digits: number): string {
  return Number.isInteger(value) ? String(value) : value.toFixed(digits);
}

function Figure({ label, value, testID }: { label: string; value: string; testID: string }) {
  return (
    <View style={styles.figure}>
      <Text style={type.small}>{label}</Text>
      <Text style={[type.body, tabular]} testID={testID}>
        {value}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    gap: space.md,
    paddingVertical: space.xs,
    borderBottomWidth: 1,
    borderBottomColor: colors.border,
  },
  head: { borderBottomColor: colors.ink },
  name: { flex: 2 },
  num: { flex: 1, textAlign: 'right' },
  figures: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  figure: { minWidth: 90, gap: 2 },
  pairs: { gap: space.xs },
});
