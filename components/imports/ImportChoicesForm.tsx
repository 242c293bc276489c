import { StyleSheet, Text, View } from 'react-native';

import { Choice, FormError, SubmitButton, TimeZonePicker } from '@/components/forms';
import type { ImportPreview } from '@/components/queries';
import { space, type } from '@/components/theme';
import {
  IMPORT_FIELD_WORDS,
  IMPORT_NO_SURFACE,
  IMPORT_TIME_ZONE_HINT,
  IMPORT_UNIT_WORDS,
  IMPORT_WORDS,
} from '@/ingest/words';

import { Checkbox } from './Checkbox';
import { COLUMN_FIELDS, type ChoiceErrors, type ImportChoices } from './importChoices';
import { TimeFormatChoice } from './TimeFormatChoice';

/** The surface's "no column" option; a header cell is never this long run of dashes. */
export const NO_COLUMN = '————';

interface ImportChoicesFormProps {
  preview: ImportPreview;
  choices: ImportChoices;
  onChange: (choices: ImportChoices) => void;
  /** Beside the field each concerns (the local checks, then the server's refusal). */
  errors: ChoiceErrors;
  /** A refusal that names no field, under the form. */
  formError: string | null;
  sending: boolean;
  onStart: () => void;
  /** The choices came from the sensor's saved ones. */
  remembered: boolean;
}

/**
 * Which column holds the time, the air temperature, the RH and (optionally) the surface
 * temperature; the unit, the time format with an example of each, the logger's time zone and
 * whether to remember all this for the sensor. Each refusal stands beside the field it concerns.
 */
export function ImportChoicesForm({
  preview,
  choices,
  onChange,
  errors,
  formError,
  sending,
  onStart,
  remembered,
}: ImportChoicesFormProps) {
  const set = (change: Partial<ImportChoices>) => onChange({ ...choices, ...change });
  const columnOptions = preview.columns.map((name) => ({ value: name, label: name }));
  const timeIndex = choices.timeColumn === null ? -1 : preview.columns.indexOf(choices.timeColumn);
  const sample = timeIndex === -1 ? null : (preview.rows[0]?.[timeIndex] ?? null);
  return (
    <View style={styles.form} testID="import-choices">
      <Text style={type.heading} role="heading" aria-level={3}>
        {IMPORT_WORDS.choicesTitle}
      </Text>
      {remembered ? <Text style={type.small}>{IMPORT_WORDS.rememberedNote}</Text> : null}
      {COLUMN_FIELDS.map((field) => {
        const optional = field === 'surfaceColumn';
        return (
          <Choice
            key={field}
            label={IMPORT_FIELD_WORDS[field]}
            options={
              optional
                ? [...columnOptions, { value: NO_COLUMN, label: IMPORT_NO_SURFACE }]
                : columnOptions
            }
            value={choices[field] ?? (optional ? NO_COLUMN : null)}
            onChange={(value) => set({ [field]: value === NO_COLUMN ? null : value })}
            disabled={sending}
            error={errors[field]}
            testID={`import-${field}`}
          />
        );
      })}
      <Choice
        label={IMPORT_FIELD_WORDS.temperatureUnit}
        options={(['C', 'F'] as const).map((unit) => ({
          value: unit,
          label: IMPORT_UNIT_WORDS[unit],
        }))}
        value={choices.temperatureUnit}
        onChange={(temperatureUnit) => set({ temperatureUnit })}
        disabled={sending}
        error={errors.temperatureUnit}
        testID="import-temperatureUnit"
      />
      <TimeFormatChoice
        value={choices.timeFormat}
        onChange={(timeFormat) => set({ timeFormat })}
        sample={sample}
        disabled={sending}
        error={errors.timeFormat}
      />
      <View style={styles.zone}>
        <TimeZonePicker
          label={IMPORT_FIELD_WORDS.timeZone}
          value={choices.timeZone}
          onChange={(timeZone) => set({ timeZone })}
          error={errors.timeZone}
          disabled={sending}
          testID="import-timeZone"
        />
        <Text style={type.small}>{IMPORT_TIME_ZONE_HINT}</Text>
      </View>
      <Checkbox
        label={IMPORT_FIELD_WORDS.remember}
        checked={choices.remember}
        onChange={(remember) => set({ remember })}
        disabled={sending}
        testID="import-remember"
      />
      <FormError message={formError} testID="import-start-error" />
      <SubmitButton
        label={IMPORT_WORDS.start}
        sendingLabel={IMPORT_WORDS.starting}
        sending={sending}
        onPress={onStart}
        testID="import-start"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  zone: { gap: space.xs },
});
