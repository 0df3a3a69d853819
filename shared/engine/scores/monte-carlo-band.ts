/**
 * Band-wide Monte Carlo figures and their standard errors:
 * - overall coverage of the first-order 95 % magnitude band and phase band, and of H1's exact
 *   95 % region: the fraction of all (line, seed) pairs inside. The lines of one seed are not
 *   independent, so the standard error treats each seed as one cluster: with c_s the fraction of
 *   seed s's lines inside, u = sd(c_s)/sqrt(S) (the standard error of a mean of S independent
 *   seed values), not sqrt(p(1 − p)/(S·L));
 * - median over lines of observed ÷ predicted random error: bootstrap standard error over seeds
 *   (bootstrap.ts, fixed seed), the sample deviation of the B resampled medians.
 */
import type { SeedLineScores } from './monte-carlo';
import { meanStd, finiteSorted, percentileOfSorted } from './statistics';
import { meanStandardError } from './monte-carlo-error';
import { bootstrapIndices } from './bootstrap';

/** Resamples for the median ratio: it costs B·S·L, so fewer than for decision figures. */
const RATIO_RESAMPLES = 200;

export interface BandFigures {
  overallCoverageSe: number;
  overallPhaseCoverageSe: number | null;
  /** Fraction of all (line, seed) pairs inside H1's exact 95 % region; null when not given. */
  overallExactRegionCoverage: number | null;
  overallExactRegionCoverageSe: number | null;
  medianRandomErrorRatioSe: number;
}

function clusterSe(seeds: readonly SeedLineScores[], pick: (s: SeedLineScores) => Uint8Array): { mean: number; se: number } {
  const fractions = seeds.map((s) => {
    const a = pick(s);
    let c = 0;
    for (let i = 0; i < a.length; i++) c += a[i] ? 1 : 0;
    return c / a.length;
  });
  const m = meanStd(fractions);
  return { mean: m.mean, se: meanStandardError(m.std, m.count) };
}

/** Bootstrap standard error of the median over lines of observed ÷ predicted random error. */
function medianRatioSe(seeds: readonly SeedLineScores[]): number {
  const S = seeds.length;
  if (S < 4) return NaN;
  const L = seeds[0].magnitudeErrorDb.length;
  const idx = bootstrapIndices(S, RATIO_RESAMPLES);
  const ratio = new Float64Array(L);
  const medians: number[] = [];
  for (let b = 0; b < RATIO_RESAMPLES; b++) {
    const pick = idx.subarray(b * S, (b + 1) * S);
    for (let l = 0; l < L; l++) {
      let sum = 0;
      let pred = 0;
      for (let k = 0; k < S; k++) {
        const s = seeds[pick[k]];
        sum += Math.pow(10, s.magnitudeErrorDb[l] / 20);
        pred += s.predictedMagnitudeError[l] ** 2;
      }
      const mean = sum / S;
      let ss = 0;
      for (let k = 0; k < S; k++) ss += (Math.pow(10, seeds[pick[k]].magnitudeErrorDb[l] / 20) - mean) ** 2;
      ratio[l] = Math.sqrt(ss / (S - 1)) / Math.sqrt(pred / S);
    }
    medians.push(percentileOfSorted(finiteSorted(ratio), 50));
  }
  return meanStd(medians).std;
}

/** The band-wide figures of the module doc for seeds already checked by aggregateRuns. */
export function bandFigures(seeds: readonly SeedLineScores[], withPhase: boolean, withRegion: boolean): BandFigures {
  const region = withRegion ? clusterSe(seeds, (s) => s.insideExactRegion!) : null;
  return {
    overallCoverageSe: clusterSe(seeds, (s) => s.insideMagnitudeBand).se,
    overallPhaseCoverageSe: withPhase ? clusterSe(seeds, (s) => s.insidePhaseBand!).se : null,
    overallExactRegionCoverage: region ? region.mean : null,
    overallExactRegionCoverageSe: region ? region.se : null,
    medianRandomErrorRatioSe: medianRatioSe(seeds),
  };
}
