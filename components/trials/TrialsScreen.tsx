import { Link } from 'expo-router';
import * as z from 'zod/mini';
import { StyleSheet, Text, View } from 'react-native';

import { trialHref } from '@/components/hrefs';
import { Columns } from '@/components/layout';
import { Form, FormError, FormField, SubmitButton, useApiForm } from '@/components/forms';
import { nameSchema } from '@/components/forms/schemas';
import { useTrialCreateMutation, useTrialsQuery, type ShopSummary } from '@/components/queries';
import { useFrameShop } from '@/components/shop/ShopFrame';
import { ShopTabs } from '@/components/shop/ShopTabs';
import { colors, space, type } from '@/components/theme';
import { Notice, Panel, useDocumentTitle } from '@/components/ui';
import { TRIAL_MAX_TREATMENTS, TRIAL_MIN_TREATMENTS } from '@/ingest/wire';

/** A shop's protection trials and the form that starts one. */
export function TrialsScreen() {
  const shop = useFrameShop();
  useDocumentTitle('Trials', shop.name);
  const trials = useTrialsQuery(shop.id);
  const list = trials.isError ? (
    <Notice title="Trials could not be loaded">{trials.error.message}</Notice>
  ) : !trials.data ? (
    <Notice title="Loading trials…" />
  ) : trials.data.trials.length === 0 ? (
    <Notice title="No trials yet" testID="trials-empty">
      A trial compares treatments of the cast iron (a wax, an oil, a cover, nothing) over tests you
      rank them in.
    </Notice>
  ) : (
    <View style={styles.list} testID="trial-list">
      {trials.data.trials.map((trial) => (
        <Panel key={trial.id} testID="trial-card">
          <Link href={trialHref(shop.id, trial.id)} style={styles.link} testID="trial-link">
            {trial.name}
          </Link>
          <Text style={type.small}>
            {trial.treatments.map((t) => t.name).join(', ')} · {trial.tests}{' '}
            {trial.tests === 1 ? 'test' : 'tests'}
          </Text>
        </Panel>
      ))}
    </View>
  );
  const form = shop.role === 'viewer' ? null : <NewTrialForm shop={shop} />;
  return (
    <>
      <ShopTabs shop={shop} current="trials" />
      {/* Wide: the trials beside the form that starts one. */}
      <Columns first={list} second={form} />
    </>
  );
}

// The server checks the treatments (count, duplicates); the form checks only the name first.
const newTrialSchema = z.object({ name: nameSchema, treatments: z.string() });
type NewTrialValues = { name: string; treatments: string };

/** One treatment a line: the names as typed, blank lines dropped. */
function treatmentNames(text: string): string[] {
  return text
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line.length > 0);
}

function NewTrialForm({ shop }: { shop: ShopSummary }) {
  const create = useTrialCreateMutation(shop.id);
  const { form, control, submit, sending, formError } = useApiForm<NewTrialValues>({
    schema: newTrialSchema,
    defaultValues: { name: '', treatments: '' },
    fields: ['name', 'treatments'],
    // The server names a treatment by its index (treatments.2); the form has one text box.
    fieldOf: (path) => (path.startsWith('treatments') ? 'treatments' : path),
    send: async (values) => {
      await create.mutateAsync({
        name: values.name.trim(),
        treatments: treatmentNames(values.treatments),
      });
      form.reset();
    },
  });
  return (
    <Panel
      title="New trial"
      hint={`Name ${TRIAL_MIN_TREATMENTS} to ${TRIAL_MAX_TREATMENTS} treatments, one a line.`}
    >
      <Form onSubmit={submit} style={styles.form}>
        <FormField
          control={control}
          name="name"
          label="Trial name"
          placeholder="e.g. Saw table waxes"
          editable={!sending}
          testID="trial-create-name"
        />
        <FormField
          control={control}
          name="treatments"
          label="Treatments (one a line)"
          multiline
          numberOfLines={4}
          placeholder={'e.g. Paste wax\nCamellia oil\nBare iron'}
          editable={!sending}
          testID="trial-create-treatments"
        />
        <FormError message={formError} />
        <SubmitButton
          label="Start trial"
          sendingLabel="Starting…"
          sending={sending}
          onPress={submit}
          testID="trial-create-submit"
        />
      </Form>
    </Panel>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  form: { gap: space.lg },
  link: {
    ...type.heading,
    color: colors.air,
    textDecorationLine: 'underline',
    alignSelf: 'flex-start',
    paddingVertical: space.md,
  },
});
