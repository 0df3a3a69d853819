/**
 * Putting an exact FRF on an estimate's frequency lines. Where every estimate line matches an
 * exact line (to 1e-9 of the exact spacing) the exact values are taken as they are; otherwise the
 * real and imaginary parts are interpolated linearly between the two neighbouring exact lines and
 * the caller is told how many lines were interpolated (a warning: near a lightly damped resonance
 * linear interpolation misstates the exact value unless the exact grid is much finer).
 */
import type { ComplexArray } from '@/shared/engine/types';
import { CliInputError } from '../args';

export interface ExactOnLines {
  exact: ComplexArray;
  interpolatedLines: number;
}

/** Exact FRF (frequencies ascending) evaluated on `lines`; lines outside its range are an error. */
export function exactOnLines(exactHz: Float64Array, exact: ComplexArray, lines: Float64Array): ExactOnLines {
  const n = exactHz.length;
  for (let i = 1; i < n; i++) {
    if (!(exactHz[i]! > exactHz[i - 1]!)) {
      throw new CliInputError(`--exact: frequency_hz must increase (row ${i + 2})`);
    }
  }
  const spacing = n > 1 ? (exactHz[n - 1]! - exactHz[0]!) / (n - 1) : 1;
  const tolerance = 1e-9 * spacing;
  const re = new Float64Array(lines.length);
  const im = new Float64Array(lines.length);
  let interpolatedLines = 0;
  let j = 0;
  for (let k = 0; k < lines.length; k++) {
    const f = lines[k]!;
    if (f < exactHz[0]! - tolerance || f > exactHz[n - 1]! + tolerance) {
      throw new CliInputError(
        `estimate line ${f} Hz lies outside the exact FRF's range ${exactHz[0]}–${exactHz[n - 1]} Hz (narrow --band)`,
      );
    }
    while (j < n - 2 && exactHz[j + 1]! <= f + tolerance) j++;
    // Now exactHz[j] ≤ f (within tolerance) and, unless at the end, f < exactHz[j + 1].
    if (Math.abs(exactHz[j]! - f) <= tolerance) {
      re[k] = exact.re[j]!;
      im[k] = exact.im[j]!;
    } else if (j + 1 < n && Math.abs(exactHz[j + 1]! - f) <= tolerance) {
      re[k] = exact.re[j + 1]!;
      im[k] = exact.im[j + 1]!;
    } else {
      const t = (f - exactHz[j]!) / (exactHz[j + 1]! - exactHz[j]!);
      re[k] = exact.re[j]! + t * (exact.re[j + 1]! - exact.re[j]!);
      im[k] = exact.im[j]! + t * (exact.im[j + 1]! - exact.im[j]!);
      interpolatedLines++;
    }
  }
  return { exact: { re, im }, interpolatedLines };
}

/** The inclusive-exclusive range of lines inside [lowHz, highHz]; an empty band is an error. */
export function bandLineRange(lines: Float64Array, lowHz: number, highHz: number): { start: number; end: number } {
  let start = 0;
  while (start < lines.length && lines[start]! < lowHz) start++;
  let end = start;
  while (end < lines.length && lines[end]! <= highHz) end++;
  if (end <= start) {
    throw new CliInputError(`--band=${lowHz},${highHz} holds no frequency line of the estimate`);
  }
  return { start, end };
}
