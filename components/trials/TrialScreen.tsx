import { Link } from 'expo-router';
import { Controller } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';
import * as z from 'zod/mini';

import { Choice, Form, FormError, FormField, SubmitButton, useApiForm } from '@/components/forms';
import { nameSchema } from '@/components/forms/schemas';
import { trialsHref } from '@/components/hrefs';
import { useBreakpoints } from '@/components/layout';
import {
  fetchTrialFile,
  useTrialQuery,
  useTrialTestCreateMutation,
  useUnitPref,
  useZonesQuery,
  type ShopSummary,
  type TrialTestKind,
  type Zone,
} from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { colors, space, type } from '@/components/theme';
import { DownloadButton, Notice, Panel, useDocumentTitle } from '@/components/ui';
import { fromLocalInput } from '@/components/zones/chartRange';
import { TRIAL_TEST_KINDS } from '@/ingest/wire';
import { TRIAL_KIND_WORDS } from '@/ingest/words';

import { TrialStandingsPanel } from './TrialStandingsPanel';
import { TrialTestCard } from './TrialTestCard';
import { TrialTestPhotos } from './TrialTestPhotos';

/**
 * One trial: its standings, its tests with their ranks and recorded conditions, the form that
 * adds a test, and the trial as a CSV or PDF file.
 */
export function TrialScreen({ trialId }: { trialId: string }) {
  const shop = useFrameShop();
  const trial = useTrialQuery(shop.id, trialId);
  const zones = useZonesQuery(shop.id).data?.zones ?? [];
  const unit = useUnitPref();
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
  const zoneName = (id: string | null) => zones.find((z) => z.id === id)?.name ?? null;
  const tests = data.tests.map((test) => (
    <TrialTestCard
      key={test.id}
      shop={shop}
      trial={data}
      test={test}
      zoneName={zoneName(test.zoneId)}
      unit={unit}
      writer={writer}
    >
      <TrialTestPhotos shop={shop} trialId={data.id} test={test} />
    </TrialTestCard>
  ));
  const addTest = writer ? <NewTestForm shop={shop} trialId={data.id} zones={zones} /> : null;
  return (
    <>
      <BackLink shopId={shop.id} />
      <Text style={type.title} role="heading" aria-level={2} testID="trial-name">
        {data.name}
      </Text>
      <View style={styles.downloads}>
        {(['csv', 'pdf'] as const).map((format) => (
          <DownloadButton
            key={format}
            format={format}
            fetchFile={() => fetchTrialFile(shop.id, data.id, format)}
            fallbackName={`trial.${format}`}
            testID="trial-download"
          />
        ))}
      </View>
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

const KIND_OPTIONS = TRIAL_TEST_KINDS.map((kind) => ({
  value: kind,
  label: TRIAL_KIND_WORDS[kind],
}));

/** The add-a-test form's values: times as typed on the shop's clock, read by fromLocalInput. */
type NewTestValues = { name: string; kind: string; from: string; to: string; zone: string };

/** The zone choice's value for a test run outside any zone (nothing is recorded). */
const NO_ZONE = 'none';

function newTestSchema(timeZone: string) {
  const localTime = (message: string) =>
    z.string().check(z.refine((text) => fromLocalInput(text, timeZone) !== null, message));
  return z.object({
    name: nameSchema,
    kind: z.string().check(z.minLength(1, 'Choose the kind of test')),
    from: localTime('Give the start as YYYY-MM-DD HH:MM'),
    to: localTime('Give the end as YYYY-MM-DD HH:MM'),
    zone: z.string(),
  });
}

function NewTestForm({
  shop,
  trialId,
  zones,
}: {
  shop: ShopSummary;
  trialId: string;
  zones: readonly Zone[];
}) {
  const zoneOptions = [
    { value: NO_ZONE, label: 'No zone' },
    ...zones.map((zone) => ({ value: zone.id, label: zone.name })),
  ];
  const create = useTrialTestCreateMutation(shop.id, trialId);
  const { form, control, submit, sending, formError } = useApiForm<NewTestValues>({
    schema: newTestSchema(shop.timeZone),
    defaultValues: { name: '', kind: '', from: '', to: '', zone: NO_ZONE },
    fields: ['name', 'kind', 'from', 'to', 'zone'],
    fieldOf: (path) => (path === 'zoneId' ? 'zone' : path),
    send: async (values) => {
      await create.mutateAsync({
        name: values.name.trim(),
        kind: values.kind as TrialTestKind,
        // The schema has checked both times, so neither is null here.
        from: new Date(fromLocalInput(values.from, shop.timeZone)!).toISOString(),
        to: new Date(fromLocalInput(values.to, shop.timeZone)!).toISOString(),
        ...(values.zone === NO_ZONE ? {} : { zoneId: values.zone }),
      });
      form.reset({ name: '', kind: values.kind, from: '', to: '', zone: values.zone });
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
        {zones.length > 0 ? (
          <Controller
            control={control}
            name="zone"
            render={({ field, fieldState }) => (
              <Choice
                label="Zone (its readings give the conditions)"
                options={zoneOptions}
                value={field.value || NO_ZONE}
                onChange={field.onChange}
                disabled={sending}
                error={fieldState.error?.message}
                testID="trial-test-zone"
              />
            )}
          />
        ) : null}
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
  downloads: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  link: {
    ...type.body,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
    paddingVertical: space.md,
  },
});
