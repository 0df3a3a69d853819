/**
 * One plot per criterion against the swept setting: the Monte Carlo figure the criterion judges
 * (a line), each seed's own figure (points), the tolerance (brass rule), and the cheapest passing
 * point marked. With a second setting, one colour per value of it. Word-valued settings (window,
 * estimator) sit at positions 1, 2, … named in the subtitle.
 */
import { View } from 'react-native';
import type { SweepResults } from '@/shared/api/sweeps';
import { SWEEP_SETTINGS, type SweepSetting } from '@/shared/engine/sweep';
import { LinePlot, type PlotSeries } from '@/shared/ui/plots';
import { curveColors, palette, space } from '@/shared/ui/theme';

const GROUP_COLORS = [curveColors.h1, curveColors.h2, curveColors.hv, curveColors.coherence];
const POSITIVE_LOG: readonly string[] = ['blockLength', 'frequencyResolutionHz', 'recordLengthS'];

/** x position of a value of the first setting. */
export function sweepX(results: SweepResults, value: number | string): number {
  const axis = results.vary[0];
  const numeric = axis.values.every((v) => typeof v === 'number');
  return numeric ? (value as number) : axis.values.indexOf(value) + 1;
}

export function SweepPlots({ results }: { results: SweepResults }) {
  const [first, second] = results.vary;
  const setting = first.setting as SweepSetting;
  const info = SWEEP_SETTINGS[setting];
  const numeric = first.values.every((v) => typeof v === 'number');
  const log = numeric && POSITIVE_LOG.includes(setting) && first.values.every((v) => (v as number) > 0);
  const subtitle = numeric ? undefined : first.values.map((v, i) => `${i + 1} = ${v}`).join(', ');
  const groups = second ? second.values.map((v) => ({ label: `${SWEEP_SETTINGS[second.setting as SweepSetting].label} ${v}`, match: (p: SweepResults['points'][number]) => p.settings[second.setting] === v })) : [{ label: '', match: () => true }];
  const criteria = results.points.find((p) => p.ran)?.criteria ?? [];
  const cheapest = results.cheapestPassing ? results.points[results.cheapestPassing.index] : null;
  return (
    <View style={{ gap: space.lg }}>
      {criteria.map((c) => {
        const series: PlotSeries[] = [];
        groups.forEach((g, gi) => {
          const color = GROUP_COLORS[gi % GROUP_COLORS.length];
          const pts = results.points.filter((p) => p.ran && g.match(p)).map((p) => ({ x: sweepX(results, p.settings[setting]), p })).sort((a, b) => a.x - b.x);
          const judged = pts.filter(({ p }) => p.criteria.find((x) => x.id === c.id)?.observed != null);
          series.push({ id: `judged-${gi}`, label: `${g.label ? `${g.label}: ` : ''}Monte Carlo figure`, color, x: judged.map((d) => d.x), y: judged.map(({ p }) => p.criteria.find((x) => x.id === c.id)!.observed!), unit: c.unit });
          const seeds = pts.flatMap(({ x, p }) => (p.perSeed[c.id] ?? []).filter((v): v is number => v !== null).map((v) => ({ x, v })));
          series.push({ id: `seeds-${gi}`, label: `${g.label ? `${g.label}: ` : ''}each seed`, color, style: 'points', x: seeds.map((s) => s.x), y: seeds.map((s) => s.v), unit: c.unit });
        });
        const mark = cheapest?.criteria.find((x) => x.id === c.id)?.observed;
        if (cheapest && mark != null) {
          series.push({ id: 'cheapest', label: 'Cheapest passing point', color: palette.brass, style: 'points', x: [sweepX(results, cheapest.settings[setting])], y: [mark], unit: c.unit });
        }
        return (
          <LinePlot
            key={c.id}
            title={c.label}
            subtitle={subtitle}
            x={{ kind: log ? 'log' : 'linear', label: info.label, unit: numeric ? info.unit || '—' : 'position' }}
            y={{ kind: 'linear', label: c.label, unit: c.unit || '—' }}
            series={series}
            rules={[{ id: 'limit', label: `Tolerance ${c.id === 'coverage' || c.id === 'min-coherence' ? '≥' : '≤'} ${c.limit}${c.unit ? ` ${c.unit}` : ''}`, value: c.limit, color: curveColors.tolerance }]}
            testID={`sweep-plot-${c.id}`}
          />
        );
      })}
    </View>
  );
}
