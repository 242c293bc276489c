import { useRef } from 'react';
import { StyleSheet, Text, View } from 'react-native';
import * as z from 'zod/mini';

import {
  Form,
  FormError,
  FormField,
  FormStatus,
  SubmitButton,
  useApiForm,
} from '@/components/forms';
import { decimalText } from '@/components/forms/schemas';
import {
  useCoatingBudgetsMutation,
  type BudgetInput,
  type CoatingBudget,
  type ShopSummary,
} from '@/components/queries';
import { space, tabular, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import { COATING_TYPES } from '@/ingest/wire/surfaces';
import { BUDGET_WORDS, COATING_TYPE_LABELS } from '@/ingest/words';

import {
  budgetFieldOf,
  budgetsToSend,
  budgetValues,
  type BudgetField,
  type BudgetValues,
} from './budgetForm';

const FIELDS: { key: BudgetField; label: string }[] = [
  { key: 'hoursWet', label: BUDGET_WORDS.fields.hoursWet },
  { key: 'hoursClose', label: BUDGET_WORDS.fields.hoursClose },
  { key: 'towHours', label: BUDGET_WORDS.fields.towHours },
];

const budgetsSchema = z.object(
  Object.fromEntries(
    COATING_TYPES.flatMap((c) => FIELDS.map((f) => [`${c}:${f.key}`, decimalText('hours')])),
  ) as Record<string, ReturnType<typeof decimalText>>,
);

interface BudgetsPanelProps {
  shop: ShopSummary;
  budgets: readonly CoatingBudget[];
}

/** The coating budgets: editable by owners and members, read by viewers; defaults said to be rules of thumb. */
export function BudgetsPanel({ shop, budgets }: BudgetsPanelProps) {
  return (
    <Panel title="Coating budgets" hint={BUDGET_WORDS.intro}>
      {shop.role === 'viewer' ? (
        <View style={styles.list} testID="budget-list">
          {budgets.map((b) => (
            <View key={b.coating} style={styles.row} testID="budget-row">
              <Text style={type.heading}>{COATING_TYPE_LABELS[b.coating]}</Text>
              <Text style={[type.body, tabular]}>
                {FIELDS.map((f) => `${f.label.replace(/ \(h\)$/, '')} ${b[f.key]} h`).join(' · ')}
              </Text>
              <BudgetSource budget={b} />
            </View>
          ))}
        </View>
      ) : (
        <BudgetsForm shop={shop} budgets={budgets} />
      )}
    </Panel>
  );
}

function BudgetSource({ budget }: { budget: CoatingBudget }) {
  return (
    <Text style={type.small} testID={`budget-source-${budget.coating}`}>
      {budget.isDefault ? BUDGET_WORDS.ruleOfThumb : BUDGET_WORDS.own}
    </Text>
  );
}

function BudgetsForm({ shop, budgets }: BudgetsPanelProps) {
  const save = useCoatingBudgetsMutation(shop.id);
  // The rows last sent, so the server's "budgets.1.hoursWet" finds its field.
  const sent = useRef<BudgetInput[]>([]);
  const { control, submit, sending, formError, done } = useApiForm<BudgetValues>({
    schema: budgetsSchema,
    defaultValues: budgetValues(budgets),
    fields: COATING_TYPES.flatMap((c) => FIELDS.map((f) => `${c}:${f.key}` as const)),
    fieldOf: (path) => budgetFieldOf(path, sent.current),
    send: async (values) => {
      const rows = budgetsToSend(budgets, values);
      sent.current = rows;
      if (rows.length > 0) await save.mutateAsync(rows);
    },
  });
  return (
    <Form onSubmit={submit} style={styles.list}>
      {budgets.map((b) => (
        <View key={b.coating} style={styles.row} testID="budget-row">
          <Text style={type.heading}>{COATING_TYPE_LABELS[b.coating]}</Text>
          {/* The group names the coat, so "Wet, h" is not read five times without it. */}
          <View style={styles.fields} role="group" aria-label={COATING_TYPE_LABELS[b.coating]}>
            {FIELDS.map((f) => (
              <View key={f.key} style={styles.field}>
                <FormField
                  control={control}
                  name={`${b.coating}:${f.key}`}
                  label={f.label}
                  inputMode="decimal"
                  editable={!sending}
                  testID={`budget-${b.coating}-${f.key}`}
                />
              </View>
            ))}
          </View>
          <BudgetSource budget={b} />
        </View>
      ))}
      <FormError message={formError} />
      <FormStatus message={done ? 'Budgets saved.' : null} />
      <SubmitButton
        label="Save budgets"
        sendingLabel="Saving…"
        sending={sending}
        onPress={submit}
        testID="budget-submit"
      />
    </Form>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.lg },
  row: { gap: space.sm },
  fields: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  field: { minWidth: 150, flexGrow: 1, flexBasis: 150 },
});
