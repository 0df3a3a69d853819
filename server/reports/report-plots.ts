/**
 * The plot series of a validation report, made from a study's stored per-line aggregates:
 * - exact vs estimated FRF magnitude: |H| of the scenario's linear system at the band lines, and
 *   the estimate's magnitude rebuilt from the stored magnitude error over seeds,
 *   |H_est| = |H|·10^(e/20) with e the mean (and the 5th/95th percentiles) of the error in dB —
 *   for a transient recipe from the plain comparison (against H itself), so that both curves
 *   refer to the same exact FRF;
 * - coherence (mean and 5th percentile over seeds);
 * - magnitude error vs frequency (mean, and 95th percentile of |error|) with the ± tolerance;
 * - the Monte Carlo spread (5th and 95th percentiles of the signed error);
 * - predicted (Bendat & Piersol, Random Data, ch. 9, quoted from memory) against observed random
 *   error of |H|, as fractions.
 * Every `stride`-th line is kept so a plot holds at most MAX_POINTS points.
 */
import type { ReportPlot } from '@/shared/api/approval';
import type { ScenarioResult } from '@/shared/api/work';
import type { Scenario } from '@/shared/engine/scenario';
import { buildSystem } from '@/shared/engine/systems';

export const MAX_POINTS = 400;
type Series = (number | null)[];

const pick = (a: Series | undefined, stride: number): Series => (a ? a.filter((_, i) => i % stride === 0) : []);
const rebuilt = (exact: Series, errorDb: Series): Series => exact.map((h, i) => (h === null || errorDb[i] === null || errorDb[i] === undefined ? null : h * 10 ** (errorDb[i]! / 20)));

export function scenarioPlot(result: ScenarioResult, scenario: Scenario, toleranceDb: number | undefined): ReportPlot | null {
  const f = result.curves.frequenciesHz;
  if (!f || f.length === 0) return null;
  const stride = Math.max(1, Math.ceil(f.length / MAX_POINTS));
  const frequenciesHz = pick(f, stride);
  const system = buildSystem(scenario.system);
  const h = system.frf(Float64Array.from(frequenciesHz, (v) => v ?? NaN));
  const exactMagnitude: Series = Array.from(h.re, (re, i) => {
    const m = Math.hypot(re, h.im[i]);
    return Number.isFinite(m) ? m : null;
  });
  const usePlain = result.reference === 'exponential-window' && result.plain !== null;
  const magnitudeCurves = usePlain ? result.plain!.curves : result.curves;
  const c = result.curves;
  return {
    scenario: result.name,
    stride,
    unit: system.unit,
    frequenciesHz,
    exactMagnitude,
    estimatedMagnitude: rebuilt(exactMagnitude, pick(magnitudeCurves.meanMagnitudeDb, stride)),
    estimatedMagnitudeP5: rebuilt(exactMagnitude, pick(magnitudeCurves.p5MagnitudeDb, stride)),
    estimatedMagnitudeP95: rebuilt(exactMagnitude, pick(magnitudeCurves.p95MagnitudeDb, stride)),
    meanCoherence: pick(c.meanCoherence, stride),
    p5Coherence: pick(c.p5Coherence, stride),
    meanMagnitudeErrorDb: pick(c.meanMagnitudeDb, stride),
    p95AbsMagnitudeErrorDb: pick(c.p95AbsMagnitudeDb, stride),
    toleranceDb: toleranceDb ?? null,
    p5MagnitudeErrorDb: pick(c.p5MagnitudeDb, stride),
    p95MagnitudeErrorDb: pick(c.p95MagnitudeDb, stride),
    observedRandomError: pick(c.observedRandomError, stride),
    predictedRandomError: pick(c.predictedRandomError, stride),
    note: [
      stride > 1 ? `every ${stride}th of ${f.length} band lines drawn` : `all ${f.length} band lines drawn`,
      usePlain
        ? 'estimate rebuilt from the error against the plain linear FRF (the judged error is against the exact FRF seen through the exponential window)'
        : 'estimate rebuilt from the stored magnitude error over seeds: |H|·10^(error/20)',
    ].join('; '),
  };
}
