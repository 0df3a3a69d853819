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
 * Means and deviations use the corrected two-pass algorithm, percentiles Hyndman & Fan def. 7
 * (see statistics.ts).
 */
import { EngineInputError } from '../errors';
import { finiteSorted, meanStd, percentileOfSorted } from './statistics';

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
  const out = allocate(L, withPhase);
  const col = new Float64Array(S);
  const col2 = new Float64Array(S);
  let inside = 0;
  let insidePhase = 0;
  for (let l = 0; l < L; l++) {
    for (let s = 0; s < S; s++) col[s] = seeds[s].magnitudeErrorDb[l];
    const m = meanStd(col);
    out.meanMagnitudeDb[l] = m.mean;
    out.stdMagnitudeDb[l] = m.std;
    const sorted = finiteSorted(col);
    out.p5MagnitudeDb[l] = percentileOfSorted(sorted, 5);
    out.p50MagnitudeDb[l] = percentileOfSorted(sorted, 50);
    out.p95MagnitudeDb[l] = percentileOfSorted(sorted, 95);
    for (let s = 0; s < S; s++) col2[s] = Math.abs(col[s]);
    out.p95AbsMagnitudeDb[l] = percentileOfSorted(finiteSorted(col2), 95);
    // |Ĥ|/|H| from the dB error, for the observed normalised random error.
    for (let s = 0; s < S; s++) col2[s] = Math.pow(10, col[s] / 20);
    out.observedRandomError[l] = meanStd(col2).std;

    for (let s = 0; s < S; s++) col[s] = seeds[s].phaseErrorDeg[l];
    const p = meanStd(col);
    out.meanPhaseDeg[l] = p.mean;
    out.stdPhaseDeg[l] = p.std;
    for (let s = 0; s < S; s++) col2[s] = Math.abs(col[s]);
    out.p95AbsPhaseDeg[l] = percentileOfSorted(finiteSorted(col2), 95);

    for (let s = 0; s < S; s++) col[s] = seeds[s].complexRelativeError[l];
    out.meanComplexRelative[l] = meanStd(col).mean;
    out.p95ComplexRelative[l] = percentileOfSorted(finiteSorted(col), 95);

    for (let s = 0; s < S; s++) col[s] = seeds[s].coherence[l];
    out.meanCoherence[l] = meanStd(col).mean;
    out.p5Coherence[l] = percentileOfSorted(finiteSorted(col), 5);

    for (let s = 0; s < S; s++) col[s] = seeds[s].predictedMagnitudeError[l] ** 2;
    out.predictedRandomError[l] = Math.sqrt(meanStd(col).mean);
    out.randomErrorRatio[l] = out.observedRandomError[l] / out.predictedRandomError[l];

    let c = 0;
    for (let s = 0; s < S; s++) c += seeds[s].insideMagnitudeBand[l] ? 1 : 0;
    out.coverage[l] = c / S;
    inside += c;
    if (out.phaseCoverage) {
      let cp = 0;
      for (let s = 0; s < S; s++) cp += seeds[s].insidePhaseBand![l] ? 1 : 0;
      out.phaseCoverage[l] = cp / S;
      insidePhase += cp;
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
  };
}

type LineArrays = Omit<
  MonteCarloAggregate,
  'seeds' | 'lines' | 'frequenciesHz' | 'overallCoverage' | 'overallPhaseCoverage' | 'medianRandomErrorRatio'
>;

function allocate(L: number, withPhase: boolean): LineArrays {
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
  };
}
