/**
 * Spectrum helpers for the exact synthesis, over one synthesis record of L = 2^p samples.
 * Convention (as fft.ts): X[k] = Σ_n x[n]·exp(−2πi·k·n/L), x[n] = (1/L)·Σ_k X[k]·exp(+2πi·k·n/L);
 * one-sided spectra hold k = 0…L/2, line k at f_k = k·fs/L.
 */
import { inverseFft, realFft } from '../fft';
import type { ComplexArray } from '../types';

/** Smallest power of two ≥ max(n, 2). */
export function nextPowerOfTwo(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

/** One-sided spectrum (k = 0…L/2) of a real sequence of power-of-two length. */
export function oneSidedSpectrum(x: Float64Array): ComplexArray {
  return realFft(x);
}

/** Line frequencies f_k = k·fs/L for k = 0…L/2, Hz. */
export function lineFrequencies(length: number, sampleRateHz: number): Float64Array {
  const f = new Float64Array(length / 2 + 1);
  for (let k = 0; k < f.length; k++) f[k] = (k * sampleRateHz) / length;
  return f;
}

/**
 * Two real sequences of length L from their one-sided spectra with ONE complex inverse FFT:
 * z = IFFT(A + jB) with the Hermitian completion of A and B, then a = Re z and b = Im z.
 * The imaginary parts at k = 0 and k = L/2 must be zero (real sequences); they are ignored.
 */
export function realPairFromSpectra(a: ComplexArray, b: ComplexArray, length: number): [Float64Array, Float64Array] {
  const half = length / 2;
  const re = new Float64Array(length);
  const im = new Float64Array(length);
  re[0] = a.re[0];
  im[0] = b.re[0];
  re[half] = a.re[half];
  im[half] = b.re[half];
  for (let k = 1; k < half; k++) {
    // Z[k] = A[k] + j·B[k];  Z[L−k] = conj(A[k]) + j·conj(B[k])
    re[k] = a.re[k] - b.im[k];
    im[k] = a.im[k] + b.re[k];
    re[length - k] = a.re[k] + b.im[k];
    im[length - k] = -a.im[k] + b.re[k];
  }
  const z = inverseFft(re, im);
  return [z.re, z.im];
}

/** One real sequence of length L from its one-sided spectrum (imaginary parts at 0, L/2 ignored). */
export function realFromSpectrum(a: ComplexArray, length: number): Float64Array {
  const zero = { re: new Float64Array(length / 2 + 1), im: new Float64Array(length / 2 + 1) };
  return realPairFromSpectra(a, zero, length)[0];
}

