import { useId, useMemo, useRef, useState, type ComponentProps } from 'react';
import { Controller, type Control, type FieldValues, type Path } from 'react-hook-form';
import {
  Pressable,
  StyleSheet,
  Text,
  TextInput,
  View,
  type NativeSyntheticEvent,
  type TextInputKeyPressEventData,
  type ViewProps,
} from 'react-native';

import { colors, radius, space, type } from '@/components/theme';
import { searchTimeZones, timeZoneNames } from '@/ingest/timeZones';

import { inputStyles } from './TextField';

/** Shown at once; more would make a long page of a phone screen. Typing narrows the rest. */
const SHOWN = 8;

/** The browser's own zone: the likely one for a shop, so it leads the list. */
export function browserTimeZone(): string {
  try {
    return Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
  } catch {
    return 'UTC';
  }
}

/** Every zone this browser knows, its own first (added should its list lack it). */
function zonesBrowserFirst(): string[] {
  const own = browserTimeZone();
  return [own, ...timeZoneNames().filter((name) => name !== own)];
}

/**
 * The spelling of `text` in the list when it matches a zone but for case ("america/chicago"),
 * so a name typed in full is kept the way the server stores it.
 */
function listedSpelling(zones: readonly string[], text: string): string | null {
  const lower = text.trim().toLowerCase();
  return zones.find((name) => name.toLowerCase() === lower) ?? null;
}

interface TimeZonePickerProps {
  label: string;
  value: string;
  onChange: (value: string) => void;
  onBlur?: () => void;
  error?: string;
  disabled?: boolean;
  testID?: string;
}

// ARIA the combobox pattern needs that React Native's types leave out; react-native-web renders
// each as its attribute.
type ComboboxAria = Partial<ComponentProps<typeof TextInput>> & {
  'aria-controls'?: string;
  'aria-activedescendant'?: string;
  'aria-autocomplete'?: 'list';
  'aria-describedby'?: string;
};

/**
 * A searchable list of IANA time zones as an accessible combobox (WAI-ARIA 1.2 combobox with a
 * list autocomplete): type part of a name ("Chicago", "new york"), move with the arrow keys,
 * Enter picks the highlighted zone, Escape closes the list (or clears the text when it is
 * closed); the browser's own zone comes first. Choosing sets the exact IANA spelling.
 */
export function TimeZonePicker({
  label,
  value,
  onChange,
  onBlur,
  error,
  disabled = false,
  testID,
}: TimeZonePickerProps) {
  const zones = useMemo(zonesBrowserFirst, []);
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const [focused, setFocused] = useState(false);
  const closeTimer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const id = useId();
  const labelId = `${id}-label`;
  const listId = `${id}-list`;
  const errorId = `${id}-error`;
  const optionId = (index: number) => `${id}-option-${index}`;

  // The whole list while the text is a picked zone (the person is browsing), else the matches.
  const matches = useMemo(
    () => (listedSpelling(zones, value) === value ? zones : searchTimeZones(zones, value)),
    [zones, value],
  );
  const shown = matches.slice(0, SHOWN);
  const expanded = open && !disabled;
  const activeIndex = Math.min(active, shown.length - 1);
  // The listbox exists only with options in it; "no match" is said beside it.
  const listOpen = expanded && shown.length > 0;

  function choose(name: string) {
    onChange(name);
    setOpen(false);
    setActive(0);
  }

  function onKeyPress(event: NativeSyntheticEvent<TextInputKeyPressEventData>) {
    const key = event.nativeEvent.key;
    const prevent = () => (event as unknown as { preventDefault(): void }).preventDefault();
    if (key === 'ArrowDown' || key === 'ArrowUp') {
      prevent();
      if (!expanded) {
        setOpen(true);
        setActive(key === 'ArrowDown' ? 0 : Math.max(shown.length - 1, 0));
        return;
      }
      const step = key === 'ArrowDown' ? 1 : -1;
      setActive((activeIndex + step + shown.length) % Math.max(shown.length, 1));
    } else if (key === 'Enter') {
      // Enter picks the highlighted zone instead of sending the form.
      const pick = listOpen ? shown[activeIndex] : undefined;
      if (pick) {
        prevent();
        choose(pick);
      }
    } else if (key === 'Escape') {
      prevent();
      if (expanded) setOpen(false);
      else onChange('');
    }
  }

  const aria: ComboboxAria = {
    'aria-controls': listOpen ? listId : undefined,
    'aria-autocomplete': 'list',
    'aria-activedescendant': listOpen ? optionId(activeIndex) : undefined,
    'aria-describedby': error ? errorId : undefined,
  };

  return (
    <View style={styles.field}>
      <Text style={type.label} nativeID={labelId}>
        {label}
      </Text>
      <TextInput
        {...aria}
        role="combobox"
        aria-expanded={listOpen}
        aria-label={label}
        aria-invalid={error ? true : undefined}
        accessibilityLabel={label}
        value={value}
        editable={!disabled}
        autoCapitalize="none"
        autoCorrect={false}
        autoComplete="off"
        placeholder="Type a city, e.g. Chicago"
        placeholderTextColor={colors.iron}
        testID={testID}
        onChangeText={(text) => {
          onChange(text);
          setOpen(true);
          setActive(0);
        }}
        onKeyPress={onKeyPress}
        onFocus={() => {
          setFocused(true);
          if (closeTimer.current) clearTimeout(closeTimer.current);
        }}
        onBlur={() => {
          setFocused(false);
          // Later, so a tap on an option lands before the list goes away.
          closeTimer.current = setTimeout(() => setOpen(false), 200);
          const spelt = listedSpelling(zones, value);
          if (spelt && spelt !== value) onChange(spelt);
          onBlur?.();
        }}
        style={[
          inputStyles.input,
          focused && inputStyles.focused,
          error ? inputStyles.invalid : undefined,
        ]}
      />
      {expanded ? (
        <View style={styles.list}>
          {listOpen ? (
            <View
              // React Native's role list lacks listbox; react-native-web renders it as given.
              role={'listbox' as ViewProps['role']}
              nativeID={listId}
              aria-labelledby={labelId}
              testID={testID ? `${testID}-list` : undefined}
            >
              {shown.map((name, index) => (
                <Pressable
                  key={name}
                  role="option"
                  nativeID={optionId(index)}
                  aria-selected={index === activeIndex}
                  focusable={false}
                  onPress={() => choose(name)}
                  testID={testID ? `${testID}-option` : undefined}
                  style={({ hovered }) => [
                    styles.option,
                    (index === activeIndex || hovered) && styles.optionActive,
                  ]}
                >
                  <Text style={type.body}>{name.replace(/_/g, ' ')}</Text>
                  {index === 0 && name === zones[0] ? (
                    <Text style={type.small}>this browser’s zone</Text>
                  ) : null}
                </Pressable>
              ))}
            </View>
          ) : null}
          {/* Outside the listbox, which may hold options only. */}
          <Text style={[type.small, styles.more]} aria-live="polite">
            {shown.length === 0
              ? 'No time zone matches; try a large city near you.'
              : matches.length > shown.length
                ? `${matches.length - shown.length} more: keep typing to narrow the list.`
                : `${matches.length} ${matches.length === 1 ? 'zone' : 'zones'}`}
          </Text>
        </View>
      ) : null}
      {error ? (
        <Text
          nativeID={errorId}
          style={[type.small, styles.error]}
          testID={testID ? `${testID}-error` : undefined}
        >
          {error}
        </Text>
      ) : null}
    </View>
  );
}

type FieldProps<T extends FieldValues> = Omit<
  TimeZonePickerProps,
  'value' | 'onChange' | 'onBlur' | 'error'
> & { control: Control<T>; name: Path<T> };

/** The picker bound to a react-hook-form field, showing that field's error beneath it. */
export function TimeZoneField<T extends FieldValues>({ control, name, ...props }: FieldProps<T>) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <TimeZonePicker
          {...props}
          value={typeof field.value === 'string' ? field.value : ''}
          onChange={field.onChange}
          onBlur={field.onBlur}
          error={fieldState.error?.message}
        />
      )}
    />
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  list: {
    borderWidth: 1,
    borderColor: colors.border,
    borderRadius: radius.control,
    backgroundColor: colors.card,
    paddingVertical: space.xs,
  },
  option: {
    minHeight: 44,
    paddingHorizontal: space.md,
    borderLeftWidth: 3,
    borderLeftColor: 'transparent',
    paddingVertical: space.xs,
    justifyContent: 'center',
  },
  // The highlighted option: a tint and an ink rule, so it shows without relying on colour alone.
  optionActive: { backgroundColor: colors.paper, borderLeftColor: colors.ink },
  more: { paddingHorizontal: space.md, paddingVertical: space.xs },
  error: { color: colors.wet },
});
