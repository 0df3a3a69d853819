/**
 * The FRF plot: magnitude (dB re 1 unit, or linear) over phase (wrapped or unwrapped, degrees)
 * against frequency (log or linear), several curves with a legend, 95 % confidence bands as 15 %
 * fills of their curve's colour, an optional ±X dB tolerance drawn in brass around a reference
 * curve, a shared crosshair with read-out, zoom to a band by drag or by band buttons, and export.
 */
import { useMemo, useState } from 'react';
import { curveColors } from '@/shared/ui/theme';
import { xExtent } from './domain';
import { nearestIndex } from './decimate';
import { bandIn, magnitudeIn, magnitudeOf, magnitudeUnit, phaseBand, phaseIn, type ComplexLike, type MagnitudeScale, type PhaseMode } from './frf-values';
import type { LegendEntry } from './legend';
import { PlotCaption, PlotPanel } from './plot-panel';
import { PlotFrame } from './plot-frame';
import { formatReadout, formatWithUnit, type AxisKind } from './ticks';
import { ToggleGroup } from './toggle-group';
import type { PlotBand, PlotSeries, ReadoutRow, ZoomBand } from './types';
import { usePlotView } from './use-plot-view';

export interface FrfCurve {
  id: string;
  label: string;
  color: string;
  dashed?: boolean;
  frequenciesHz: ArrayLike<number>;
  frf: ComplexLike;
  /** 95 % band: linear magnitude limits and the phase half-width in radians. */
  confidence?: { magnitudeLow: ArrayLike<number>; magnitudeHigh: ArrayLike<number>; phaseHalfWidthRad?: ArrayLike<number> };
}

export interface FrfPlotProps {
  title: string;
  subtitle?: string;
  /** FRF unit, e.g. "m/N". */
  unit: string;
  curves: readonly FrfCurve[];
  /** ±db around the curve `curveId`, drawn as brass limit lines. */
  tolerance?: { curveId: string; db: number };
  zoomBands?: readonly ZoomBand[];
  initial?: { frequencyAxis?: AxisKind; magnitude?: MagnitudeScale; phase?: PhaseMode };
  showPhase?: boolean;
  magnitudeHeight?: number;
  phaseHeight?: number;
  testID?: string;
}

const frequencyOptions = [
  { value: 'log', label: 'Log' },
  { value: 'linear', label: 'Linear' },
] as const;
const magnitudeOptions = [
  { value: 'db', label: 'dB' },
  { value: 'linear', label: 'Linear' },
] as const;
const phaseOptions = [
  { value: 'wrapped', label: 'Wrapped' },
  { value: 'unwrapped', label: 'Unwrapped' },
] as const;

const wrappedPhaseTicks = [-180, -90, 0, 90, 180];

export function FrfPlot(props: FrfPlotProps) {
  const { title, subtitle, unit, curves, tolerance, zoomBands, showPhase = true, testID } = props;
  const [frequencyAxis, setFrequencyAxis] = useState<AxisKind>(props.initial?.frequencyAxis ?? 'log');
  const [magnitude, setMagnitude] = useState<MagnitudeScale>(props.initial?.magnitude ?? 'db');
  const [phase, setPhase] = useState<PhaseMode>(props.initial?.phase ?? 'wrapped');
  const full = useMemo(
    () => xExtent(curves.map((c) => ({ x: c.frequenciesHz })), frequencyAxis === 'log') ?? ([1, 10] as [number, number]),
    [curves, frequencyAxis],
  );
  const view = usePlotView(full, frequencyAxis);

  const drawn = useMemo(() => {
    const magSeries: PlotSeries[] = [];
    const phaseSeries: PlotSeries[] = [];
    const magBands: PlotBand[] = [];
    const phaseBands: PlotBand[] = [];
    for (const c of curves) {
      const mag = magnitudeIn(c.frf, magnitude);
      const ph = phaseIn(c.frf, phase);
      magSeries.push({ id: c.id, label: c.label, color: c.color, dashed: c.dashed, x: c.frequenciesHz, y: mag });
      phaseSeries.push({ id: c.id, label: c.label, color: c.color, dashed: c.dashed, x: c.frequenciesHz, y: ph, breakAbove: phase === 'wrapped' ? 180 : undefined });
      if (c.confidence) {
        const b = bandIn(c.confidence.magnitudeLow, c.confidence.magnitudeHigh, magnitude);
        magBands.push({ id: `${c.id}-band`, label: `${c.label} 95 % band`, color: c.color, x: c.frequenciesHz, low: b.low, high: b.high });
        if (c.confidence.phaseHalfWidthRad) {
          const p = phaseBand(ph, c.confidence.phaseHalfWidthRad, phase === 'wrapped' ? 180 : undefined);
          phaseBands.push({ id: `${c.id}-band`, label: `${c.label} 95 % band`, color: c.color, x: c.frequenciesHz, low: p.low, high: p.high });
        }
      }
    }
    const reference = tolerance ? curves.find((c) => c.id === tolerance.curveId) : undefined;
    if (reference && tolerance) {
      const m = magnitudeOf(reference.frf);
      for (const sign of [1, -1]) {
        const factor = Math.pow(10, (sign * tolerance.db) / 20);
        const limit = Float64Array.from(m, (v) => v * factor);
        magSeries.push({
          id: `tolerance${sign > 0 ? '+' : '-'}`,
          label: `Tolerance ±${tolerance.db} dB`,
          color: curveColors.tolerance,
          role: 'limit',
          noReadout: true,
          x: reference.frequenciesHz,
          y: magnitude === 'db' ? Float64Array.from(limit, (v) => (v > 0 ? 20 * Math.log10(v) : NaN)) : limit,
        });
      }
    }
    return { magSeries, phaseSeries, magBands, phaseBands };
  }, [curves, magnitude, phase, tolerance]);

  const legend: LegendEntry[] = [
    // Drawing order is the caller's; the legend reads the dashed (exact) curve first, then by name.
    ...[...curves]
      .sort((a, b) => Number(!!b.dashed) - Number(!!a.dashed) || a.label.localeCompare(b.label))
      .map((c): LegendEntry => ({ id: c.id, label: c.label, color: c.color, kind: c.dashed ? 'dashed' : 'line' })),
    ...drawn.magBands.map((b): LegendEntry => ({ id: b.id, label: b.label, color: b.color, kind: 'band' })),
    ...(tolerance ? [{ id: 'tolerance', label: `Tolerance ±${tolerance.db} dB`, color: curveColors.tolerance, kind: 'limit' as const }] : []),
  ];
  const magUnit = magnitudeUnit(magnitude, unit);
  const readout = useMemo(() => {
    const x = view.cursorX;
    if (x === null || curves.length === 0) return { heading: null, rows: [] };
    const first = curves[0].frequenciesHz;
    const i0 = nearestIndex(first, x);
    const rows: ReadoutRow[] = curves.map((c, n) => {
      const i = nearestIndex(c.frequenciesHz, x);
      const m = drawn.magSeries[n].y[i];
      const p = drawn.phaseSeries[n].y[i];
      const text = `${formatWithUnit(m, magnitude === 'db' ? 'dB' : unit)}${showPhase ? `  ${formatReadout(p, 4)}°` : ''}`;
      return { id: c.id, label: c.label, color: c.color, dashed: c.dashed, text };
    });
    rows.sort((a, b) => Number(!!b.dashed) - Number(!!a.dashed) || a.label.localeCompare(b.label));
    return { heading: { label: 'Frequency', text: formatWithUnit(i0 >= 0 ? first[i0] : x, 'Hz') }, rows };
  }, [view.cursorX, curves, drawn, magnitude, unit, showPhase]);

  const controls = (
    <>
      <ToggleGroup label="Frequency axis" options={frequencyOptions} value={frequencyAxis} onChange={setFrequencyAxis} />
      <ToggleGroup label="Magnitude" options={magnitudeOptions} value={magnitude} onChange={setMagnitude} />
      {showPhase ? <ToggleGroup label="Phase" options={phaseOptions} value={phase} onChange={setPhase} /> : null}
    </>
  );
  const xAxis = { kind: frequencyAxis, label: 'Frequency', unit: 'Hz', domain: view.domain };
  const names = curves.map((c) => c.label).join(', ');
  return (
    <PlotPanel title={title} subtitle={subtitle} view={view} zoomBands={zoomBands} controls={controls} legend={legend} readout={readout} testID={testID}>
      {(width) => (
        <>
          <PlotCaption text={`Magnitude · ${magUnit}`} />
          <PlotFrame
            width={width}
            height={props.magnitudeHeight ?? 220}
            x={xAxis}
            y={{ kind: 'linear', label: 'Magnitude', unit: magUnit }}
            series={drawn.magSeries}
            bands={drawn.magBands}
            cursorX={view.cursorX}
            selection={view.selection}
            interaction={view.interaction}
            label={`${title}: magnitude in ${magUnit} of ${names} against frequency in Hz`}
            testID={testID ? `${testID}-magnitude` : undefined}
          />
          {showPhase ? (
            <>
              <PlotCaption text="Phase · degrees" />
              <PlotFrame
                width={width}
                height={props.phaseHeight ?? 150}
                x={xAxis}
                y={{ kind: 'linear', label: 'Phase', unit: '°', domain: phase === 'wrapped' ? [-180, 180] : undefined, tickValues: phase === 'wrapped' ? wrappedPhaseTicks : undefined }}
                series={drawn.phaseSeries}
                bands={drawn.phaseBands}
                cursorX={view.cursorX}
                selection={view.selection}
                interaction={view.interaction}
                label={`${title}: phase in degrees of ${names} against frequency in Hz`}
                testID={testID ? `${testID}-phase` : undefined}
              />
            </>
          ) : null}
          <PlotCaption text="Frequency · Hz" />
        </>
      )}
    </PlotPanel>
  );
}
