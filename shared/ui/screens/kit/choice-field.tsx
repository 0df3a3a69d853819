/**
 * Choosing one of a few options: a labelled radio group of chips (keyboard: Tab to a chip, Enter
 * or Space to choose), and a labelled native <select> on the web for longer lists.
 */
import { createElement, useId } from 'react';
import { Platform, Pressable, StyleSheet, View } from 'react-native';
import { AppText } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke, typeScale } from '@/shared/ui/theme';

export type Option<T extends string> = { value: T; label: string };

type ChoiceProps<T extends string> = {
  label: string;
  options: readonly Option<T>[];
  value: T | undefined;
  onChange: (value: T) => void;
  error?: string;
  hint?: string;
  testID?: string;
};

export function ChoiceChips<T extends string>({ label, options, value, onChange, error, hint, testID }: ChoiceProps<T>) {
  return (
    <View style={styles.field} testID={testID}>
      <AppText variant="smallStrong">{label}</AppText>
      {hint ? (
        <AppText variant="small" tone="muted">
          {hint}
        </AppText>
      ) : null}
      <View role="radiogroup" aria-label={label} style={styles.chips}>
        {options.map((o) => {
          const selected = o.value === value;
          return (
            <Pressable
              key={o.value}
              role="radio"
              aria-checked={selected}
              accessibilityLabel={o.label}
              onPress={() => onChange(o.value)}
              style={[styles.chip, selected && styles.chipSelected]}
            >
              <AppText variant={selected ? 'smallStrong' : 'small'}>{o.label}</AppText>
            </Pressable>
          );
        })}
      </View>
      <FieldError error={error} />
    </View>
  );
}

/** `placeholder` shows until something is chosen; with `emptyLabel` the empty choice stays selectable (filters: "any"). */
export function SelectField<T extends string>({ label, options, value, onChange, error, hint, testID, placeholder, emptyLabel }: ChoiceProps<T> & { placeholder?: string; emptyLabel?: string }) {
  const id = `select-${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  if (Platform.OS !== 'web') return <ChoiceChips label={label} options={options} value={value} onChange={onChange} error={error} hint={hint} testID={testID} />;
  const select = createElement(
    'select',
    {
      id,
      'aria-label': label,
      'aria-invalid': error ? true : undefined,
      'data-testid': testID,
      value: value ?? '',
      onChange: (e: { target: { value: string } }) => onChange(e.target.value as T),
      style: selectStyle,
    },
    [
      emptyLabel !== undefined
        ? createElement('option', { key: '', value: '' }, emptyLabel)
        : createElement('option', { key: '', value: '', disabled: true }, placeholder ?? 'Choose…'),
      ...options.map((o) => createElement('option', { key: o.value, value: o.value }, o.label)),
    ],
  );
  return (
    <View style={styles.field}>
      <AppText variant="smallStrong">{label}</AppText>
      {hint ? (
        <AppText variant="small" tone="muted">
          {hint}
        </AppText>
      ) : null}
      {select}
      <FieldError error={error} />
    </View>
  );
}

export function FieldError({ error }: { error?: string }) {
  if (!error) return null;
  return (
    <View style={styles.errorRow}>
      <AppText variant="smallStrong" tone="fail" aria-hidden>
        !
      </AppText>
      <AppText variant="small" tone="fail" role="alert">
        {error}
      </AppText>
    </View>
  );
}

const selectStyle = {
  ...typeScale.body,
  color: colors.text,
  minHeight: layout.minTouchTarget + space.xs,
  padding: `0 ${space.md}px`,
  border: `${stroke.rule}px solid ${colors.borderStrong}`,
  borderRadius: radius.sm,
  backgroundColor: colors.surface,
  maxWidth: '100%',
};

const styles = StyleSheet.create({
  field: { gap: space.xs },
  chips: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: {
    minHeight: layout.minTouchTarget,
    justifyContent: 'center',
    paddingHorizontal: space.md,
    borderWidth: stroke.rule,
    borderColor: colors.borderStrong,
    borderRadius: radius.round,
    backgroundColor: colors.surface,
  },
  chipSelected: { backgroundColor: colors.primaryTint, borderColor: colors.primary, borderWidth: stroke.focus },
  errorRow: { flexDirection: 'row', gap: space.xs, alignItems: 'flex-start' },
});
