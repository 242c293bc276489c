import { Link } from 'expo-router';
import { useState } from 'react';
import { Controller } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';
import * as z from 'zod/mini';

import {
  Choice,
  Form,
  FormError,
  FormField,
  SubmitButton,
  TextField,
  useApiForm,
} from '@/components/forms';
import { nameSchema } from '@/components/forms/schemas';
import { trialsHref } from '@/components/hrefs';
import { useBreakpoints } from '@/components/layout';
import {
  isApiError,
  useTrialQuery,
  useTrialRanksMutation,
  useTrialTestCreateMutation,
  type ShopSummary,
  type Trial,
  type TrialTest,
  type TrialTestKind,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { colors, space, type } from '@/components/theme';
import { Notice, Panel, useDocumentTitle } from '@/components/ui';
import { fromLocalInput, toLocalInput } from '@/components/zones/chartRange';
import { TRIAL_TEST_KINDS } from '@/ingest/wire';
import { TRIAL_KIND_WORDS } from '@/ingest/words';

import { TrialStandingsPanel } from './TrialStandingsPanel';
import { TrialTestPhotos } from './TrialTestPhotos';

/** One trial: its standings, its tests with their ranks, and the form that adds a test. */
export function TrialScreen({ trialId }: { trialId: string }) {
  const shop = useFrameShop();
  const trial = useTrialQuery(shop.id, trialId);
  const { isWide } = useBreakpoints();
  useDocumentTitle(trial.data ? `${trial.data.name} · Trials` : 'Trials', shop.name);
  if (trial.isError) {
    return (
      <>
        <Notice title="The trial could not be loaded">{trial.error.message}</Notice>
        <BackLink shopId={shop.id} />
      </>
    );
  }
  if (!trial.data) return <Notice title="Loading the trial…" />;
  const data = trial.data;
  const writer = shop.role !== 'viewer';
  const tests = data.tests.map((test) => (
    <TestPanel key={test.id} shop={shop} trial={data} test={test} writer={writer} />
  ));
  const addTest = writer ? <NewTestForm shop={shop} trialId={data.id} /> : null;
  return (
    <>
      <BackLink shopId={shop.id} />
      <Text style={type.title} role="heading" aria-level={2} testID="trial-name">
        {data.name}
      </Text>
      {isWide ? (
        // Wide: the standings and the new test beside the tests, so ranking shows its effect.
        <View style={styles.columns}>
          <View style={styles.column}>
            <TrialStandingsPanel trial={data} />
            {addTest}
          </View>
          <View style={styles.column}>{tests}</View>
        </View>
      ) : (
        <>
          <TrialStandingsPanel trial={data} />
          {tests}
          {addTest}
        </>
      )}
    </>
  );
}

function BackLink({ shopId }: { shopId: string }) {
  return (
    <Link href={trialsHref(shopId)} style={styles.link}>
      All trials
    </Link>
  );
}

function rankText(test: TrialTest, treatmentId: string): string {
  const rank = test.ranks.find((r) => r.treatmentId === treatmentId)?.rank;
  return rank === undefined ? '' : String(rank);
}

interface TestPanelProps {
  shop: ShopSummary;
  trial: Trial;
  test: TrialTest;
  writer: boolean;
}

/** A test's window and its ranks, one field a treatment (1 = best; a shared rank for a tie). */
function TestPanel({ shop, trial, test, writer }: TestPanelProps) {
  const save = useTrialRanksMutation(shop.id, trial.id);
  const [ranks, setRanks] = useState<Record<string, string>>(() =>
    Object.fromEntries(trial.treatments.map((t) => [t.id, rankText(test, t.id)])),
  );
  const [localError, setLocalError] = useState<string | null>(null);
  const span = `${toLocalInput(Date.parse(test.from), shop.timeZone).replace('T', ' ')} – ${toLocalInput(
    Date.parse(test.to),
    shop.timeZone,
  ).replace('T', ' ')}`;
  const submit = () => {
    const entries = trial.treatments.map((t) => ({
      treatmentId: t.id,
      rank: Number((ranks[t.id] ?? '').trim().replace(',', '.')),
    }));
    if (entries.some((e) => !Number.isFinite(e.rank) || e.rank <= 0)) {
      setLocalError(`Give every treatment a rank from 1 (best) to ${trial.treatments.length}`);
      return;
    }
    setLocalError(null);
    save.mutate({ testId: test.id, ranks: entries });
  };
  const serverError = isApiError(save.error)
    ? (save.error.details[0]?.message ?? save.error.message)
    : save.error?.message;
  return (
    <Panel title={test.name} testID="trial-test">
      <Text style={type.small}>
        {TRIAL_KIND_WORDS[test.kind]} · {span} ({shop.timeZone}) ·{' '}
        {test.ranks.length > 0 ? 'ranked' : 'not ranked yet'}
      </Text>
      <Form onSubmit={submit} style={styles.ranks}>
        {trial.treatments.map((t) => (
          <View key={t.id} style={styles.rankField}>
            <TextField
              label={`Rank of ${t.name} in ${test.name}`}
              value={ranks[t.id] ?? ''}
              onChangeText={(text) => setRanks((r) => ({ ...r, [t.id]: text }))}
              inputMode="decimal"
              editable={writer && !save.isPending}
              testID="trial-rank"
            />
          </View>
        ))}
      </Form>
      {writer ? (
        <>
          <FormError message={localError ?? serverError} />
          <SubmitButton
            label="Save ranks"
            sendingLabel="Saving…"
            sending={save.isPending}
            onPress={submit}
            testID="trial-rank-submit"
          />
        </>
      ) : null}
      <TrialTestPhotos shop={shop} trialId={trial.id} test={test} />
    </Panel>
  );
}

const KIND_OPTIONS = TRIAL_TEST_KINDS.map((kind) => ({
  value: kind,
  label: TRIAL_KIND_WORDS[kind],
}));

/** The add-a-test form's values: times as typed on the shop's clock, read by fromLocalInput. */
type NewTestValues = { name: string; kind: string; from: string; to: string };

function newTestSchema(timeZone: string) {
  const localTime = (message: string) =>
    z.string().check(z.refine((text) => fromLocalInput(text, timeZone) !== null, message));
  return z.object({
    name: nameSchema,
    kind: z.string().check(z.minLength(1, 'Choose the kind of test')),
    from: localTime('Give the start as YYYY-MM-DD HH:MM'),
    to: localTime('Give the end as YYYY-MM-DD HH:MM'),
  });
}

function NewTestForm({ shop, trialId }: { shop: ShopSummary; trialId: string }) {
  const create = useTrialTestCreateMutation(shop.id, trialId);
  const { form, control, submit, sending, formError } = useApiForm<NewTestValues>({
    schema: newTestSchema(shop.timeZone),
    defaultValues: { name: '', kind: '', from: '', to: '' },
    fields: ['name', 'kind', 'from', 'to'],
    send: async (values) => {
      await create.mutateAsync({
        name: values.name.trim(),
        kind: values.kind as TrialTestKind,
        // The schema has checked both times, so neither is null here.
        from: new Date(fromLocalInput(values.from, shop.timeZone)!).toISOString(),
        to: new Date(fromLocalInput(values.to, shop.timeZone)!).toISOString(),
      });
      form.reset({ name: '', kind: values.kind, from: '', to: '' });
    },
  });
  return (
    <Panel title="Add a test" hint={`Times on the shop's clock (${shop.timeZone}).`}>
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="name"
          label="Test name"
          placeholder="e.g. Wet glass overnight"
          editable={!sending}
          testID="trial-test-name"
        />
        <Controller
          control={control}
          name="kind"
          render={({ field, fieldState }) => (
            <Choice
              label="Kind of test"
              options={KIND_OPTIONS}
              value={(field.value || null) as TrialTestKind | null}
              onChange={field.onChange}
              disabled={sending}
              error={fieldState.error?.message}
              testID="trial-test-kind"
            />
          )}
        />
        <FormField
          control={control}
          name="from"
          label="From (YYYY-MM-DD HH:MM)"
          placeholder="2026-03-02 18:00"
          editable={!sending}
          testID="trial-test-from"
        />
        <FormField
          control={control}
          name="to"
          label="To (YYYY-MM-DD HH:MM)"
          placeholder="2026-03-03 07:00"
          editable={!sending}
          testID="trial-test-to"
        />
        <FormError message={formError} />
        <SubmitButton
          label="Add test"
          sendingLabel="Adding…"
          sending={sending}
          onPress={submit}
          testID="trial-test-submit"
        />
      </Form>
    </Panel>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  columns: { flexDirection: 'row', alignItems: 'flex-start', gap: space.xl },
  column: { flex: 1, minWidth: 0, gap: space.lg },
  ranks: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  rankField: { minWidth: 150, flexGrow: 1, flexBasis: 150 },
  link: {
    ...type.body,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
    paddingVertical: space.md,
  },
});
