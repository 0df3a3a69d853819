/** The figures of one scenario's comparison: criteria, coverage, random error, and the modes. */
import { StyleSheet, View } from 'react-native';
import type { ScenarioResult } from '@/shared/api/work';
import { AppText } from '@/shared/ui/components';
import { colors, space, stroke } from '@/shared/ui/theme';
import { FactRow, formatNumber } from '../kit/figure';
import { Panel } from '../kit/panel';
import { CriterionCell } from './results-matrix';

type Comparison = Pick<ScenarioResult, 'criteria' | 'figures' | 'modes'>;

export function CriteriaList({ criteria, testID }: { criteria: Comparison['criteria']; testID?: string }) {
  return (
    <View style={styles.list} testID={testID}>
      {criteria.map((c) => (
        <View key={c.id} style={styles.row}>
          <View style={styles.flex}>
            <AppText variant="body">{c.label}</AppText>
            {c.worstLineHz !== null ? <AppText variant="label" tone="muted">{`worst line ${formatNumber(c.worstLineHz, 4)} Hz`}</AppText> : null}
            {c.note ? <AppText variant="small" tone="muted">{c.note}</AppText> : null}
          </View>
          <CriterionCell criterion={c} />
        </View>
      ))}
    </View>
  );
}

const percent = (v: number | null | undefined) => (v === null || v === undefined ? null : v * 100);

export function FigureList({ figures }: { figures: Comparison['figures'] }) {
  return (
    <View>
      <FactRow label="Seeds in the aggregate" value={figures.seeds} unit="" />
      <FactRow label="Lines in the band" value={figures.lines} unit="" />
      <FactRow label="Exact FRF inside the 95 % magnitude band (coverage)" value={percent(figures.overallCoverage)} unit="%" />
      <FactRow label="Exact phase inside the 95 % phase band" value={percent(figures.overallPhaseCoverage)} unit="%" />
      <FactRow label="Observed ÷ predicted random error, median over lines" value={figures.medianRandomErrorRatio} unit="" />
    </View>
  );
}

type Stat = { mean?: number; std?: number; p95Abs?: number };
const stat = (m: Record<string, unknown>, key: string) => (m[key] ?? {}) as Stat;
const num = (m: Record<string, unknown>, key: string) => (typeof m[key] === 'number' ? (m[key] as number) : null);

export function ModesTable({ modes }: { modes: Comparison['modes'] }) {
  if (modes.length === 0) return <AppText variant="small" tone="muted">No modes in the band.</AppText>;
  return (
    <View role="table" aria-label="Modal errors over seeds" style={styles.list} testID="modes-table">
      {modes.map((m, i) => {
        const fn = num(m, 'naturalFrequencyHz');
        const zeta = num(m, 'dampingRatio');
        const reason = typeof m.reason === 'string' ? m.reason : null;
        return (
          <View role="row" key={i} style={styles.mode}>
            <AppText variant="bodyStrong">{`Mode ${i + 1}: ${formatNumber(fn, 4)} Hz, ζ ${formatNumber(zeta === null ? null : zeta * 100, 3)} %`}</AppText>
            {reason ? <AppText variant="small" tone="muted">{reason}</AppText> : null}
            <FactRow label="Resonance frequency error, 95th percentile |error|" value={stat(m, 'resonanceFrequencyErrorPercent').p95Abs} unit="%" />
            <FactRow label="Damping error, 95th percentile |error|" value={stat(m, 'dampingErrorPercent').p95Abs} unit="%" />
            <FactRow label="Peak value error, mean" value={stat(m, 'peakValueErrorDb').mean} unit="dB" />
            <FactRow label="Seeds where the mode was resolved" text={`${String(m.resolvedSeeds ?? '—')} of ${String(m.seeds ?? '—')}`} />
          </View>
        );
      })}
    </View>
  );
}

export function ComparisonPanels({ title, comparison }: { title: string; comparison: Comparison }) {
  return (
    <>
      <Panel title={title} testID="scenario-criteria">
        <CriteriaList criteria={comparison.criteria} />
      </Panel>
      <Panel title="Figures over seeds">
        <FigureList figures={comparison.figures} />
      </Panel>
      <Panel title="Modes">
        <ModesTable modes={comparison.modes} />
      </Panel>
    </>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1, gap: space.hair },
  list: { gap: space.sm },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md, paddingTop: space.sm, borderTopWidth: stroke.rule, borderTopColor: colors.border },
  mode: { gap: space.hair, paddingTop: space.sm, borderTopWidth: stroke.rule, borderTopColor: colors.border },
});
