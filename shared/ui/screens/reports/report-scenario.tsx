/** One scenario of a report: what it simulates, its verdict, its criteria table and its plot. */
import { StyleSheet, View } from 'react-native';
import type { ReportContent } from '@/shared/api/approval';
import { AppText, StatusBadge } from '@/shared/ui/components';
import { LinePlot } from '@/shared/ui/plots';
import { colors, curveColors, space, stroke } from '@/shared/ui/theme';
import { FactRow, withUnit } from '../kit/figure';
import { toFloat } from '../studies/seed-frf';

type Scenario = ReportContent['studies'][number]['scenarios'][number];

function ReportPlot({ plot }: { plot: NonNullable<Scenario['plot']> }) {
  const f = toFloat(plot.frequenciesHz);
  const tol = plot.toleranceDb;
  return (
    <LinePlot
      title="Magnitude error against frequency"
      subtitle={plot.note}
      x={{ kind: 'log', label: 'Frequency', unit: 'Hz' }}
      y={{ kind: 'linear', label: 'Magnitude error', unit: 'dB' }}
      series={[{ id: 'mean', label: 'Mean error over seeds', color: curveColors.h1, x: f, y: toFloat(plot.meanMagnitudeErrorDb) }]}
      bands={[{ id: 'spread', label: '5th–95th percentile over seeds', color: curveColors.h1, x: f, low: toFloat(plot.p5MagnitudeErrorDb), high: toFloat(plot.p95MagnitudeErrorDb) }]}
      rules={tol === null ? [] : [
        { id: 'hi', label: `Tolerance ±${tol} dB`, value: tol, color: curveColors.tolerance },
        { id: 'lo', label: `Tolerance ±${tol} dB`, value: -tol, color: curveColors.tolerance },
      ]}
      height={180}
    />
  );
}

export function ReportScenario({ scenario: s }: { scenario: Scenario }) {
  return (
    <View style={styles.scenario}>
      <View style={styles.row}>
        <AppText variant="bodyStrong" style={styles.flex}>{`${s.name} (v${s.version})`}</AppText>
        <StatusBadge tone={s.pass ? 'pass' : 'fail'} label={s.verdict} />
      </View>
      <FactRow label="System" text={s.system} />
      <FactRow label="Acquisition" text={s.acquisition} />
      <FactRow label="Excitation" text={s.excitation} />
      <FactRow label="Error sources" text={s.errorSources.length ? s.errorSources.join('; ') : 'none'} />
      <FactRow label="Seeds" text={s.seeds} />
      <View role="table" aria-label={`Criteria of ${s.name}`} style={styles.table} {...({ dataSet: { print: 'keep' } } as object)}>
        <View role="row" style={[styles.tr, styles.th]}>
          <AppText role="columnheader" variant="label" tone="muted" style={styles.flex}>Criterion</AppText>
          <AppText role="columnheader" variant="label" tone="muted" style={styles.num}>Observed</AppText>
          <AppText role="columnheader" variant="label" tone="muted" style={styles.num}>Limit</AppText>
          <AppText role="columnheader" variant="label" tone="muted" style={styles.verdict}>Verdict</AppText>
        </View>
        {s.criteria.map((c) => (
          <View role="row" key={c.label} style={styles.tr}>
            <AppText role="cell" variant="small" style={styles.flex}>{c.label}</AppText>
            <AppText role="cell" variant="number" style={styles.num}>{withUnit(c.observed, c.unit)}</AppText>
            <AppText role="cell" variant="number" style={styles.num}>{withUnit(c.limit, c.unit)}</AppText>
            <AppText role="cell" variant="smallStrong" tone={c.pass ? 'pass' : 'fail'} style={styles.verdict}>{`${c.pass ? '✓' : '✕'} ${c.verdict}`}</AppText>
          </View>
        ))}
      </View>
      {s.warnings.map((w) => <AppText key={w} variant="small" tone="muted">{`Warning: ${w}`}</AppText>)}
      {s.plot ? <ReportPlot plot={s.plot} /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  scenario: { gap: space.xs, paddingTop: space.md, borderTopWidth: stroke.rule, borderTopColor: colors.borderStrong },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  flex: { flex: 1 },
  table: { marginTop: space.sm },
  tr: { flexDirection: 'row', alignItems: 'baseline', gap: space.sm, paddingVertical: space.xs, borderBottomWidth: stroke.rule, borderBottomColor: colors.border },
  th: { borderBottomColor: colors.borderStrong },
  num: { width: 110, textAlign: 'right' },
  verdict: { width: 70, textAlign: 'right' },
});
