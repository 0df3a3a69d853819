/** Numbers as Plumbline shows them: IBM Plex Mono, right-aligned, always with their unit. */
import { StyleSheet, View } from 'react-native';
import { AppText } from '@/shared/ui/components';
import { space } from '@/shared/ui/theme';

/** A number with a sensible count of significant figures; "—" when there is none. */
export function formatNumber(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-3) return value.toExponential(Math.max(0, digits - 1));
  if (Number.isInteger(value) && abs < 1e6) return String(value);
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(abs)));
  return value.toFixed(Math.min(decimals, 6));
}

/** The unit as shown after a number; dimensionless figures (coherence, ratios) have none. */
export function unitText(unit: string): string {
  return unit;
}

export function withUnit(value: number | null | undefined, unit: string, digits = 3): string {
  const text = formatNumber(value, digits);
  if (text === '—' || unit === '') return text;
  return unit === '°' ? `${text}°` : `${text} ${unitText(unit)}`;
}

type FigureProps = { value: number | null | undefined; unit: string; digits?: number; strong?: boolean; testID?: string };

export function Figure({ value, unit, digits, strong, testID }: FigureProps) {
  return (
    <AppText variant="number" style={[styles.number, strong && styles.strong]} testID={testID}>
      {withUnit(value, unit, digits)}
    </AppText>
  );
}

/** A label on the left and a figure on the right, for fact lists. */
export function FactRow({ label, value, unit, digits, text }: { label: string; value?: number | null; unit?: string; digits?: number; text?: string }) {
  return (
    <View style={styles.row}>
      <AppText variant="small" tone="muted" style={styles.label}>
        {label}
      </AppText>
      {text !== undefined ? (
        <AppText variant="number" style={styles.number}>
          {text}
        </AppText>
      ) : (
        <Figure value={value} unit={unit ?? ''} digits={digits} />
      )}
    </View>
  );
}

export function formatDateTime(ms: number | null | undefined): string {
  if (ms === null || ms === undefined) return '—';
  return new Date(ms).toISOString().replace('T', ' ').slice(0, 16) + ' UTC';
}

export function formatDate(ms: number | null | undefined): string {
  if (ms === null || ms === undefined) return '—';
  return new Date(ms).toISOString().slice(0, 10);
}

export function formatDuration(seconds: number | null | undefined): string {
  if (seconds === null || seconds === undefined || !Number.isFinite(seconds)) return '—';
  const s = Math.max(0, Math.round(seconds));
  if (s < 60) return `${s} s`;
  const m = Math.floor(s / 60);
  if (m < 60) return `${m} min ${String(s % 60).padStart(2, '0')} s`;
  return `${Math.floor(m / 60)} h ${String(m % 60).padStart(2, '0')} min`;
}

const styles = StyleSheet.create({
  number: { textAlign: 'right', fontVariant: ['tabular-nums'] },
  strong: { fontWeight: '600' },
  row: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'baseline', gap: space.md, paddingVertical: space.xs },
  label: { flex: 1 },
});
