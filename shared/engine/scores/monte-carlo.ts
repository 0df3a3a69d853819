/**
 * Monte Carlo aggregation of line scores over seeds: per line bias, scatter, percentiles,
 * observed ÷ predicted random error and coverage of the estimate's own 95 % band.
 *
 * Definitions (per line, over the S seeds that ran):
 * - bias: mean magnitude error, dB; scatter: sample standard deviation of it, dB;
 * - percentiles 5/50/95 of the signed magnitude error (dB), and the 95th of |error|;
 * - observed random error: sample standard deviation of |Ĥ|/|H| (a fraction of the exact value);
 * - predicted random error: RMS over seeds of each seed's predicted normalised random error
 *   ε[|Ĥ|] (Bendat & Piersol, Random Data, 4th ed., ch. 9, quoted from memory) — the RMS because
 *   variances, not standard deviations, average;
 * - ratio: observed ÷ predicted (1 means the formula describes the scatter actually seen);
 * - coverage: fraction of (line, seed) pairs whose exact |H| lies inside that seed's 95 % band.
 * - exact-region coverage (when the seeds give it): the same fraction for the exact 95 % region of
 *   H1 (scores/exact-frf-region.ts), always judged on H1 whatever the recipe's estimator.
 * Means and deviations use the corrected two-pass algorithm, percentiles Hyndman & Fan def. 7
 * (see statistics.ts).
 *
 * Every figure carries its Monte Carlo standard error in a field named `<figure>Se`
 * (monte-carlo-error.ts): means s/sqrt(S); scatter and observed random error the fourth-moment
 * formula; percentiles the distribution-free order-statistic interval; coverage sqrt(p(1−p)/S) per
 * line; the random-error ratio u(observed)/predicted (the prediction, an RMS over all seeds, is
 * taken as known). Band-wide figures: see monte-carlo-band.ts.
 */
import { EngineInputError } from '../errors';
import { finiteSorted, meanStd, percentileOfSorted } from './statistics';
import {
  meanStandardError,
  percentileRanks,
  percentileStandardError,
  proportionStandardError,
  stdStandardError,
  type OrderStatisticRanks,
} from './monte-carlo-error';
import { bandFigures, type BandFigures } from './monte-carlo-band';

/** What one seed contributes, over the band's lines (all arrays the same length). */
export interface SeedLineScores {
  magnitudeErrorDb: Float64Array;
  phaseErrorDeg: Float64Array;
  complexRelativeError: Float64Array;
  coherence: Float64Array;
  /** Predicted normalised random error of |Ĥ| for this seed (fraction). */
  predictedMagnitudeError: Float64Array;
  /** 1 where the exact |H| lies inside the estimate's 95 % magnitude band, else 0. */
  insideMagnitudeBand: Uint8Array;
  /** 1 where the exact phase lies inside the estimate's 95 % phase band, else 0. */
  insidePhaseBand?: Uint8Array;
  /** 1 where the exact H lies inside H1's exact 95 % region (Goodman 1965), else 0. */
  insideExactRegion?: Uint8Array;
}

/** Per-line aggregates (Float64Array over the band's lines) and their band-wide figures. */
export interface MonteCarloAggregate {
  seeds: number;
  lines: number;
  frequenciesHz: Float64Array;
  meanMagnitudeDb: Float64Array;
  stdMagnitudeDb: Float64Array;
  p5MagnitudeDb: Float64Array;
  p50MagnitudeDb: Float64Array;
  p95MagnitudeDb: Float64Array;
  p95AbsMagnitudeDb: Float64Array;
  meanPhaseDeg: Float64Array;
  stdPhaseDeg: Float64Array;
  p95AbsPhaseDeg: Float64Array;
  meanComplexRelative: Float64Array;
  p95ComplexRelative: Float64Array;
  meanCoherence: Float64Array;
  p5Coherence: Float64Array;
  observedRandomError: Float64Array;
  predictedRandomError: Float64Array;
  randomErrorRatio: Float64Array;
  coverage: Float64Array;
  phaseCoverage: Float64Array | null;
  /** Fraction of all (line, seed) pairs inside the magnitude band. */
  overallCoverage: number;
  overallPhaseCoverage: number | null;
  /** Median over lines of observed ÷ predicted random error. */
  medianRandomErrorRatio: number;
  /** Per-line coverage of H1's exact 95 % region; null when the seeds do not give it. */
  exactRegionCoverage: Float64Array | null;
  /** Monte Carlo standard errors of the per-line figures above (module doc). */
  meanMagnitudeDbSe: Float64Array;
  stdMagnitudeDbSe: Float64Array;
  p5MagnitudeDbSe: Float64Array;
  p50MagnitudeDbSe: Float64Array;
  p95MagnitudeDbSe: Float64Array;
  p95AbsMagnitudeDbSe: Float64Array;
  meanPhaseDegSe: Float64Array;
  stdPhaseDegSe: Float64Array;
  p95AbsPhaseDegSe: Float64Array;
  meanComplexRelativeSe: Float64Array;
  p95ComplexRelativeSe: Float64Array;
  meanCoherenceSe: Float64Array;
  p5CoherenceSe: Float64Array;
  observedRandomErrorSe: Float64Array;
  randomErrorRatioSe: Float64Array;
  coverageSe: Float64Array;
  phaseCoverageSe: Float64Array | null;
  exactRegionCoverageSe: Float64Array | null;
  /** Band-wide figures with their standard errors (monte-carlo-band.ts). */
  band: BandFigures;
}

function checkSeed(s: SeedLineScores, lines: number, index: number): void {
  const fields: (keyof SeedLineScores)[] = [
    'magnitudeErrorDb',
    'phaseErrorDeg',
    'complexRelativeError',
    'coherence',
    'predictedMagnitudeError',
    'insideMagnitudeBand',
  ];
  for (const k of fields) {
    const a = s[k];
    if (!a || a.length !== lines) {
      throw new EngineInputError(`seeds[${index}].${k}`, a?.length, `length must equal the ${lines} band lines`);
    }
  }
}

/**
 * Aggregates per-seed line scores (see the module doc). `frequenciesHz` gives the band's lines.
 * Throws EngineInputError on an empty seed list or mismatched lengths.
 */
export function aggregateRuns(frequenciesHz: Float64Array, seeds: readonly SeedLineScores[]): MonteCarloAggregate {
  const S = seeds.length;
  const L = frequenciesHz.length;
  if (S === 0) throw new EngineInputError('seeds', 0, 'must hold at least one seed');
  seeds.forEach((s, i) => checkSeed(s, L, i));
  const withPhase = seeds.every((s) => s.insidePhaseBand && s.insidePhaseBand.length === L);
  const withRegion = seeds.every((s) => s.insideExactRegion && s.insideExactRegion.length === L);
  const out = allocate(L, withPhase, withRegion);
  const col = new Float64Array(S);
  const col2 = new Float64Array(S);
  const ranks = new Map<string, OrderStatisticRanks | null>();
  // Order-statistic ranks depend only on (count, p): computed once per pair.
  const pctSe = (sorted: Float64Array, p: number) => {
    const key = `${sorted.length}:${p}`;
    if (!ranks.has(key)) ranks.set(key, percentileRanks(sorted.length, p / 100));
    return percentileStandardError(sorted, ranks.get(key)!);
  };
  let inside = 0;
  let insidePhase = 0;
  for (let l = 0; l < L; l++) {
    for (let s = 0; s < S; s++) col[s] = seeds[s].magnitudeErrorDb[l];
    const m = meanStd(col);
    out.meanMagnitudeDb[l] = m.mean;
    out.stdMagnitudeDb[l] = m.std;
    out.meanMagnitudeDbSe[l] = meanStandardError(m.std, m.count);
    out.stdMagnitudeDbSe[l] = stdStandardError(col);
    const sorted = finiteSorted(col);
    out.p5MagnitudeDb[l] = percentileOfSorted(sorted, 5);
    out.p50MagnitudeDb[l] = percentileOfSorted(sorted, 50);
    out.p95MagnitudeDb[l] = percentileOfSorted(sorted, 95);
    out.p5MagnitudeDbSe[l] = pctSe(sorted, 5);
    out.p50MagnitudeDbSe[l] = pctSe(sorted, 50);
    out.p95MagnitudeDbSe[l] = pctSe(sorted, 95);
    for (let s = 0; s < S; s++) col2[s] = Math.abs(col[s]);
    const sortedAbs = finiteSorted(col2);
    out.p95AbsMagnitudeDb[l] = percentileOfSorted(sortedAbs, 95);
    out.p95AbsMagnitudeDbSe[l] = pctSe(sortedAbs, 95);
    // |Ĥ|/|H| from the dB error, for the observed normalised random error.
    for (let s = 0; s < S; s++) col2[s] = Math.pow(10, col[s] / 20);
    out.observedRandomError[l] = meanStd(col2).std;
    out.observedRandomErrorSe[l] = stdStandardError(col2);

    for (let s = 0; s < S; s++) col[s] = seeds[s].phaseErrorDeg[l];
    const p = meanStd(col);
    out.meanPhaseDeg[l] = p.mean;
    out.stdPhaseDeg[l] = p.std;
    out.meanPhaseDegSe[l] = meanStandardError(p.std, p.count);
    out.stdPhaseDegSe[l] = stdStandardError(col);
    for (let s = 0; s < S; s++) col2[s] = Math.abs(col[s]);
    const sortedPhase = finiteSorted(col2);
    out.p95AbsPhaseDeg[l] = percentileOfSorted(sortedPhase, 95);
    out.p95AbsPhaseDegSe[l] = pctSe(sortedPhase, 95);

    for (let s = 0; s < S; s++) col[s] = seeds[s].complexRelativeError[l];
    const cr = meanStd(col);
    out.meanComplexRelative[l] = cr.mean;
    out.meanComplexRelativeSe[l] = meanStandardError(cr.std, cr.count);
    const sortedCr = finiteSorted(col);
    out.p95ComplexRelative[l] = percentileOfSorted(sortedCr, 95);
    out.p95ComplexRelativeSe[l] = pctSe(sortedCr, 95);

    for (let s = 0; s < S; s++) col[s] = seeds[s].coherence[l];
    const co = meanStd(col);
    out.meanCoherence[l] = co.mean;
    out.meanCoherenceSe[l] = meanStandardError(co.std, co.count);
    const sortedCo = finiteSorted(col);
    out.p5Coherence[l] = percentileOfSorted(sortedCo, 5);
    out.p5CoherenceSe[l] = pctSe(sortedCo, 5);

    for (let s = 0; s < S; s++) col[s] = seeds[s].predictedMagnitudeError[l] ** 2;
    out.predictedRandomError[l] = Math.sqrt(meanStd(col).mean);
    out.randomErrorRatio[l] = out.observedRandomError[l] / out.predictedRandomError[l];
    out.randomErrorRatioSe[l] = out.observedRandomErrorSe[l] / out.predictedRandomError[l];

    let c = 0;
    for (let s = 0; s < S; s++) c += seeds[s].insideMagnitudeBand[l] ? 1 : 0;
    out.coverage[l] = c / S;
    out.coverageSe[l] = proportionStandardError(c / S, S);
    inside += c;
    if (out.phaseCoverage) {
      let cp = 0;
      for (let s = 0; s < S; s++) cp += seeds[s].insidePhaseBand![l] ? 1 : 0;
      out.phaseCoverage[l] = cp / S;
      out.phaseCoverageSe![l] = proportionStandardError(cp / S, S);
      insidePhase += cp;
    }
    if (out.exactRegionCoverage) {
      let ce = 0;
      for (let s = 0; s < S; s++) ce += seeds[s].insideExactRegion![l] ? 1 : 0;
      out.exactRegionCoverage[l] = ce / S;
      out.exactRegionCoverageSe![l] = proportionStandardError(ce / S, S);
    }
  }
  const ratioSorted = finiteSorted(out.randomErrorRatio);
  return {
    ...out,
    seeds: S,
    lines: L,
    frequenciesHz: Float64Array.from(frequenciesHz),
    overallCoverage: inside / (S * L),
    overallPhaseCoverage: withPhase ? insidePhase / (S * L) : null,
    medianRandomErrorRatio: percentileOfSorted(ratioSorted, 50),
    band: bandFigures(seeds, withPhase, withRegion),
  };
}

type LineArrays = Omit<
  MonteCarloAggregate,
  'seeds' | 'lines' | 'frequenciesHz' | 'overallCoverage' | 'overallPhaseCoverage' | 'medianRandomErrorRatio' | 'band'
>;

function allocate(L: number, withPhase: boolean, withRegion: boolean): LineArrays {
  const a = () => new Float64Array(L);
  return {
    meanMagnitudeDb: a(),
    stdMagnitudeDb: a(),
    p5MagnitudeDb: a(),
    p50MagnitudeDb: a(),
    p95MagnitudeDb: a(),
    p95AbsMagnitudeDb: a(),
    meanPhaseDeg: a(),
    stdPhaseDeg: a(),
    p95AbsPhaseDeg: a(),
    meanComplexRelative: a(),
    p95ComplexRelative: a(),
    meanCoherence: a(),
    p5Coherence: a(),
    observedRandomError: a(),
    predictedRandomError: a(),
    randomErrorRatio: a(),
    coverage: a(),
    phaseCoverage: withPhase ? a() : null,
    exactRegionCoverage: withRegion ? a() : null,
    meanMagnitudeDbSe: a(),
    stdMagnitudeDbSe: a(),
    p5MagnitudeDbSe: a(),
    p50MagnitudeDbSe: a(),
    p95MagnitudeDbSe: a(),
    p95AbsMagnitudeDbSe: a(),
    meanPhaseDegSe: a(),
    stdPhaseDegSe: a(),
    p95AbsPhaseDegSe: a(),
    meanComplexRelativeSe: a(),
    p95ComplexRelativeSe: a(),
    meanCoherenceSe: a(),
    p5CoherenceSe: a(),
    observedRandomErrorSe: a(),
    randomErrorRatioSe: a(),
    coverageSe: a(),
    phaseCoverageSe: withPhase ? a() : null,
    exactRegionCoverageSe: withRegion ? a() : null,
  };
}
