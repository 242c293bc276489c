/**
 * The budgets form's values: one text field per coating type and budget, named
 * `<coating>:<budget>` ("wax:hoursWet", no dot: react-hook-form reads a dot as nesting), and the way back from the server's error paths.
 */
import { parseDecimal } from '@/components/forms/schemas';
import type { BudgetInput, CoatingBudget } from '@/components/queries';

export type BudgetField = 'hoursWet' | 'hoursClose' | 'towHours';
export type BudgetValues = Record<string, string>;

export function budgetValues(budgets: readonly CoatingBudget[]): BudgetValues {
  return Object.fromEntries(
    budgets.flatMap((b) => [
      [`${b.coating}:hoursWet`, String(b.hoursWet)],
      [`${b.coating}:hoursClose`, String(b.hoursClose)],
      [`${b.coating}:towHours`, String(b.towHours)],
    ]),
  );
}

/** The server names a field by the index of the row sent ("budgets.2.towHours"). */
export function budgetFieldOf(
  serverPath: string,
  sent: readonly Pick<BudgetInput, 'coating'>[],
): string | undefined {
  const match = /^budgets\.(\d+)\.(hoursWet|hoursClose|towHours)$/.exec(serverPath);
  const coating = match ? sent[Number(match[1])]?.coating : undefined;
  return coating && match ? `${coating}:${match[2]}` : undefined;
}

const FIELD_KEYS: readonly BudgetField[] = ['hoursWet', 'hoursClose', 'towHours'];

/**
 * The rows to PUT: those the shop set before and those changed now. A default left alone stays
 * a default (marked a rule of thumb), rather than turning into the shop's own figure on save.
 */
export function budgetsToSend(
  budgets: readonly CoatingBudget[],
  values: BudgetValues,
): BudgetInput[] {
  return budgets
    .map((b) => {
      const read = (key: BudgetField) => parseDecimal(values[`${b.coating}:${key}`] ?? '');
      const row: BudgetInput = {
        coating: b.coating,
        hoursWet: read('hoursWet'),
        hoursClose: read('hoursClose'),
        towHours: read('towHours'),
      };
      const changed = FIELD_KEYS.some((key) => row[key] !== b[key]);
      return !b.isDefault || changed ? row : null;
    })
    .filter((row): row is BudgetInput => row !== null);
}
