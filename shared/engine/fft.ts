/**
 * Fast Fourier transforms for the engine, wrapping fft.js (radix-4, power-of-two sizes).
 *
 * Convention: forward `X[k] = sum_n x[n] exp(-2πi k n / N)`, inverse
 * `x[n] = (1/N) sum_k X[k] exp(+2πi k n / N)`; no other scaling.
 *
 * `PairedRealFft` transforms two real blocks with ONE complex FFT ("two-for-one" packing):
 * with z = x + i·y and Z = FFT(z),
 *   X[k] = (Z[k] + conj(Z[N−k])) / 2,   Y[k] = (Z[k] − conj(Z[N−k])) / (2i),
 * which follows from the Hermitian symmetry of the transforms of real sequences
 * (E. O. Brigham, The Fast Fourier Transform, Prentice-Hall 1974; any DSP text).
 */
import FFT from 'fft.js';
import type { ComplexArray } from './types';
import { EngineInputError } from './errors';

/** True if `n` is an integer power of two ≥ 2. */
export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0 && n <= 2 ** 30;
}

const plans = new Map<number, FFT>();

/** A cached fft.js plan (its twiddle table is immutable, so sharing is safe). */
function plan(n: number, field = 'n'): FFT {
  if (!isPowerOfTwo(n)) throw new EngineInputError(field, n, 'must be a power of two ≥ 2');
  let p = plans.get(n);
  if (!p) {
    p = new FFT(n);
    plans.set(n, p);
  }
  return p;
}

/**
 * Two real blocks of length N, one complex FFT. Fill `input` with interleaved pairs
 * (input[2n] = x[n], input[2n+1] = y[n]), call `transform()`, read the one-sided spectra
 * X[k], Y[k] for k = 0..N/2 from xRe/xIm/yRe/yIm. All buffers are allocated once.
 */
export class PairedRealFft {
  readonly size: number;
  readonly lines: number;
  readonly input: Float64Array;
  readonly xRe: Float64Array;
  readonly xIm: Float64Array;
  readonly yRe: Float64Array;
  readonly yIm: Float64Array;
  /** Z = FFT(input), interleaved re, im (valid after transform/transformRaw). */
  readonly raw: Float64Array;
  private readonly fft: FFT;

  constructor(size: number) {
    this.fft = plan(size, 'blockLength');
    this.size = size;
    this.lines = size / 2 + 1;
    this.input = new Float64Array(2 * size);
    this.raw = new Float64Array(2 * size);
    this.xRe = new Float64Array(this.lines);
    this.xIm = new Float64Array(this.lines);
    this.yRe = new Float64Array(this.lines);
    this.yIm = new Float64Array(this.lines);
  }

  /** Z = FFT(input) into `raw`, without separating X and Y. */
  transformRaw(): void {
    this.fft.transform(this.raw, this.input);
  }

  /** Transforms `input` and separates X and Y (k = 0..N/2). No allocation. */
  transform(): void {
    const z = this.raw;
    this.fft.transform(z, this.input);
    const n = this.size;
    const { xRe, xIm, yRe, yIm } = this;
    // k = 0 and k = N/2 are their own mirror: X = Re Z, Y = Im Z (both real).
    xRe[0] = z[0];
    xIm[0] = 0;
    yRe[0] = z[1];
    yIm[0] = 0;
    const h = n >> 1;
    xRe[h] = z[n];
    xIm[h] = 0;
    yRe[h] = z[n + 1];
    yIm[h] = 0;
    for (let k = 1; k < h; k++) {
      const a = z[2 * k];
      const b = z[2 * k + 1];
      const m = 2 * (n - k);
      const c = z[m];
      const d = z[m + 1];
      xRe[k] = 0.5 * (a + c);
      xIm[k] = 0.5 * (b - d);
      yRe[k] = 0.5 * (b + d);
      yIm[k] = 0.5 * (c - a);
    }
  }
}

/**
 * Transforms `input` and ADDS 4× this block's |X|², |Y|², Re(Y·conj X) and Im(Y·conj X), k = 0..N/2,
 * to the four sums: the separation of X and Y fused with the accumulation, reading Z directly
 * (2X = Z[k] + conj Z[N−k], 2Y = −i·(Z[k] − conj Z[N−k])). The factor 4 is exact (a power of two);
 * the caller divides it out. xRe/xIm/yRe/yIm are not written. No allocation.
 */
export function accumulatePairedSpectra(
  p: PairedRealFft,
  sxx: Float64Array,
  syy: Float64Array,
  syxRe: Float64Array,
  syxIm: Float64Array,
): void {
  p.transformRaw();
  const z = p.raw;
  const n = p.size;
  const h = n >> 1;
  for (let k = 0; k <= h; k++) {
    const m = k === 0 ? 0 : 2 * (n - k);
    const a = z[2 * k];
    const b = z[2 * k + 1];
    const c = z[m];
    const d = z[m + 1];
    const xr = a + c;
    const xi = b - d;
    const yr = b + d;
    const yi = c - a;
    sxx[k] += xr * xr + xi * xi;
    syy[k] += yr * yr + yi * yi;
    syxRe[k] += yr * xr + yi * xi;
    syxIm[k] += yi * xr - yr * xi;
  }
}

/** Forward complex FFT of (re, im), length a power of two. Returns new arrays. */
export function fft(re: Float64Array, im: Float64Array): ComplexArray {
  return complexTransform(re, im, false);
}

/** Inverse complex FFT with the 1/N factor, length a power of two. Returns new arrays. */
export function inverseFft(re: Float64Array, im: Float64Array): ComplexArray {
  return complexTransform(re, im, true);
}

/** One-sided spectrum X[k], k = 0..N/2, of a real sequence of power-of-two length N. */
export function realFft(x: Float64Array): ComplexArray {
  const n = x.length;
  const full = fft(x, new Float64Array(n));
  return { re: full.re.slice(0, n / 2 + 1), im: full.im.slice(0, n / 2 + 1) };
}

function complexTransform(re: Float64Array, im: Float64Array, inverse: boolean): ComplexArray {
  const n = re.length;
  if (im.length !== n) throw new EngineInputError('im.length', im.length, `must equal re.length=${n}`);
  const p = plan(n);
  const data = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    data[2 * i] = re[i];
    data[2 * i + 1] = im[i];
  }
  const out = new Float64Array(2 * n);
  if (inverse) p.inverseTransform(out, data);
  else p.transform(out, data);
  const r = new Float64Array(n);
  const q = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    r[i] = out[2 * i];
    q[i] = out[2 * i + 1];
  }
  return { re: r, im: q };
}
