import { useId } from 'react';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, TAP_TARGET_PX, type } from '@/components/theme';

interface ChoiceProps<T extends string> {
  label: string;
  options: readonly { value: T; label: string }[];
  value: T | null;
  onChange: (value: T) => void;
  disabled?: boolean;
  error?: string;
  testID?: string;
}

/** A labelled row of mutually exclusive options (a radio group for assistive technology). */
export function Choice<T extends string>({
  label,
  options,
  value,
  onChange,
  disabled = false,
  error,
  testID,
}: ChoiceProps<T>) {
  const errorId = `${useId()}-error`;
  return (
    <View style={styles.field}>
      <Text style={type.label} nativeID={testID ? `${testID}-label` : undefined}>
        {label}
      </Text>
      <View
        role="radiogroup"
        aria-label={label}
        aria-describedby={error ? errorId : undefined}
        style={styles.row}
        testID={testID}
      >
        {options.map((option) => {
          const selected = option.value === value;
          return (
            <Pressable
              key={option.value}
              role="radio"
              aria-checked={selected}
              accessibilityLabel={option.label}
              accessibilityState={{ selected, disabled }}
              disabled={disabled}
              onPress={() => onChange(option.value)}
              testID={testID ? `${testID}-${option.value}` : undefined}
              style={({ hovered }) => [
                styles.option,
                selected && styles.selected,
                hovered && !selected && !disabled && styles.hover,
                disabled && styles.disabled,
              ]}
            >
              <Text style={[styles.text, selected && styles.selectedText]}>{option.label}</Text>
            </Pressable>
          );
        })}
      </View>
      {error ? (
        <Text style={[type.small, styles.error]} nativeID={errorId}>
          {error}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  option: {
    minHeight: TAP_TARGET_PX,
    minWidth: TAP_TARGET_PX,
    alignItems: 'center',
    paddingHorizontal: space.md,
    borderRadius: radius.control,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.card,
    justifyContent: 'center',
  },
  selected: { backgroundColor: colors.ink, borderColor: colors.ink },
  hover: { borderColor: colors.iron },
  disabled: { opacity: 0.55 },
  text: { fontFamily: fonts.medium, fontSize: 13, color: colors.ink },
  selectedText: { color: colors.card },
  error: { color: colors.wet },
});
