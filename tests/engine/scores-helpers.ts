/**
 * Test helpers for the score tests: the exact SDOF receptance H(ω) = 1/(k − mω² + jcω) and its
 * modal facts (standard vibration textbook results, e.g. S. S. Rao, Mechanical Vibrations).
 */
import type { ComplexArray, ModeFacts } from '@/shared/engine/types';

export interface Sdof {
  m: number;
  k: number;
  zeta: number;
}

/** Exact SDOF receptance at each frequency, m/N. */
export function sdofReceptance(s: Sdof, fHz: Float64Array): ComplexArray {
  const c = 2 * s.zeta * Math.sqrt(s.k * s.m);
  const re = new Float64Array(fHz.length);
  const im = new Float64Array(fHz.length);
  for (let i = 0; i < fHz.length; i++) {
    const w = 2 * Math.PI * fHz[i];
    const a = s.k - s.m * w * w;
    const b = c * w;
    const d = a * a + b * b;
    re[i] = a / d;
    im[i] = -b / d;
  }
  return { re, im };
}

/** Modal facts of the SDOF: f_n = sqrt(k/m)/2π, B_r = 2ζ f_n, decay times ln(1/x)/(ζ ω_n). */
export function sdofModeFacts(s: Sdof): ModeFacts {
  const wn = Math.sqrt(s.k / s.m);
  const fn = wn / (2 * Math.PI);
  const sigma = s.zeta * wn;
  return {
    naturalFrequencyHz: fn,
    dampedFrequencyHz: fn * Math.sqrt(1 - s.zeta * s.zeta),
    dampingRatio: s.zeta,
    halfPowerBandwidthHz: 2 * s.zeta * fn,
    decayTimeS: { to1Percent: Math.log(100) / sigma, to01Percent: Math.log(1000) / sigma, to1e6: Math.log(1e6) / sigma },
  };
}

/** Evenly spaced lines k·df for k in [0, n). */
export function lines(n: number, df: number): Float64Array {
  const f = new Float64Array(n);
  for (let i = 0; i < n; i++) f[i] = i * df;
  return f;
}

/** h · g for a complex scalar g = (gr, gi). */
export function scaleComplex(h: ComplexArray, gr: number, gi: number): ComplexArray {
  const re = new Float64Array(h.re.length);
  const im = new Float64Array(h.re.length);
  for (let i = 0; i < re.length; i++) {
    re[i] = h.re[i] * gr - h.im[i] * gi;
    im[i] = h.re[i] * gi + h.im[i] * gr;
  }
  return { re, im };
}

/** Sum of two SDOF receptances (a 2-mode system written in modal form, well separated modes). */
export function addComplex(a: ComplexArray, b: ComplexArray): ComplexArray {
  const re = new Float64Array(a.re.length);
  const im = new Float64Array(a.re.length);
  for (let i = 0; i < re.length; i++) {
    re[i] = a.re[i] + b.re[i];
    im[i] = a.im[i] + b.im[i];
  }
  return { re, im };
}
