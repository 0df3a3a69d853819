/**
 * FRF estimators from Welch-averaged spectra (J. S. Bendat & A. G. Piersol, Random Data, 4th ed.,
 * Wiley 2010; docs/engine.md):
 *   H1 = Gyx / Gxx                       (unbiased by output noise)
 *   H2 = Gyy / Gxy,  Gxy = conj(Gyx)     (unbiased by input noise)
 *   Hv = (Gyy − κ·Gxx + sqrt((κ·Gxx − Gyy)² + 4κ·|Gyx|²)) / (2·Gxy)
 *        the total-least-squares estimate; κ (hvWeight, default 1) is the ratio of the output- to
 *        the input-noise power in the channels' units. κ = 1 is docs/engine.md's Hv; κ → ∞ gives H1,
 *        κ → 0 gives H2. Hv therefore depends on how the channels are scaled.
 *   γ² = |Gyx|² / (Gxx·Gyy),  coherent output power γ²·Gyy,  output noise (1 − γ²)·Gyy.
 * Lines where a denominator is zero come out as NaN (IEEE arithmetic), not as a made-up value.
 */
import type { ComplexArray } from './types';
import { EngineInputError, requireFinite } from './errors';
import type { CrossSpectra } from './welch';
import {
  coherenceRandomError,
  frfMagnitudeRandomError,
  frfPhaseStdRad,
} from './random-errors';

export interface FrfEstimate {
  h1: ComplexArray;
  h2: ComplexArray;
  hv: ComplexArray;
  coherence: Float64Array;
  coherentOutputPower: Float64Array;
  outputNoise: Float64Array;
  /** Bendat & Piersol random errors at n_d = the spectra's effective averages. */
  randomError: {
    /** Normalised random error of |H| (fraction). */
    magnitude: Float64Array;
    /** Standard deviation of the phase, rad. */
    phaseRad: Float64Array;
    /** Normalised random error of γ² (fraction). */
    coherence: Float64Array;
  };
}

/** H1 = Gyx / Gxx. */
export function h1Estimate(s: CrossSpectra): ComplexArray {
  const n = s.gxx.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    re[k] = s.gyx.re[k] / s.gxx[k];
    im[k] = s.gyx.im[k] / s.gxx[k];
  }
  return { re, im };
}

/** H2 = Gyy / Gxy = Gyy·Gyx / |Gyx|². */
export function h2Estimate(s: CrossSpectra): ComplexArray {
  const n = s.gxx.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const a = s.gyx.re[k];
    const b = s.gyx.im[k];
    const f = s.gyy[k] / (a * a + b * b);
    re[k] = f * a;
    im[k] = f * b;
  }
  return { re, im };
}

/**
 * Hv with noise-power ratio κ = hvWeight. Computed as Hv = Gyx·q / (2|Gyx|²) with
 * q = D + R (D ≥ 0) or q = 4κ|Gyx|² / (R − D) (D < 0), D = Gyy − κGxx, R = sqrt(D² + 4κ|Gyx|²):
 * the same value, without the cancellation of D + R when κGxx ≫ Gyy.
 */
export function hvEstimate(s: CrossSpectra, hvWeight = 1): ComplexArray {
  requireFinite('hvWeight', hvWeight);
  if (hvWeight <= 0) throw new EngineInputError('hvWeight', hvWeight, 'must be > 0');
  const n = s.gxx.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const a = s.gyx.re[k];
    const b = s.gyx.im[k];
    const cross = a * a + b * b;
    const d = s.gyy[k] - hvWeight * s.gxx[k];
    const r = Math.sqrt(d * d + 4 * hvWeight * cross);
    const f = d >= 0 ? (d + r) / (2 * cross) : (2 * hvWeight) / (r - d);
    re[k] = f * a;
    im[k] = f * b;
  }
  return { re, im };
}

/** Ordinary coherence γ² = |Gyx|² / (Gxx·Gyy). */
export function coherenceEstimate(s: CrossSpectra): Float64Array {
  const n = s.gxx.length;
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const a = s.gyx.re[k];
    const b = s.gyx.im[k];
    out[k] = (a * a + b * b) / (s.gxx[k] * s.gyy[k]);
  }
  return out;
}

/** All estimators, coherence, the output power split and their random errors. */
export function estimateFrf(s: CrossSpectra, o?: { hvWeight?: number }): FrfEstimate {
  const coherence = coherenceEstimate(s);
  const n = coherence.length;
  const coherentOutputPower = new Float64Array(n);
  const outputNoise = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    coherentOutputPower[k] = coherence[k] * s.gyy[k];
    outputNoise[k] = (1 - coherence[k]) * s.gyy[k];
  }
  const nd = s.effectiveAverages;
  return {
    h1: h1Estimate(s),
    h2: h2Estimate(s),
    hv: hvEstimate(s, o?.hvWeight ?? 1),
    coherence,
    coherentOutputPower,
    outputNoise,
    randomError: {
      magnitude: frfMagnitudeRandomError(coherence, nd),
      phaseRad: frfPhaseStdRad(coherence, nd),
      coherence: coherenceRandomError(coherence, nd),
    },
  };
}
