/**
 * The pass/fail matrix: one row per scenario, one column per criterion. Each cell carries a word
 * and a mark (never colour alone) and the observed value with its unit; a row leads to that
 * scenario's plots. Phones get one card per scenario instead of a wide table.
 */
import { useState } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import type { ScenarioResult } from '@/shared/api/work';
import { AppText, StatusBadge } from '@/shared/ui/components';
import { useWideLayout } from '@/shared/ui/navigation/use-wide-layout';
import { colors, space, stroke } from '@/shared/ui/theme';
import { withUnit } from '../kit/figure';
import { RowLink } from '../kit/panel';
import { Verdict } from '../kit/verdict';

type Criterion = ScenarioResult['criteria'][number];

/** Criteria columns: every criterion id in the order it first appears. */
export function criterionColumns(scenarios: readonly ScenarioResult[]): { id: string; label: string }[] {
  const seen = new Map<string, string>();
  for (const s of scenarios) for (const c of s.criteria) if (!seen.has(c.id)) seen.set(c.id, c.label);
  return [...seen].map(([id, label]) => ({ id, label }));
}

export function CriterionCell({ criterion }: { criterion: Criterion | undefined }) {
  if (!criterion) {
    return (
      <AppText variant="small" tone="muted">
        not judged
      </AppText>
    );
  }
  const { pass, observed, unit, limit } = criterion;
  const below = criterion.id.includes('coherence') ? '≥' : '≤';
  return (
    <View style={styles.cell} accessibilityLabel={`${criterion.label}: ${pass ? 'pass' : 'fail'}, ${withUnit(observed, unit)} against ${below} ${withUnit(limit, unit)}`}>
      <StatusBadge tone={pass ? 'pass' : 'fail'} label={pass ? 'Pass' : 'Fail'} />
      <AppText variant="number" style={styles.right}>
        {withUnit(observed, unit)}
      </AppText>
      <AppText variant="label" tone="muted" style={styles.right}>
        {`limit ${below} ${withUnit(limit, unit)}`}
      </AppText>
    </View>
  );
}

type MatrixProps = { studyId: string; scenarios: readonly ScenarioResult[] };

/** Width the table needs: the name column, each criterion column and the gaps between them. */
export const tableWidth = (columns: number) => NAME_WIDTH + columns * (COLUMN_WIDTH + space.md) + space.lg;
const NAME_WIDTH = 180;
const COLUMN_WIDTH = 130;

export function ResultsMatrix({ studyId, scenarios }: MatrixProps) {
  const wide = useWideLayout();
  const [available, setAvailable] = useState(0);
  const columns = criterionColumns(scenarios);
  // The table only where it fits (measured); otherwise one card per scenario.
  const table = wide && available >= tableWidth(columns.length);
  return (
    <View onLayout={(e) => setAvailable(e.nativeEvent.layout.width)}>
      {table ? <MatrixTable studyId={studyId} scenarios={scenarios} columns={columns} /> : <MatrixCards studyId={studyId} scenarios={scenarios} />}
    </View>
  );
}

function MatrixCards({ studyId, scenarios }: MatrixProps) {
  return (
    <View style={styles.cards} testID="results-matrix">
      {scenarios.map((s, index) => (
        <RowLink key={s.scenarioId} href={`/studies/${studyId}/${index}`} label={`${s.name}: ${s.pass ? 'pass' : 'fail'}`} testID={`matrix-row-${index}`}>
          <View style={styles.card}>
            <View style={styles.cardHead}>
              <AppText variant="bodyStrong" style={styles.flex}>
                {s.name}
              </AppText>
              <Verdict pass={s.pass} />
            </View>
            {s.criteria.map((c) => (
              <View key={c.id} style={styles.cardRow}>
                <AppText variant="small" style={styles.flex}>
                  {c.label}
                </AppText>
                <CriterionCell criterion={c} />
              </View>
            ))}
            <AppText variant="small" tone="muted">{`${s.seeds} seeds${s.failedRuns ? `, ${s.failedRuns} failed runs` : ''} · plots ›`}</AppText>
          </View>
        </RowLink>
      ))}
    </View>
  );
}

function MatrixTable({ studyId, scenarios, columns }: MatrixProps & { columns: { id: string; label: string }[] }) {
  return (
    <ScrollView horizontal contentContainerStyle={styles.tableScroll}>
      <View role="table" aria-label="Pass/fail matrix, scenario by criterion" testID="results-matrix" style={styles.table}>
        <View role="row" style={[styles.tr, styles.th]}>
          <View role="columnheader" style={styles.nameCol}>
            <AppText variant="labelCaps" tone="muted">
              Scenario
            </AppText>
          </View>
          {columns.map((c) => (
            <View role="columnheader" key={c.id} style={styles.col}>
              <AppText variant="label" tone="muted">
                {c.label}
              </AppText>
            </View>
          ))}
        </View>
        {scenarios.map((s, index) => (
          <RowLink key={s.scenarioId} href={`/studies/${studyId}/${index}`} label={`${s.name}: ${s.pass ? 'pass' : 'fail'}`} testID={`matrix-row-${index}`}>
            <View role="row" style={styles.tr}>
              <View role="rowheader" style={styles.nameCol}>
                <AppText variant="bodyStrong">{s.name}</AppText>
                <Verdict pass={s.pass} />
                <AppText variant="label" tone="muted">{`${s.seeds} seeds · plots ›`}</AppText>
              </View>
              {columns.map((c) => (
                <View role="cell" key={c.id} style={styles.col}>
                  <CriterionCell criterion={s.criteria.find((x) => x.id === c.id)} />
                </View>
              ))}
            </View>
          </RowLink>
        ))}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1 },
  right: { textAlign: 'right' },
  cell: { gap: space.hair, alignItems: 'flex-end' },
  cards: { gap: space.sm },
  card: { flex: 1, gap: space.sm },
  cardHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  cardRow: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingTop: space.sm,
    borderTopWidth: stroke.rule,
    borderTopColor: colors.border,
  },
  tableScroll: { flexGrow: 1 },
  table: { gap: space.xs, minWidth: '100%' },
  tr: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md, flex: 1 },
  th: { paddingLeft: space.lg, paddingBottom: space.xs, borderBottomWidth: stroke.rule, borderBottomColor: colors.borderStrong },
  nameCol: { width: NAME_WIDTH, gap: space.xs },
  col: { width: COLUMN_WIDTH, alignItems: 'flex-end' },
});
