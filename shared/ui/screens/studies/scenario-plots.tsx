/**
 * The plots of one scenario of a study: one seed's H1/H2/Hv against the exact FRF with the 95 %
 * band (recomputed in the browser), coherence over seeds, magnitude and phase error against
 * frequency with the tolerance drawn and the Monte Carlo spread, predicted against observed random
 * error, and the peak error against B_r/Δf across the study's modes.
 */
import { useMemo } from 'react';
import { StyleSheet, View } from 'react-native';
import type { ScenarioResult, Study } from '@/shared/api/work';
import { LinePlot, type PlotBand, type PlotRule, type PlotSeries, type ZoomBand } from '@/shared/ui/plots';
import { curveColors } from '@/shared/ui/theme';
import { space } from '@/shared/ui/theme';
import { peakErrorPoints } from './peak-error';
import { toFloat } from './seed-frf';
import { SeedFrfPanel } from './seed-frf-panel';

type Props = { labId: string; study: Study; scenario: ScenarioResult; allScenarios: readonly ScenarioResult[]; position: number };

/** One log domain for both axes of the scatter (so y = x is the diagonal), a little past the data. */
function logDomain(...sets: Float64Array[]): [number, number] {
  let low = Infinity;
  let high = -Infinity;
  for (const set of sets) for (const v of set) if (v > 0) [low, high] = [Math.min(low, v), Math.max(high, v)];
  return Number.isFinite(low) ? [low / 1.5, high * 1.5] : [0.01, 1];
}

const limitOf = (s: ScenarioResult, id: string) => s.criteria.find((c) => c.id === id)?.limit;

function plusMinus(id: string, label: string, limit: number | undefined): PlotRule[] {
  if (limit === undefined) return [];
  return [
    { id: `${id}-hi`, label, value: limit, color: curveColors.tolerance },
    { id: `${id}-lo`, label, value: -limit, color: curveColors.tolerance },
  ];
}

function modeZooms(s: ScenarioResult): ZoomBand[] {
  return s.modes
    .map((m, i) => ({ f: Number(m.naturalFrequencyHz), z: Number(m.dampingRatio), i }))
    .filter((m) => Number.isFinite(m.f) && m.f > 0)
    .map(({ f, z, i }) => {
      const half = Math.max(5 * z * f, f * 0.02);
      return { label: `Mode ${i + 1}`, low: f - half, high: f + half };
    });
}

export function ScenarioPlots({ labId, study, scenario, allScenarios, position }: Props) {
  const c = scenario.curves;
  const estColor = curveColors.h1;
  const data = useMemo(() => {
    const f = toFloat(c.frequenciesHz);
    const mean = toFloat(c.meanMagnitudeDb);
    const meanPhase = toFloat(c.meanPhaseDeg);
    const stdPhase = toFloat(c.stdPhaseDeg);
    const phaseLow = meanPhase.map((m, i) => m - 2 * stdPhase[i]);
    const phaseHigh = meanPhase.map((m, i) => m + 2 * stdPhase[i]);
    const predicted = toFloat(c.predictedRandomError).map((v) => v * 100);
    const observed = toFloat(c.observedRandomError).map((v) => v * 100);
    const order = [...predicted.keys()]
      // Log axes: only lines where both figures are positive (one seed, or an exact zero, gives none).
      .filter((i) => predicted[i] > 0 && observed[i] > 0 && Number.isFinite(predicted[i]) && Number.isFinite(observed[i]))
      .sort((a, b) => predicted[a] - predicted[b]);
    return {
      f,
      mean,
      p5: toFloat(c.p5MagnitudeDb),
      p95: toFloat(c.p95MagnitudeDb),
      meanPhase,
      phaseLow,
      phaseHigh,
      coherence: toFloat(c.meanCoherence),
      coherenceP5: toFloat(c.p5Coherence),
      scatterX: Float64Array.from(order.map((i) => predicted[i])),
      scatterY: Float64Array.from(order.map((i) => observed[i])),
    };
  }, [c]);
  const zooms = modeZooms(scenario);
  const peaks = useMemo(() => peakErrorPoints(allScenarios), [allScenarios]);
  const minCoherence = limitOf(scenario, 'min-coherence');

  const magSeries: PlotSeries[] = [{ id: 'mean', label: 'Mean error over seeds', color: estColor, x: data.f, y: data.mean, unit: 'dB' }];
  const magBands: PlotBand[] = [{ id: 'spread', label: '5th–95th percentile over seeds', color: estColor, x: data.f, low: data.p5, high: data.p95 }];
  const phaseSeries: PlotSeries[] = [{ id: 'mean', label: 'Mean error over seeds', color: estColor, x: data.f, y: data.meanPhase, unit: '°' }];
  const phaseBands: PlotBand[] = [{ id: 'spread', label: 'Mean ± 2 standard deviations', color: estColor, x: data.f, low: data.phaseLow, high: data.phaseHigh }];
  const cohSeries: PlotSeries[] = [
    { id: 'mean', label: 'Mean coherence', color: curveColors.coherence, x: data.f, y: data.coherence, unit: '' },
    { id: 'p5', label: '5th percentile', color: curveColors.coherence, dashed: true, x: data.f, y: data.coherenceP5, unit: '' },
  ];
  const cohRules: PlotRule[] = minCoherence === undefined ? [] : [{ id: 'floor', label: `Coherence floor ${minCoherence}`, value: minCoherence, color: curveColors.tolerance }];

  return (
    <View style={styles.plots} testID="scenario-plots">
      <SeedFrfPanel labId={labId} study={study} scenario={scenario} position={position} zoomBands={zooms} toleranceDb={limitOf(scenario, 'magnitude-p95')} />
      <LinePlot
        title="Magnitude error against frequency"
        subtitle="Estimated minus exact, dB, with the Monte Carlo spread and the tolerance"
        x={{ kind: 'log', label: 'Frequency', unit: 'Hz' }}
        y={{ kind: 'linear', label: 'Magnitude error', unit: 'dB' }}
        series={magSeries}
        bands={magBands}
        rules={plusMinus('mag', 'Tolerance (± magnitude limit)', limitOf(scenario, 'magnitude-p95'))}
        zoomBands={zooms}
        xScaleToggle
        testID="plot-magnitude-error"
      />
      <LinePlot
        title="Phase error against frequency"
        subtitle="Estimated minus exact, degrees, with the tolerance"
        x={{ kind: 'log', label: 'Frequency', unit: 'Hz' }}
        y={{ kind: 'linear', label: 'Phase error', unit: '°' }}
        series={phaseSeries}
        bands={phaseBands}
        rules={plusMinus('phase', 'Tolerance (± phase limit)', limitOf(scenario, 'phase-p95'))}
        zoomBands={zooms}
        xScaleToggle
        testID="plot-phase-error"
      />
      <LinePlot
        title="Coherence"
        subtitle="Over seeds, with the recipe's floor"
        x={{ kind: 'log', label: 'Frequency', unit: 'Hz' }}
        y={{ kind: 'linear', label: 'Coherence γ²', unit: '(ratio)', domain: [0, 1.02] }}
        series={cohSeries}
        rules={cohRules}
        zoomBands={zooms}
        xScaleToggle
        testID="plot-coherence"
      />
      {data.scatterX.length > 1 ? (
        <LinePlot
          title="Random error: predicted against observed"
          subtitle="Each point is one line: Bendat & Piersol's normalised random error of |H| against the scatter seen over seeds"
          x={{ kind: 'log', label: 'Predicted random error', unit: '%', domain: logDomain(data.scatterX, data.scatterY) }}
          y={{ kind: 'log', label: 'Observed random error', unit: '%', domain: logDomain(data.scatterX, data.scatterY) }}
          series={[{ id: 'lines', label: 'Lines in the band', color: estColor, style: 'points', x: data.scatterX, y: data.scatterY, unit: '%' }]}
          identityLine
          testID="plot-random-error"
        />
      ) : null}
      {peaks.x.length > 1 ? (
        <LinePlot
          title="Peak error against B_r/Δf"
          subtitle="Mean error of the peak magnitude at each mode of the study's scenarios, against its half-power bandwidth over the line spacing"
          x={{ kind: 'log', label: 'B_r/Δf', unit: '(ratio)' }}
          y={{ kind: 'linear', label: 'Peak error', unit: 'dB' }}
          series={[{ id: 'peaks', label: 'Modes of the study', color: curveColors.h2, style: 'points', x: peaks.x, y: peaks.y, unit: 'dB' }]}
          testID="plot-peak-error"
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({ plots: { gap: space.lg } });
