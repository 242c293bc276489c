import { Controller, type Control } from 'react-hook-form';
import { StyleSheet } from 'react-native';
import * as z from 'zod/mini';

import {
  Choice,
  Form,
  FormError,
  FormField,
  FormStatus,
  SubmitButton,
  useApiForm,
} from '@/components/forms';
import {
  useCareEntryMutation,
  type CoatingType,
  type ShopSummary,
  type Surface,
} from '@/components/queries';
import { space } from '@/components/theme';
import { Panel } from '@/components/ui';
import { fromLocalInput, toLocalInput } from '@/components/zones/chartRange';
import { COATING_TYPES, RUSTING_GRADES } from '@/ingest/wire/surfaces';
import { COATING_TYPE_LABELS, RUSTING_GRADE_WORDS, RUSTING_STANDARD } from '@/ingest/words';

// Typed as the trial form's times are: on the shop's clock, with a space or a T.
const localTime = (timeZone: string) =>
  z
    .string()
    .check(
      z.refine(
        (text) => fromLocalInput(text, timeZone) !== null,
        'Give the time as YYYY-MM-DD HH:MM',
      ),
    );
const noteSchema = z.string().check(z.maxLength(2000, 'At most 2000 characters'));

/** Now on the shop's clock, as the time field shows it. */
const nowInput = (timeZone: string) => toLocalInput(Date.now(), timeZone).replace('T', ' ');
/** The time field's text as the API's ISO instant (the schema has checked it). */
const toIso = (text: string, timeZone: string) =>
  new Date(fromLocalInput(text, timeZone)!).toISOString();
/** The server names `coating.type`, `coating.product`; the form has flat fields. */
const careFieldOf = (path: string) =>
  path === 'coating.type' || path === 'coating'
    ? 'type'
    : path === 'coating.product'
      ? 'product'
      : path;

const COAT_OPTIONS = COATING_TYPES.map((value) => ({ value, label: COATING_TYPE_LABELS[value] }));

type CoatValues = { type: string; product: string; at: string; note: string };

interface CareFormProps {
  shop: ShopSummary;
  surface: Surface;
}

/** Logs a coat: its generic kind, the product as the shop names it, when (now unless changed), a note. */
export function CoatForm({ shop, surface }: CareFormProps) {
  const log = useCareEntryMutation(shop.id, surface);
  const tz = shop.timeZone;
  const { form, control, ...state } = useApiForm<CoatValues>({
    schema: z.object({
      type: z.string().check(z.minLength(1, 'Choose the kind of coat')),
      product: z.string().check(z.trim(), z.maxLength(100, 'At most 100 characters')),
      at: localTime(tz),
      note: noteSchema,
    }),
    defaultValues: { type: '', product: '', at: nowInput(tz), note: '' },
    fields: ['type', 'product', 'at', 'note'],
    fieldOf: careFieldOf,
    send: async (values) => {
      const product = values.product.trim();
      const note = values.note.trim();
      await log.mutateAsync({
        kind: 'coating',
        at: toIso(values.at, tz),
        coating: { type: values.type as CoatingType, ...(product ? { product } : {}) },
        ...(note ? { note } : {}),
      });
      form.reset({ type: values.type, product, at: nowInput(tz), note: '' });
    },
  });
  return (
    <Panel title="Log a coat" hint={`Time on the shop's clock (${tz}).`}>
      <Form onSubmit={state.submit} style={styles.form}>
        <Controller
          control={control}
          name="type"
          render={({ field, fieldState }) => (
            <Choice
              label="Kind of coat"
              options={COAT_OPTIONS}
              value={(field.value || null) as CoatingType | null}
              onChange={field.onChange}
              disabled={state.sending}
              error={fieldState.error?.message}
              testID="coat-type"
            />
          )}
        />
        <FormField
          control={control}
          name="product"
          label="Product (optional, as you call it)"
          placeholder="e.g. the shop's own wax blend"
          editable={!state.sending}
          testID="coat-product"
        />
        <WhenNoteSend
          control={control as unknown as Control<WhenNote>}
          prefix="coat"
          label="Log coat"
          doneText="Coat logged."
          {...state}
        />
      </Form>
    </Panel>
  );
}

const GRADE_OPTIONS = RUSTING_GRADES.map((grade) => ({
  value: String(grade),
  label: `Ri ${grade}`,
}));

type InspectionValues = { rusting: string; at: string; note: string };

/** Logs an inspection: the degree of rusting (ISO 4628-3, Ri 0–5, in words), when, a note. */
export function InspectionForm({ shop, surface }: CareFormProps) {
  const log = useCareEntryMutation(shop.id, surface);
  const tz = shop.timeZone;
  const { form, control, ...state } = useApiForm<InspectionValues>({
    schema: z.object({
      rusting: z.string().check(z.minLength(1, 'Choose the degree of rusting, Ri 0 to 5')),
      at: localTime(tz),
      note: noteSchema,
    }),
    defaultValues: { rusting: '', at: nowInput(tz), note: '' },
    fields: ['rusting', 'at', 'note'],
    send: async (values) => {
      const note = values.note.trim();
      await log.mutateAsync({
        kind: 'inspection',
        at: toIso(values.at, tz),
        rusting: Number(values.rusting),
        ...(note ? { note } : {}),
      });
      form.reset({ rusting: '', at: nowInput(tz), note: '' });
    },
  });
  return (
    <Panel
      title="Log an inspection"
      hint={`Degree of rusting on the ${RUSTING_STANDARD} scale. Time on the shop's clock (${tz}).`}
    >
      <Form onSubmit={state.submit} style={styles.form}>
        <Controller
          control={control}
          name="rusting"
          render={({ field, fieldState }) => (
            <>
              <Choice
                label={`Degree of rusting (${RUSTING_STANDARD})`}
                options={GRADE_OPTIONS}
                value={field.value || null}
                onChange={field.onChange}
                disabled={state.sending}
                error={fieldState.error?.message}
                testID="inspection-grade"
              />
              <GradeWords grade={field.value} />
            </>
          )}
        />
        <WhenNoteSend
          control={control as unknown as Control<WhenNote>}
          prefix="inspection"
          label="Log inspection"
          doneText="Inspection logged."
          {...state}
        />
      </Form>
    </Panel>
  );
}

/**
 * The two forms' shared fields: the time and the note. Both forms' values hold them, but
 * react-hook-form's Control is invariant in its values, hence the casts where it is passed.
 */
type WhenNote = { at: string; note: string };

interface WhenNoteSendProps {
  control: Control<WhenNote>;
  prefix: string;
  label: string;
  doneText: string;
  submit: () => void;
  sending: boolean;
  formError: string | null;
  done: boolean;
}

/** The tail both care forms share: when, a note, the form's message and the send button. */
function WhenNoteSend({ control, prefix, label, doneText, ...state }: WhenNoteSendProps) {
  return (
    <>
      <FormField
        control={control}
        name="at"
        label="When (YYYY-MM-DD HH:MM)"
        editable={!state.sending}
        testID={`${prefix}-at`}
      />
      <FormField
        control={control}
        name="note"
        label="Note (optional)"
        multiline
        numberOfLines={2}
        editable={!state.sending}
        testID={`${prefix}-note`}
      />
      <FormError message={state.formError} />
      <FormStatus message={state.done ? doneText : null} />
      <SubmitButton
        label={label}
        sendingLabel="Logging…"
        sending={state.sending}
        onPress={state.submit}
        testID={`${prefix}-submit`}
      />
    </>
  );
}

/** The chosen grade in words, so "Ri 2" is never a bare number. */
function GradeWords({ grade }: { grade: string }) {
  const g = RUSTING_GRADES.find((r) => String(r) === grade);
  return (
    <FormStatus
      message={g === undefined ? 'Choose a grade to see what it means.' : RUSTING_GRADE_WORDS[g]}
    />
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
});
