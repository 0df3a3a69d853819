/**
 * The seeded bootstrap Plumbline uses for Monte Carlo uncertainties that have no closed form
 * (the decision figure of a criterion, the band's median random-error ratio): B resamples of the
 * n seeds, drawn with replacement (B. Efron & R. J. Tibshirani, An Introduction to the Bootstrap,
 * Chapman & Hall 1993, ch. 6, nonparametric bootstrap standard error). Resampling is by seed, never
 * by line, so the correlation between the lines of one seed is kept.
 *
 * The generator is the engine's own (random.ts) with a fixed seed and stream, so a study's
 * uncertainties are as reproducible as its figures: resample b uses the b-th block of n draws.
 */
import { createRandom } from '../random';

/** Fixed seed and stream of every bootstrap in the engine. */
export const BOOTSTRAP_SEED = 1;
export const BOOTSTRAP_STREAM = 'bootstrap-seeds';
/** Resamples for decision figures and band figures. */
export const BOOTSTRAP_RESAMPLES = 400;

/** B·n seed indices in [0, n): resample b is `indices.subarray(b·n, (b + 1)·n)`. */
export function bootstrapIndices(n: number, resamples = BOOTSTRAP_RESAMPLES): Int32Array {
  const random = createRandom(BOOTSTRAP_SEED, BOOTSTRAP_STREAM);
  const out = new Int32Array(n * resamples);
  for (let i = 0; i < out.length; i++) out[i] = Math.min(n - 1, Math.floor(random.uniform() * n));
  return out;
}
