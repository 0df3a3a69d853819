/**
 * The bench's plots: exact FRF against H1, H2 and Hv with the judged estimator's 95 % band and the
 * tolerance around the exact FRF; coherence; the judged estimator's magnitude error against
 * frequency with the tolerance and the predicted 95 % random error; and the summary figures.
 */
import { useMemo } from 'react';
import { StyleSheet, View } from 'react-native';
import { AppText, StatusBadge } from '@/shared/ui/components';
import { FrfPlot, LinePlot, type FrfCurve } from '@/shared/ui/plots';
import { FactRow } from '@/shared/ui/screens/kit/figure';
import { Panel } from '@/shared/ui/screens/kit/panel';
import { curveColors, space } from '@/shared/ui/theme';
import type { WhatIfResult, WhatIfSettings } from './what-if-run';

const estimatorColor = { H1: curveColors.h1, H2: curveColors.h2, Hv: curveColors.hv } as const;

export function WhatIfPlots({ result: r, settings: s, zoomBands }: { result: WhatIfResult; settings: WhatIfSettings; zoomBands: { label: string; low: number; high: number }[] }) {
  const curves = useMemo<FrfCurve[]>(() => {
    // Drawn in order: the other estimates, the judged one over them, the exact FRF on top.
    const order = (['H1', 'H2', 'Hv'] as const).filter((e) => e !== s.estimator).concat(s.estimator);
    const list: FrfCurve[] = order.map((e) => ({
      id: e,
      label: e,
      color: estimatorColor[e],
      frequenciesHz: r.frequenciesHz,
      frf: e === 'H1' ? r.h1 : e === 'H2' ? r.h2 : r.hv,
      confidence: e === s.estimator ? r.confidence : undefined,
    }));
    list.push({ id: 'exact', label: 'Exact', color: curveColors.exact, dashed: true, frequenciesHz: r.frequenciesHz, frf: r.exact });
    return list;
  }, [r, s.estimator]);
  const pass = r.summary.maxAbsMagnitudeDb <= s.toleranceDb;
  return (
    <View style={styles.plots}>
      <Panel title="Result" testID="what-if-summary">
        <View style={styles.verdict}>
          <StatusBadge tone={pass ? 'pass' : 'fail'} label={pass ? `Within ±${s.toleranceDb} dB` : `Outside ±${s.toleranceDb} dB`} testID="what-if-verdict" />
        </View>
        <FactRow label={`Largest |magnitude error| of ${s.estimator} in the band`} value={r.summary.maxAbsMagnitudeDb} unit="dB" digits={3} />
        <FactRow label="at" value={r.summary.worstLineHz} unit="Hz" digits={5} />
        <FactRow label="Mean coherence in the band" value={r.summary.meanCoherence} unit="" digits={3} />
        <FactRow label="Blocks averaged (equivalent independent)" text={`${r.summary.blocks} (${r.summary.effectiveAverages.toPrecision(3)})`} />
        <FactRow label="Line spacing Δf" value={r.summary.resolutionHz} unit="Hz" digits={4} />
        <AppText variant="small" tone="muted" testID="what-if-time">
          {`Simulated and processed ${r.summary.samples} samples in ${Math.round(r.millis)} ms in this browser.`}
        </AppText>
      </Panel>
      <FrfPlot
        title="Exact FRF and the three estimates"
        subtitle={`95 % band on ${s.estimator}; brass lines: exact ±${s.toleranceDb} dB.`}
        unit={r.unit}
        curves={curves}
        tolerance={{ curveId: 'exact', db: s.toleranceDb }}
        zoomBands={zoomBands}
        initial={{ frequencyAxis: 'linear' }}
        testID="what-if-frf"
      />
      <LinePlot
        title="Coherence"
        x={{ kind: 'linear', label: 'Frequency', unit: 'Hz' }}
        y={{ kind: 'linear', label: 'Coherence γ²', unit: '', domain: [0, 1] }}
        series={[{ id: 'coherence', label: 'γ²', color: curveColors.coherence, x: r.frequenciesHz, y: r.coherence }]}
        zoomBands={zoomBands}
        xScaleToggle
        height={160}
        testID="what-if-coherence"
      />
      <LinePlot
        title={`Magnitude error of ${s.estimator}`}
        subtitle="20·log10(|Ĥ|/|H|) against the exact FRF; the band is the predicted 95 % random error (Bendat & Piersol)."
        x={{ kind: 'linear', label: 'Frequency', unit: 'Hz' }}
        y={{ kind: 'linear', label: 'Magnitude error', unit: 'dB' }}
        series={[{ id: 'error', label: `${s.estimator} error`, color: estimatorColor[s.estimator], x: r.frequenciesHz, y: r.magnitudeErrorDb }]}
        bands={[{ id: 'random', label: 'Predicted 95 % random error', color: estimatorColor[s.estimator], x: r.frequenciesHz, low: r.randomErrorDb.low, high: r.randomErrorDb.high }]}
        rules={[
          { id: 'tol+', label: `Tolerance ±${s.toleranceDb} dB`, value: s.toleranceDb, color: curveColors.tolerance },
          { id: 'tol-', label: `Tolerance ±${s.toleranceDb} dB`, value: -s.toleranceDb, color: curveColors.tolerance },
        ]}
        zoomBands={zoomBands}
        xScaleToggle
        height={180}
        testID="what-if-error"
      />
    </View>
  );
}

const styles = StyleSheet.create({ plots: { gap: space.lg }, verdict: { flexDirection: 'row' } });
