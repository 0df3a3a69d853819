/**
 * Shared types of the verification engine. Everything here is plain data so that the server,
 * the browser and the CLI can pass it around, store it and hash it.
 *
 * Conventions (see docs/engine.md):
 * - Frequencies in Hz, times in s, forces in N, displacements in m (SI throughout).
 * - Complex arrays are split into real and imaginary Float64Arrays of equal length.
 * - Block transform X[k] = sum_n w[n] x[n] exp(-2πi k n / N); windows are DFT-even ("periodic").
 * - One-sided densities: Gxx = 2/(fs·Σw²)·mean|X|² (factor 1 at k = 0 and N/2),
 *   Gyx = 2/(fs·Σw²)·mean(Y·conj(X)), Gxy = conj(Gyx).
 */

/** A complex array as two equal-length real arrays. */
export interface ComplexArray {
  re: Float64Array;
  im: Float64Array;
}

/** The output quantity of a system's FRF. */
export type FrfQuantity = 'receptance' | 'mobility' | 'accelerance';

/** SI unit of each FRF quantity (output per unit force). */
export const FRF_UNITS: Record<FrfQuantity, string> = {
  receptance: 'm/N',
  mobility: 'm/(N·s)',
  accelerance: 'm/(N·s²)',
};

export type WindowName =
  | 'rectangular'
  | 'hann'
  | 'hamming'
  | 'flattop'
  | 'blackman-harris'
  | 'kaiser';

export type Estimator = 'H1' | 'H2' | 'Hv';
export type Detrend = 'none' | 'mean' | 'linear';
export type SpectrumScaling = 'density' | 'spectrum';

/** Facts of one mode, as the UI shows them. */
export interface ModeFacts {
  naturalFrequencyHz: number;
  dampedFrequencyHz: number;
  dampingRatio: number;
  halfPowerBandwidthHz: number;
  /** Time for the impulse-response envelope to decay to 1 %, 0.1 % and 1e-6 of its start, s. */
  decayTimeS: { to1Percent: number; to01Percent: number; to1e6: number };
}
