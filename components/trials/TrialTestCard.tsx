import type { ReactNode } from 'react';
import type { Path } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';
import * as z from 'zod/mini';

import { Form, FormError, FormField, SubmitButton, useApiForm } from '@/components/forms';
import { parseDecimal } from '@/components/forms/schemas';
import {
  useTrialRanksMutation,
  type ShopSummary,
  type Trial,
  type TrialTest,
  type UnitPref,
} from '@/components/queries';
import { space, tabular, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import { toLocalInput } from '@/components/zones/chartRange';
import { TRIAL_CONDITION_WORDS, TRIAL_KIND_WORDS, trialConditionLines } from '@/ingest/words';

interface TrialTestCardProps {
  shop: ShopSummary;
  trial: Trial;
  test: TrialTest;
  /** The test's zone by name, when it has one and the zone still exists. */
  zoneName: string | null;
  unit: UnitPref;
  writer: boolean;
  /** Parts shown under the ranks (the test's photos). */
  children?: ReactNode;
}

/**
 * One test of a trial: its kind and window on the shop's clock, the zone it was run in with the
 * conditions recorded there (in the reader's unit), and its ranks, one field a treatment.
 */
export function TrialTestCard({
  shop,
  trial,
  test,
  zoneName,
  unit,
  writer,
  children,
}: TrialTestCardProps) {
  const local = (at: string) => toLocalInput(Date.parse(at), shop.timeZone).replace('T', ' ');
  return (
    <Panel title={test.name} testID="trial-test">
      <Text style={type.small}>
        {TRIAL_KIND_WORDS[test.kind]} · {local(test.from)} – {local(test.to)} ({shop.timeZone}) ·{' '}
        {test.ranks.length > 0 ? 'ranked' : 'not ranked yet'}
      </Text>
      {test.zoneId ? <TestConditions test={test} zoneName={zoneName} unit={unit} /> : null}
      <RanksForm shop={shop} trial={trial} test={test} writer={writer} />
      {children}
    </Panel>
  );
}

function TestConditions({
  test,
  zoneName,
  unit,
}: {
  test: TrialTest;
  zoneName: string | null;
  unit: UnitPref;
}) {
  const c = test.conditions ?? null;
  return (
    <View style={styles.conditions} testID="trial-test-conditions">
      <Text style={type.body}>In {zoneName ?? 'a zone no longer in the shop'}</Text>
      {c ? (
        <View style={styles.figures}>
          {trialConditionLines(c, unit).map(([label, value]) => (
            <View key={label} style={styles.figure}>
              <Text style={type.small}>{label}</Text>
              <Text style={[type.body, tabular]}>{value}</Text>
            </View>
          ))}
        </View>
      ) : (
        <Text style={type.small}>{TRIAL_CONDITION_WORDS.noReadings}</Text>
      )}
    </View>
  );
}

function rankText(test: TrialTest, treatmentId: string): string {
  const rank = test.ranks.find((r) => r.treatmentId === treatmentId)?.rank;
  return rank === undefined ? '' : String(rank);
}

type RanksValues = { ranks: string[] };

/** A rank from 1 to n, whole or a half (the server's rule: a tie entered as 1.5 for two firsts). */
function ranksSchema(n: number) {
  const rank = z.string().check(
    z.refine((text) => {
      const value = parseDecimal(text.trim());
      return text.trim() !== '' && value >= 1 && value <= n && Number.isInteger(value * 2);
    }, `Give a rank from 1 (best) to ${n}; tied treatments may share one`),
  );
  return z.object({ ranks: z.array(rank) });
}

/** The server names `ranks.2.rank` for one field and `ranks` for the set; both land on a field. */
function rankFieldOf(serverPath: string): string | undefined {
  const one = /^ranks\.(\d+)/.exec(serverPath);
  if (one) return `ranks.${one[1]}`;
  return serverPath === 'ranks' ? 'ranks.0' : undefined;
}

function RanksForm({
  shop,
  trial,
  test,
  writer,
}: {
  shop: ShopSummary;
  trial: Trial;
  test: TrialTest;
  writer: boolean;
}) {
  const save = useTrialRanksMutation(shop.id, trial.id);
  const fields = trial.treatments.map((_t, i) => `ranks.${i}` as Path<RanksValues>);
  const { control, submit, sending, formError } = useApiForm<RanksValues>({
    schema: ranksSchema(trial.treatments.length),
    defaultValues: { ranks: trial.treatments.map((t) => rankText(test, t.id)) },
    fields,
    fieldOf: rankFieldOf,
    send: (values) =>
      save.mutateAsync({
        testId: test.id,
        ranks: trial.treatments.map((t, i) => ({
          treatmentId: t.id,
          rank: parseDecimal((values.ranks[i] ?? '').trim()),
        })),
      }),
  });
  return (
    <Form onSubmit={submit} style={styles.form}>
      <View style={styles.ranks}>
        {trial.treatments.map((t, i) => (
          <View key={t.id} style={styles.rankField}>
            <FormField
              control={control}
              name={fields[i]!}
              label={`Rank of ${t.name} in ${test.name}`}
              inputMode="decimal"
              editable={writer && !sending}
              testID="trial-rank"
            />
          </View>
        ))}
      </View>
      {writer ? (
        <>
          <FormError message={formError} />
          <SubmitButton
            label="Save ranks"
            sendingLabel="Saving…"
            sending={sending}
            onPress={submit}
            testID="trial-rank-submit"
          />
        </>
      ) : null}
    </Form>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.md },
  ranks: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  rankField: { minWidth: 150, flexGrow: 1, flexBasis: 150 },
  conditions: { gap: space.xs },
  figures: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  figure: { minWidth: 120, gap: 2 },
});
