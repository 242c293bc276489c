import { useId, useState, type Ref } from 'react';
import { StyleSheet, Text, TextInput, View, type TextInputProps } from 'react-native';

import { colors, fonts, radius, space, type } from '@/components/theme';

interface TextFieldProps extends Omit<TextInputProps, 'style'> {
  /** Shown above the field and given to assistive technology as its name. */
  label: string;
  /** A message about this field from the server (e.g. "Enter a valid e-mail address"). */
  error?: string;
  /** The input, so a form can move focus to it (react-hook-form after a failed submit). */
  ref?: Ref<TextInput>;
}

/**
 * A labelled text input; the label is both visible and the field's accessible name. Its error
 * is tied to it (`aria-describedby`, `aria-invalid`), so a screen reader reads the message
 * when the field gets focus, not only someone who sees the red line.
 */
export function TextField({ label, error, testID, ref, ...input }: TextFieldProps) {
  const [focused, setFocused] = useState(false);
  const errorId = `${useId()}-error`;
  return (
    <View style={styles.field}>
      <Text style={type.label}>{label}</Text>
      <TextInput
        {...input}
        ref={ref}
        testID={testID}
        accessibilityLabel={label}
        aria-label={label}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        placeholderTextColor={colors.iron}
        // Enter submits the form and keeps the focus here (react-native-web blurs a one-line
        // field on Enter by default, which would undo moving focus to a field in error).
        blurOnSubmit={input.blurOnSubmit ?? false}
        onFocus={(event) => {
          setFocused(true);
          input.onFocus?.(event);
        }}
        onBlur={(event) => {
          setFocused(false);
          input.onBlur?.(event);
        }}
        style={[
          inputStyles.input,
          focused && inputStyles.focused,
          error ? inputStyles.invalid : undefined,
        ]}
      />
      {error ? (
        <Text
          style={[type.small, styles.error]}
          nativeID={errorId}
          testID={testID ? `${testID}-error` : undefined}
        >
          {error}
        </Text>
      ) : null}
    </View>
  );
}

/** A text input's box, focus and error borders: shared with the time-zone picker's input. */
export const inputStyles = StyleSheet.create({
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
  focused: { borderColor: colors.iron },
  invalid: { borderColor: colors.wet },
});

const styles = StyleSheet.create({
  field: { gap: space.xs },
  error: { color: colors.wet },
});
