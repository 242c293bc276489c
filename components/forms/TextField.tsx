import { useState } from 'react';
import { StyleSheet, Text, TextInput, View, type TextInputProps } from 'react-native';

import { colors, fonts, radius, space, type } from '@/components/theme';

interface TextFieldProps extends Omit<TextInputProps, 'style'> {
  /** Shown above the field and given to assistive technology as its name. */
  label: string;
  /** A message about this field from the server (e.g. "Enter a valid e-mail address"). */
  error?: string;
}

/** A labelled text input; the label is both visible and the field's accessible name. */
export function TextField({ label, error, testID, ...input }: TextFieldProps) {
  const [focused, setFocused] = useState(false);
  return (
    <View style={styles.field}>
      <Text style={type.label}>{label}</Text>
      <TextInput
        {...input}
        testID={testID}
        accessibilityLabel={label}
        aria-label={label}
        aria-invalid={error ? true : undefined}
        placeholderTextColor={colors.iron}
        onFocus={(event) => {
          setFocused(true);
          input.onFocus?.(event);
        }}
        onBlur={(event) => {
          setFocused(false);
          input.onBlur?.(event);
        }}
        style={[
          styles.input,
          focused && styles.inputFocused,
          error ? styles.inputInvalid : undefined,
        ]}
      />
      {error ? (
        <Text style={[type.small, styles.error]} testID={testID ? `${testID}-error` : undefined}>
          {error}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  input: {
    fontFamily: fonts.regular,
    fontSize: 16,
    color: colors.ink,
    backgroundColor: colors.card,
    borderWidth: 1,
    borderColor: colors.border,
    borderRadius: radius.control,
    paddingHorizontal: space.md,
    paddingVertical: space.sm + 2,
    minHeight: 44,
  },
  inputFocused: { borderColor: colors.iron },
  inputInvalid: { borderColor: colors.wet },
  error: { color: colors.wet },
});
