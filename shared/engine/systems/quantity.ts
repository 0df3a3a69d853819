/**
 * FRF quantities. With the time dependence exp(jωt) used throughout the engine, differentiation
 * multiplies by jω, so from the receptance H (m/N):
 *   mobility    Y = jω·H   (m/(N·s)),
 *   accelerance A = −ω²·H  (m/(N·s²)).
 * Standard vibration textbook relations (e.g. S. S. Rao, Mechanical Vibrations).
 */
import type { ComplexArray, FrfQuantity } from '../types';

/** Converts a receptance at frequencies `fHz` (Hz) to `quantity`, in place; returns it. */
export function receptanceTo(quantity: FrfQuantity, fHz: Float64Array, h: ComplexArray): ComplexArray {
  if (quantity === 'receptance') return h;
  for (let i = 0; i < fHz.length; i++) {
    const w = 2 * Math.PI * fHz[i];
    const re = h.re[i];
    const im = h.im[i];
    if (quantity === 'mobility') {
      h.re[i] = -w * im;
      h.im[i] = w * re;
    } else {
      h.re[i] = -w * w * re;
      h.im[i] = -w * w * im;
    }
  }
  return h;
}

/** The factor (jω)^p that turns a receptance into `quantity`, as [re, im], at one frequency. */
export function quantityFactor(quantity: FrfQuantity, fHz: number): [number, number] {
  const w = 2 * Math.PI * fHz;
  if (quantity === 'receptance') return [1, 0];
  if (quantity === 'mobility') return [0, w];
  return [-w * w, 0];
}
