import { forwardRef, useId, useState } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';
import { colors, layout, radius, space, stroke, typeScale } from '@/shared/ui/theme';
import { AppText } from './app-text';

export type TextFieldProps = Omit<TextInputProps, 'style' | 'accessibilityLabel'> & {
  /** Visible label; also the accessible name of the input. */
  label: string;
  /** A short line under the label that says what to enter. */
  hint?: string;
  /** The field's error, shown as text with a mark (never by the red border alone). */
  error?: string;
};

export const TextField = forwardRef<TextInput, TextFieldProps>(function TextField(
  { label, hint, error, onFocus, onBlur, ...inputProps },
  ref,
) {
  const [focused, setFocused] = useState(false);
  const errorId = `field-error-${useId().replace(/[^a-zA-Z0-9_-]/g, '')}`;
  return (
    <View style={styles.field}>
      <AppText variant="smallStrong">{label}</AppText>
      {hint ? (
        <AppText variant="small" tone="muted">
          {hint}
        </AppText>
      ) : null}
      <TextInput
        ref={ref}
        {...inputProps}
        accessibilityLabel={label}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        placeholderTextColor={colors.textMuted}
        onFocus={(e) => {
          setFocused(true);
          onFocus?.(e);
        }}
        onBlur={(e) => {
          setFocused(false);
          onBlur?.(e);
        }}
        style={[styles.input, focused && styles.inputFocused, error ? styles.inputError : null]}
      />
      {error ? (
        <View style={styles.errorRow}>
          <AppText variant="smallStrong" tone="fail" aria-hidden>
            !
          </AppText>
          <AppText variant="small" tone="fail" nativeID={errorId} role="alert">
            {error}
          </AppText>
        </View>
      ) : null}
    </View>
  );
});

const styles = StyleSheet.create({
  field: { gap: space.xs },
  input: {
    ...typeScale.body,
    color: colors.text,
    minHeight: layout.minTouchTarget + space.xs,
    paddingHorizontal: space.md,
    borderWidth: stroke.rule,
    borderColor: colors.borderStrong,
    borderRadius: radius.sm,
    backgroundColor: colors.surface,
  },
  // One focus mark on every browser: a teal outline outside the border, which stays red on error.
  inputFocused: {
    borderColor: colors.focus,
    outlineStyle: 'solid',
    outlineWidth: stroke.focus,
    outlineColor: colors.focus,
    outlineOffset: stroke.rule,
  },
  inputError: { borderColor: colors.fail, borderWidth: stroke.focus },
  errorRow: { flexDirection: 'row', gap: space.xs, alignItems: 'flex-start' },
});
