/**
 * Normalised random errors of spectral estimates from n_d independent averages
 * (J. S. Bendat & A. G. Piersol, Random Data, 4th ed., Wiley 2010; first-order approximations,
 * good for small errors):
 *   ε[Ĝxx]  = 1 / sqrt(n_d)
 *   ε[|Ĥ|]  = sqrt(1 − γ²) / (|γ|·sqrt(2 n_d))
 *   σ[φ̂]   ≈ sqrt(1 − γ²) / (|γ|·sqrt(2 n_d))        (radians)
 *   ε[γ̂²]  = sqrt(2)·(1 − γ²) / (|γ|·sqrt(n_d))
 * γ² is clamped to [0, 1] first (estimates can exceed 1 by rounding). With overlapped blocks use
 * Welch's effective number of averages for n_d (welch.ts).
 *
 * 95 % confidence bands take the estimate as normally distributed about the true value with the
 * standard deviation above: |H|·(1 ± z·ε) and φ ± z·σ, z = 1.95996 (the normal 97.5 % quantile).
 * The lower magnitude limit is not allowed below 0.
 */
import { EngineInputError, requireFinite } from './errors';

/** Two-sided 95 % quantile of the standard normal distribution. */
export const NORMAL_95 = 1.959963984540054;

function requireAverages(nd: number): void {
  requireFinite('effectiveAverages', nd);
  if (nd <= 0) throw new EngineInputError('effectiveAverages', nd, 'must be > 0');
}

function clampCoherence(g2: number): number {
  return g2 < 0 ? 0 : g2 > 1 ? 1 : g2;
}

/** ε[Ĝxx] = 1/sqrt(n_d). */
export function autospectrumRandomError(nd: number): number {
  requireAverages(nd);
  return 1 / Math.sqrt(nd);
}

/** ε[|Ĥ|] = sqrt(1 − γ²)/(|γ|·sqrt(2 n_d)) for each line's γ². */
export function frfMagnitudeRandomError(coherence: Float64Array, nd: number): Float64Array {
  requireAverages(nd);
  const out = new Float64Array(coherence.length);
  const root = Math.sqrt(2 * nd);
  for (let k = 0; k < out.length; k++) {
    const g2 = clampCoherence(coherence[k]);
    out[k] = Math.sqrt(1 - g2) / (Math.sqrt(g2) * root);
  }
  return out;
}

/** σ[φ̂] in radians; the same first-order value as ε[|Ĥ|]. */
export function frfPhaseStdRad(coherence: Float64Array, nd: number): Float64Array {
  return frfMagnitudeRandomError(coherence, nd);
}

/** ε[γ̂²] = sqrt(2)·(1 − γ²)/(|γ|·sqrt(n_d)). */
export function coherenceRandomError(coherence: Float64Array, nd: number): Float64Array {
  requireAverages(nd);
  const out = new Float64Array(coherence.length);
  const root = Math.sqrt(nd);
  for (let k = 0; k < out.length; k++) {
    const g2 = clampCoherence(coherence[k]);
    out[k] = (Math.SQRT2 * (1 - g2)) / (Math.sqrt(g2) * root);
  }
  return out;
}

export interface Confidence95 {
  magnitudeLow: Float64Array;
  magnitudeHigh: Float64Array;
  phaseHalfWidthRad: Float64Array;
}

/**
 * 95 % bands from |Ĥ| and the normalised errors: [|Ĥ|(1 − zε), |Ĥ|(1 + zε)] and ±z·σ[φ̂].
 */
export function confidence95(
  magnitude: Float64Array,
  magnitudeError: Float64Array,
  phaseStdRad: Float64Array,
): Confidence95 {
  const n = magnitude.length;
  const magnitudeLow = new Float64Array(n);
  const magnitudeHigh = new Float64Array(n);
  const phaseHalfWidthRad = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const spread = NORMAL_95 * magnitudeError[k];
    magnitudeLow[k] = Math.max(0, magnitude[k] * (1 - spread));
    magnitudeHigh[k] = magnitude[k] * (1 + spread);
    phaseHalfWidthRad[k] = NORMAL_95 * phaseStdRad[k];
  }
  return { magnitudeLow, magnitudeHigh, phaseHalfWidthRad };
}
