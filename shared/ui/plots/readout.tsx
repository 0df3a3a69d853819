/** The crosshair read-out: the x value, then each curve's value at the nearest line, with units. */
import { StyleSheet, View } from 'react-native';
import { AppText } from '@/shared/ui/components';
import { colors, radius, space, stroke } from '@/shared/ui/theme';
import type { ReadoutRow } from './types';

interface ReadoutProps {
  /** e.g. "Frequency 36.02 Hz"; null when the crosshair is not placed. */
  heading: { label: string; text: string } | null;
  rows: readonly ReadoutRow[];
  /** What to do to get a read-out (shown while there is none). */
  hint: string;
  testID?: string;
}

export function Readout({ heading, rows, hint, testID }: ReadoutProps) {
  return (
    <View style={styles.box} aria-live="polite" testID={testID}>
      {heading ? (
        <>
          <View style={styles.row}>
            <AppText variant="smallStrong" style={styles.name}>
              {heading.label}
            </AppText>
            <AppText variant="number" style={styles.value}>
              {heading.text}
            </AppText>
          </View>
          {rows.map((r) => (
            <View key={r.id} style={styles.row}>
              <View style={[styles.swatch, { backgroundColor: r.color }]} aria-hidden />
              <AppText variant="small" style={styles.name}>
                {r.label}
              </AppText>
              <AppText variant="number" style={styles.value}>
                {r.text}
              </AppText>
            </View>
          ))}
        </>
      ) : (
        <AppText variant="small" tone="muted">
          {hint}
        </AppText>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    gap: space.hair,
    paddingVertical: space.sm,
    paddingHorizontal: space.md,
    borderLeftWidth: stroke.plumb,
    borderLeftColor: colors.plumbLine,
    borderRadius: radius.sm,
    backgroundColor: colors.surfaceSunken,
  },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  swatch: { width: space.md, height: stroke.plumb },
  name: { flex: 1 },
  value: { textAlign: 'right' },
});
