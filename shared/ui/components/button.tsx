import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';
import { AppText } from './app-text';

export type ButtonProps = {
  label: string;
  onPress: () => void;
  /** `primary` is brass and belongs to the one main action of a screen. */
  variant?: 'primary' | 'secondary';
  disabled?: boolean;
  /** Shows a spinner and a busy label while an action runs. */
  busy?: boolean;
  busyLabel?: string;
  compact?: boolean;
  testID?: string;
};

export function Button({
  label,
  onPress,
  variant = 'primary',
  disabled = false,
  busy = false,
  busyLabel,
  compact = false,
  testID,
}: ButtonProps) {
  const primary = variant === 'primary';
  const inactive = disabled || busy;
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityLabel={label}
      accessibilityState={{ disabled: inactive, busy }}
      disabled={inactive}
      onPress={onPress}
      testID={testID}
      style={({ pressed }) => [
        styles.base,
        compact && styles.compact,
        primary ? styles.primary : styles.secondary,
        pressed && (primary ? styles.primaryPressed : styles.secondaryPressed),
        inactive && styles.inactive,
      ]}
    >
      <View style={styles.row}>
        {busy ? <ActivityIndicator size="small" color={primary ? colors.onPrimary : colors.text} /> : null}
        <AppText variant={compact ? 'smallStrong' : 'bodyStrong'} tone={primary ? 'onPrimary' : 'default'}>
          {busy && busyLabel ? busyLabel : label}
        </AppText>
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: {
    minHeight: layout.minTouchTarget + space.xs,
    paddingHorizontal: space.xl,
    borderRadius: radius.sm,
    borderWidth: stroke.rule,
    alignItems: 'center',
    justifyContent: 'center',
  },
  compact: { minHeight: layout.minTouchTarget, paddingHorizontal: space.md },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  primary: { backgroundColor: colors.primary, borderColor: colors.primaryPressed },
  primaryPressed: { backgroundColor: colors.primaryPressed },
  secondary: { backgroundColor: colors.surface, borderColor: colors.borderStrong },
  secondaryPressed: { backgroundColor: colors.surfaceSunken },
  inactive: { opacity: 0.6 },
});
