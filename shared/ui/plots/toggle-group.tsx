/** A small segmented choice (radio group): dB | linear, log | linear, wrapped | unwrapped… */
import { Pressable, StyleSheet, View } from 'react-native';
import { AppText } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';

export interface ToggleOption<T extends string> {
  value: T;
  label: string;
}

interface ToggleGroupProps<T extends string> {
  /** Accessible name of the group, e.g. "Frequency axis". */
  label: string;
  options: readonly ToggleOption<T>[];
  value: T;
  onChange: (value: T) => void;
  testID?: string;
}

export function ToggleGroup<T extends string>({ label, options, value, onChange, testID }: ToggleGroupProps<T>) {
  return (
    <View style={styles.group} role="radiogroup" aria-label={label} testID={testID}>
      <AppText variant="label" tone="muted" style={styles.caption}>
        {label}
      </AppText>
      <View style={styles.row}>
        {options.map((option, i) => {
          const selected = option.value === value;
          return (
            <Pressable
              key={option.value}
              role="radio"
              aria-checked={selected}
              aria-label={`${label}: ${option.label}`}
              onPress={() => onChange(option.value)}
              style={[styles.option, i > 0 && styles.joined, selected && styles.selected]}
            >
              <AppText variant="small" style={selected ? styles.selectedText : undefined}>
                {option.label}
              </AppText>
            </Pressable>
          );
        })}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  group: { gap: space.hair },
  caption: { fontSize: 11 },
  row: { flexDirection: 'row' },
  option: {
    minHeight: layout.minTouchTarget - space.sm,
    paddingHorizontal: space.md,
    justifyContent: 'center',
    borderWidth: stroke.rule,
    borderColor: colors.borderStrong,
    backgroundColor: colors.surface,
    borderRadius: radius.sm,
  },
  joined: { marginLeft: -stroke.rule },
  selected: { backgroundColor: colors.text, borderColor: colors.text },
  selectedText: { color: colors.surface },
});
