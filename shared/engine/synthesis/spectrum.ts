/**
 * Spectrum helpers for the exact synthesis, over one synthesis record of L = 2^p samples.
 * Convention (as fft.ts): X[k] = Σ_n x[n]·exp(−2πi·k·n/L), x[n] = (1/L)·Σ_k X[k]·exp(+2πi·k·n/L);
 * one-sided spectra hold k = 0…L/2, line k at f_k = k·fs/L. Built on fft.js directly, with
 * buffers reused across transforms of one size, because the synthesis transforms long records
 * many times (two real inverse transforms per complex FFT).
 */
import FFT from 'fft.js';
import type { ComplexArray } from '../types';

/** Smallest power of two ≥ max(n, 2). */
export function nextPowerOfTwo(n: number): number {
  let p = 2;
  while (p < n) p *= 2;
  return p;
}

/** Reusable transforms of one power-of-two length L. */
export class RealTransforms {
  readonly length: number;
  private readonly fft: FFT;
  private readonly data: Float64Array;
  private readonly out: Float64Array;

  constructor(length: number) {
    this.length = length;
    this.fft = new FFT(length);
    this.data = new Float64Array(2 * length);
    this.out = new Float64Array(2 * length);
  }

  /** One-sided spectrum X[k], k = 0…L/2, of a real sequence of length L. */
  forward(x: Float64Array): ComplexArray {
    const n = this.length;
    const out = this.out;
    this.fft.realTransform(out, x);
    const half = n / 2;
    const re = new Float64Array(half + 1);
    const im = new Float64Array(half + 1);
    for (let k = 0; k <= half; k++) {
      re[k] = out[2 * k];
      im[k] = out[2 * k + 1];
    }
    im[0] = 0;
    im[half] = 0;
    return { re, im };
  }

  /**
   * Two real sequences from their one-sided spectra with ONE complex inverse FFT:
   * z = IFFT(A + jB) with the Hermitian completion of A and B, then a = Re z and b = Im z.
   * Imaginary parts at k = 0 and L/2 are ignored (real sequences). Writes into `a` and `b`.
   */
  inversePair(sa: ComplexArray, sb: ComplexArray, a: Float64Array, b: Float64Array): void {
    const n = this.length;
    const half = n / 2;
    const d = this.data;
    d[0] = sa.re[0];
    d[1] = sb.re[0];
    d[2 * half] = sa.re[half];
    d[2 * half + 1] = sb.re[half];
    for (let k = 1; k < half; k++) {
      const ar = sa.re[k];
      const ai = sa.im[k];
      const br = sb.re[k];
      const bi = sb.im[k];
      // Z[k] = A[k] + j·B[k];  Z[L−k] = conj(A[k]) + j·conj(B[k])
      d[2 * k] = ar - bi;
      d[2 * k + 1] = ai + br;
      d[2 * (n - k)] = ar + bi;
      d[2 * (n - k) + 1] = br - ai;
    }
    this.fft.inverseTransform(this.out, d);
    const out = this.out;
    for (let i = 0; i < n; i++) {
      a[i] = out[2 * i];
      b[i] = out[2 * i + 1];
    }
  }

  /** One real sequence of length L from its one-sided spectrum. */
  inverse(s: ComplexArray): Float64Array {
    const n = this.length;
    const half = n / 2;
    const d = this.data;
    d[0] = s.re[0];
    d[1] = 0;
    d[2 * half] = s.re[half];
    d[2 * half + 1] = 0;
    for (let k = 1; k < half; k++) {
      d[2 * k] = s.re[k];
      d[2 * k + 1] = s.im[k];
      d[2 * (n - k)] = s.re[k];
      d[2 * (n - k) + 1] = -s.im[k];
    }
    this.fft.inverseTransform(this.out, d);
    const x = new Float64Array(n);
    for (let i = 0; i < n; i++) x[i] = this.out[2 * i];
    return x;
  }
}

let recent: RealTransforms | undefined;

/**
 * Transforms of length L. The most recent one up to 2^18 is kept (its twiddle table costs more
 * to build than a transform); results never depend on it. Larger ones are built afresh: pass
 * them along within one computation instead.
 */
export function transformsFor(length: number): RealTransforms {
  if (recent && recent.length === length) return recent;
  const t = new RealTransforms(length);
  if (length <= 2 ** 18) recent = t;
  return t;
}

/** One-sided spectrum (k = 0…L/2) of a real sequence of power-of-two length. */
export function oneSidedSpectrum(x: Float64Array, t: RealTransforms = transformsFor(x.length)): ComplexArray {
  return t.forward(x);
}

/** One real sequence of length L from its one-sided spectrum (imaginary parts at 0, L/2 ignored). */
export function realFromSpectrum(s: ComplexArray, length: number, t: RealTransforms = transformsFor(length)): Float64Array {
  return t.inverse(s);
}
