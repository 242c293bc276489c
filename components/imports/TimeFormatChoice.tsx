import { useId } from 'react';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import type { ImportTimeFormat } from '@/components/queries';
import { colors, fonts, radius, space, TAP_TARGET_PX, tabular, type } from '@/components/theme';
import { IMPORT_FIELD_WORDS, IMPORT_TIME_FORMAT_WORDS } from '@/ingest/words';
import { IMPORT_TIME_FORMATS } from '@/ingest/wire/imports';

interface TimeFormatChoiceProps {
  value: ImportTimeFormat;
  onChange: (value: ImportTimeFormat) => void;
  /** The file's first time, shown beside the examples to compare with. */
  sample: string | null;
  disabled?: boolean;
  error?: string;
}

/**
 * The time format as a radio group, each option with the same moment written its way, so the
 * person matches the file's first time against the examples rather than against format names.
 */
export function TimeFormatChoice({
  value,
  onChange,
  sample,
  disabled = false,
  error,
}: TimeFormatChoiceProps) {
  const errorId = `${useId()}-error`;
  const label = IMPORT_FIELD_WORDS.timeFormat;
  return (
    <View style={styles.field}>
      <Text style={type.label}>{label}</Text>
      {sample ? (
        <Text style={type.small} testID="import-time-sample">
          The file’s first time: <Text style={[styles.sample, tabular]}>{sample}</Text>
        </Text>
      ) : null}
      <View
        role="radiogroup"
        aria-label={label}
        aria-describedby={error ? errorId : undefined}
        style={styles.list}
        testID="import-time-format"
      >
        {IMPORT_TIME_FORMATS.map((format) => {
          const selected = format === value;
          const words = IMPORT_TIME_FORMAT_WORDS[format];
          return (
            <Pressable
              key={format}
              role="radio"
              aria-checked={selected}
              accessibilityLabel={`${words.label}, for example ${words.example}`}
              accessibilityState={{ selected, disabled }}
              disabled={disabled}
              onPress={() => onChange(format)}
              testID={`import-time-format-${format}`}
              style={({ hovered }) => [
                styles.option,
                selected && styles.selected,
                hovered && !selected && !disabled && styles.hover,
                disabled && styles.disabled,
              ]}
            >
              <View style={[styles.dot, selected && styles.dotOn]} />
              <View style={styles.words}>
                <Text style={[styles.name, selected && styles.selectedText]}>{words.label}</Text>
                <Text style={[styles.example, tabular, selected && styles.selectedText]}>
                  {words.example}
                </Text>
              </View>
            </Pressable>
          );
        })}
      </View>
      {error ? (
        <Text
          style={[type.small, styles.error]}
          nativeID={errorId}
          testID="import-time-format-error"
        >
          {error}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  list: { gap: space.xs },
  option: {
    minHeight: TAP_TARGET_PX,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    paddingVertical: space.xs,
    borderRadius: radius.control,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.card,
  },
  selected: { backgroundColor: colors.ink, borderColor: colors.ink },
  hover: { borderColor: colors.iron },
  disabled: { opacity: 0.55 },
  dot: {
    width: 12,
    height: 12,
    borderRadius: 6,
    borderWidth: 2,
    borderColor: colors.iron,
  },
  dotOn: { borderColor: colors.card, backgroundColor: colors.card },
  words: { flex: 1, minWidth: 0 },
  name: { fontFamily: fonts.medium, fontSize: 13, color: colors.ink },
  example: { fontFamily: fonts.regular, fontSize: 13, color: colors.iron },
  selectedText: { color: colors.card },
  sample: { fontFamily: fonts.medium, color: colors.ink },
  error: { color: colors.wet },
});
