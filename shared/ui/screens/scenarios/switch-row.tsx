/** A labelled on/off switch that opens the fields of an optional part (an error source). */
import type { ReactNode } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { AppText } from '@/shared/ui/components';
import { colors, layout, radius, space, stroke } from '@/shared/ui/theme';

interface SwitchRowProps {
  label: string;
  hint?: string;
  on: boolean;
  onChange: (on: boolean) => void;
  children?: ReactNode;
  testID?: string;
}

export function SwitchRow({ label, hint, on, onChange, children, testID }: SwitchRowProps) {
  return (
    <View style={[styles.box, on && styles.boxOn]} testID={testID}>
      <Pressable role="switch" aria-checked={on} accessibilityLabel={label} onPress={() => onChange(!on)} style={styles.row}>
        <View style={[styles.track, on && styles.trackOn]}>
          <View style={[styles.knob, on && styles.knobOn]} />
        </View>
        <View style={styles.text}>
          <AppText variant="bodyStrong">{label}</AppText>
          {hint ? (
            <AppText variant="small" tone="muted">
              {hint}
            </AppText>
          ) : null}
        </View>
        <AppText variant="label" tone="muted">
          {on ? 'On' : 'Off'}
        </AppText>
      </Pressable>
      {on && children ? <View style={styles.fields}>{children}</View> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { borderWidth: stroke.rule, borderColor: colors.border, borderRadius: radius.sm, backgroundColor: colors.background },
  boxOn: { borderColor: colors.borderStrong, backgroundColor: colors.surface },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md, minHeight: layout.minTouchTarget, padding: space.md },
  text: { flex: 1 },
  track: { width: 36, height: 20, borderRadius: radius.round, backgroundColor: colors.neutralTint, borderWidth: stroke.rule, borderColor: colors.borderStrong, justifyContent: 'center' },
  trackOn: { backgroundColor: colors.text, borderColor: colors.text },
  knob: { width: 14, height: 14, marginLeft: 2, borderRadius: radius.round, backgroundColor: colors.surface, borderWidth: stroke.rule, borderColor: colors.borderStrong },
  knobOn: { marginLeft: 18, borderColor: colors.surface },
  fields: { gap: space.md, paddingHorizontal: space.md, paddingBottom: space.md },
});
