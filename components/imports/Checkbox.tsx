import { Pressable, StyleSheet, Text, View } from 'react-native';

import { colors, radius, space, TAP_TARGET_PX, type } from '@/components/theme';

interface CheckboxProps {
  label: string;
  checked: boolean;
  onChange: (checked: boolean) => void;
  disabled?: boolean;
  testID?: string;
}

/** A labelled checkbox whose whole row is the 44 px target; the tick is drawn, not a glyph. */
export function Checkbox({ label, checked, onChange, disabled = false, testID }: CheckboxProps) {
  return (
    <Pressable
      role="checkbox"
      aria-checked={checked}
      accessibilityLabel={label}
      accessibilityState={{ checked, disabled }}
      disabled={disabled}
      onPress={() => onChange(!checked)}
      testID={testID}
      style={[styles.row, disabled && styles.disabled]}
    >
      <View style={[styles.box, checked && styles.boxOn]}>
        {checked ? <View style={styles.tick} /> : null}
      </View>
      <Text style={[type.body, styles.label]}>{label}</Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  row: {
    minHeight: TAP_TARGET_PX,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    alignSelf: 'flex-start',
  },
  disabled: { opacity: 0.55 },
  box: {
    width: 22,
    height: 22,
    borderRadius: radius.control / 2,
    borderWidth: 2,
    borderColor: colors.iron,
    backgroundColor: colors.card,
    alignItems: 'center',
    justifyContent: 'center',
  },
  boxOn: { backgroundColor: colors.ink, borderColor: colors.ink },
  // A tick drawn as the lower and right edges of a rotated box.
  tick: {
    width: 6,
    height: 11,
    marginTop: -2,
    borderRightWidth: 2,
    borderBottomWidth: 2,
    borderColor: colors.card,
    transform: [{ rotate: '45deg' }],
  },
  label: { flexShrink: 1 },
});
