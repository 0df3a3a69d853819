/**
 * A generic line plot for everything that is not an FRF: coherence, errors against frequency with
 * the tolerance drawn, a Monte Carlo spread as a percentile band, predicted against observed
 * random error (points, with the line y = x). Same crosshair, zoom, legend and export as the FRF
 * plot.
 */
import { useMemo, useState } from 'react';
import { colors, curveColors } from '@/shared/ui/theme';
import { nearestIndex } from './decimate';
import { xExtent } from './domain';
import type { LegendEntry } from './legend';
import { PlotCaption, PlotPanel } from './plot-panel';
import { PlotFrame } from './plot-frame';
import { formatWithUnit, type AxisKind } from './ticks';
import { ToggleGroup } from './toggle-group';
import type { PlotAxis, PlotBand, PlotRule, PlotSeries, ReadoutRow, ZoomBand } from './types';
import { usePlotView } from './use-plot-view';

export interface LinePlotProps {
  title: string;
  subtitle?: string;
  x: PlotAxis;
  y: PlotAxis;
  series: readonly PlotSeries[];
  bands?: readonly PlotBand[];
  rules?: readonly PlotRule[];
  zoomBands?: readonly ZoomBand[];
  /** Offer a log | linear choice for the x axis (frequency axes). */
  xScaleToggle?: boolean;
  /** Draw the line y = x (predicted against observed). */
  identityLine?: boolean;
  height?: number;
  testID?: string;
}

const axisOptions = [
  { value: 'log', label: 'Log' },
  { value: 'linear', label: 'Linear' },
] as const;

export function LinePlot(props: LinePlotProps) {
  const { title, subtitle, y, zoomBands, xScaleToggle, identityLine, testID } = props;
  const bands = props.bands ?? noBands;
  const rules = props.rules ?? noRules;
  const [xKind, setXKind] = useState<AxisKind>(props.x.kind);
  const full = useMemo(
    () => props.x.domain ?? xExtent([...props.series, ...bands], xKind === 'log') ?? ([0, 1] as [number, number]),
    [props.x.domain, props.series, bands, xKind],
  );
  const view = usePlotView(full, xKind);
  const series = useMemo(() => {
    if (!identityLine) return props.series;
    const line: PlotSeries = {
      id: 'identity',
      label: 'Observed = predicted',
      color: colors.textMuted,
      dashed: true,
      noReadout: true,
      x: [full[0], full[1]],
      y: [full[0], full[1]],
    };
    return [...props.series, line];
  }, [props.series, identityLine, full]);

  const legend: LegendEntry[] = [
    ...series.map((s): LegendEntry => ({
      id: s.id,
      label: s.label,
      color: s.color,
      kind: s.role === 'limit' ? 'limit' : s.style === 'points' ? 'points' : s.dashed ? 'dashed' : 'line',
    })),
    ...bands.map((b): LegendEntry => ({ id: b.id, label: b.label, color: b.color, kind: 'band' })),
    ...rules
      .filter((r, i) => rules.findIndex((o) => o.label === r.label) === i)
      .map((r): LegendEntry => ({ id: r.id, label: r.label, color: r.color ?? curveColors.tolerance, kind: 'limit' })),
  ];
  const readout = useMemo(() => {
    const at = view.cursorX;
    if (at === null) return { heading: null, rows: [] };
    const rows: ReadoutRow[] = [];
    let xText = formatWithUnit(at, props.x.unit);
    series.forEach((s, n) => {
      if (s.noReadout) return;
      const i = nearestIndex(s.x, at);
      if (i < 0) return;
      if (n === 0) xText = formatWithUnit(s.x[i], props.x.unit);
      rows.push({ id: s.id, label: s.label, color: s.color, text: formatWithUnit(s.y[i], s.unit ?? y.unit) });
    });
    for (const b of bands) {
      const i = nearestIndex(b.x, at);
      if (i < 0) continue;
      rows.push({ id: b.id, label: b.label, color: b.color, text: `${formatWithUnit(b.low[i], '')} … ${formatWithUnit(b.high[i], y.unit)}` });
    }
    return { heading: { label: props.x.label, text: xText }, rows };
  }, [view.cursorX, series, bands, props.x.label, props.x.unit, y.unit]);

  const controls = xScaleToggle ? <ToggleGroup label={`${props.x.label} axis`} options={axisOptions} value={xKind} onChange={setXKind} /> : null;
  return (
    <PlotPanel title={title} subtitle={subtitle} view={view} zoomBands={zoomBands} controls={controls} legend={legend} readout={readout} testID={testID}>
      {(width) => (
        <>
          <PlotCaption text={`${y.label} · ${y.unit}`} />
          <PlotFrame
            width={width}
            height={props.height ?? 200}
            x={{ ...props.x, kind: xKind, domain: view.domain }}
            y={y}
            series={series}
            bands={bands}
            rules={rules}
            cursorX={view.cursorX}
            selection={view.selection}
            interaction={view.interaction}
            label={`${title}: ${y.label} in ${y.unit} against ${props.x.label} in ${props.x.unit}`}
            testID={testID ? `${testID}-frame` : undefined}
          />
          <PlotCaption text={`${props.x.label} · ${props.x.unit}`} />
        </>
      )}
    </PlotPanel>
  );
}

const noBands: PlotBand[] = [];
const noRules: PlotRule[] = [];
