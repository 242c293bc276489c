import type { Ref } from 'react';
import { Pressable, StyleSheet, Text, type View } from 'react-native';

import { colors, fonts, radius, space, TAP_TARGET_PX } from '@/components/theme';

interface ButtonProps {
  label: string;
  onPress: () => void;
  disabled?: boolean;
  /** `primary` is filled ink; `quiet` is an outlined button for secondary actions. */
  variant?: 'primary' | 'quiet';
  /**
   * The name assistive technology reads when the label alone does not say what it acts on
   * ("Withdraw the invitation to ana@…" for a "Withdraw" among several); it starts with the label.
   */
  accessibilityLabel?: string;
  /** Work started by the press is under way: announced as busy (aria-busy); pair it with disabled. */
  busy?: boolean;
  /** The pressable, so a caller can move focus to it. */
  ref?: Ref<View>;
  testID?: string;
}

export function Button({
  label,
  onPress,
  disabled = false,
  variant = 'primary',
  accessibilityLabel,
  busy = false,
  ref,
  testID,
}: ButtonProps) {
  const primary = variant === 'primary';
  return (
    <Pressable
      ref={ref}
      accessibilityRole="button"
      accessibilityLabel={accessibilityLabel}
      aria-label={accessibilityLabel}
      accessibilityState={{ disabled, busy }}
      aria-disabled={disabled}
      aria-busy={busy || undefined}
      disabled={disabled}
      onPress={onPress}
      testID={testID}
      style={({ pressed, hovered }) => [
        styles.button,
        primary ? styles.primary : styles.quiet,
        (pressed || hovered) && !disabled && (primary ? styles.primaryActive : styles.quietActive),
        disabled && styles.disabled,
      ]}
    >
      <Text style={[styles.label, primary ? styles.primaryLabel : styles.quietLabel]}>{label}</Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  button: {
    minHeight: TAP_TARGET_PX,
    minWidth: TAP_TARGET_PX,
    // A long label wraps inside the button rather than pushing it off a narrow card.
    maxWidth: '100%',
    paddingHorizontal: space.lg,
    paddingVertical: space.xs,
    borderRadius: radius.control,
    borderWidth: 1,
    alignItems: 'center',
    justifyContent: 'center',
  },
  primary: { backgroundColor: colors.ink, borderColor: colors.ink },
  primaryActive: { backgroundColor: colors.iron, borderColor: colors.iron },
  quiet: { backgroundColor: 'transparent', borderColor: colors.border },
  quietActive: { backgroundColor: colors.card, borderColor: colors.iron },
  disabled: { opacity: 0.55 },
  label: { fontFamily: fonts.medium, fontSize: 14, textAlign: 'center' },
  primaryLabel: { color: colors.card },
  quietLabel: { color: colors.ink },
});
