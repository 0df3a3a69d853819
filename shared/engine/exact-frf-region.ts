/**
 * The exact confidence region of the H1 estimate (N. R. Goodman, "Measurement of matrix frequency
 * response functions and multiple coherence functions", AFFDL-TR-65-56, 1965; J. S. Bendat &
 * A. G. Piersol, Random Data, 4th ed., Wiley 2010, ch. 9): with output noise only, Gaussian data
 * and n_d independent blocks, the true H lies with probability 1 − α inside the disc
 *   |Ĥ − H|² ≤ (2/(n − 2))·F(2, n − 2; 1 − α)·(1 − γ̂²)/γ̂²·|Ĥ|²,   n = 2·n_d,
 * around the estimate in the complex plane. With the closed form of F for two numerator degrees
 * of freedom (f-distribution.ts) the factor is (2/m)·F(2, m; 1 − α) = α^(−2/m) − 1, m = n − 2.
 *
 * Unlike the first-order bands (random-errors.ts: |Ĥ|(1 ± 1.96 ε) and φ ± 1.96 σ, a normal
 * approximation good for small errors), the region holds at any coherence and number of averages.
 * It is a region for H1 only, so Plumbline always draws and scores it on H1. Overlapped blocks are
 * not independent; n_d is then Welch's effective number of averages, an approximation. For
 * n_d ≤ 1 the region is the whole plane (radius +∞).
 */
import type { ComplexArray } from './types';
import { EngineInputError } from './errors';
import { fQuantileTwoNumerator } from './f-distribution';

/** Radius of the 1 − α region at each line, in the FRF's own units. */
export function h1ExactRegionRadius(h1: ComplexArray, coherence: Float64Array, nd: number, alpha = 0.05): Float64Array {
  if (!(alpha > 0 && alpha < 1)) throw new EngineInputError('alpha', alpha, 'must be in (0, 1)');
  if (!(Number.isFinite(nd) && nd > 0)) throw new EngineInputError('effectiveAverages', nd, 'must be a finite number > 0');
  if (coherence.length !== h1.re.length) {
    throw new EngineInputError('coherence.length', coherence.length, `must equal the ${h1.re.length} FRF lines`);
  }
  const out = new Float64Array(coherence.length);
  const m = 2 * nd - 2;
  const factor = m > 0 ? (2 / m) * fQuantileTwoNumerator(m, 1 - alpha) : Infinity;
  for (let k = 0; k < out.length; k++) {
    const g2 = Math.min(1, Math.max(0, coherence[k]));
    const mag2 = h1.re[k] * h1.re[k] + h1.im[k] * h1.im[k];
    out[k] = factor === Infinity ? Infinity : Math.sqrt((factor * (1 - g2) * mag2) / g2);
  }
  return out;
}
