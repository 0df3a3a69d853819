/**
 * Small dense complex linear algebra for the known-answer systems (a handful of degrees of
 * freedom). Matrices are square, row-major, split into real and imaginary Float64Arrays of
 * length n·n. Hand-written because these systems are tiny and the FRF is solved at every line.
 */

/** A square complex matrix, row-major: element (i, j) at index i·n + j. */
export interface ComplexMatrix {
  n: number;
  re: Float64Array;
  im: Float64Array;
}

export function complexMatrix(n: number): ComplexMatrix {
  return { n, re: new Float64Array(n * n), im: new Float64Array(n * n) };
}

/**
 * Solves A·x = b by Gaussian elimination with partial pivoting (G. H. Golub and C. F. Van Loan,
 * Matrix Computations, 4th ed., 2013, algorithm 3.4.1). A and b are overwritten.
 * An exactly zero pivot is replaced by `tinyPivot` (default: machine epsilon × the largest
 * element), which is what inverse iteration on a nearly singular matrix wants; for an ordinary
 * solve the caller checks that the matrix is regular beforehand.
 */
export function solveComplexInPlace(
  a: ComplexMatrix,
  bRe: Float64Array,
  bIm: Float64Array,
  tinyPivot?: number,
): void {
  const { n, re, im } = a;
  let scale = 0;
  for (let i = 0; i < n * n; i++) scale = Math.max(scale, Math.abs(re[i]) + Math.abs(im[i]));
  const tiny = tinyPivot ?? Number.EPSILON * (scale || 1);
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const m = Math.abs(re[i * n + k]) + Math.abs(im[i * n + k]);
      if (m > best) {
        best = m;
        p = i;
      }
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        swap(re, k * n + j, p * n + j);
        swap(im, k * n + j, p * n + j);
      }
      swap(bRe, k, p);
      swap(bIm, k, p);
    }
    if (best === 0) {
      re[k * n + k] = tiny;
      im[k * n + k] = 0;
    }
    const pr = re[k * n + k];
    const pi = im[k * n + k];
    const pd = pr * pr + pi * pi;
    for (let i = k + 1; i < n; i++) {
      const ar = re[i * n + k];
      const ai = im[i * n + k];
      if (ar === 0 && ai === 0) continue;
      // factor = a_ik / a_kk
      const fr = (ar * pr + ai * pi) / pd;
      const fi = (ai * pr - ar * pi) / pd;
      for (let j = k + 1; j < n; j++) {
        const kr = re[k * n + j];
        const ki = im[k * n + j];
        re[i * n + j] -= fr * kr - fi * ki;
        im[i * n + j] -= fr * ki + fi * kr;
      }
      re[i * n + k] = 0;
      im[i * n + k] = 0;
      const br = bRe[k];
      const bi = bIm[k];
      bRe[i] -= fr * br - fi * bi;
      bIm[i] -= fr * bi + fi * br;
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    let sr = bRe[k];
    let si = bIm[k];
    for (let j = k + 1; j < n; j++) {
      const ar = re[k * n + j];
      const ai = im[k * n + j];
      sr -= ar * bRe[j] - ai * bIm[j];
      si -= ar * bIm[j] + ai * bRe[j];
    }
    const pr = re[k * n + k];
    const pi = im[k * n + k];
    const pd = pr * pr + pi * pi;
    bRe[k] = (sr * pr + si * pi) / pd;
    bIm[k] = (si * pr - sr * pi) / pd;
  }
}

function swap(a: Float64Array, i: number, j: number): void {
  const t = a[i];
  a[i] = a[j];
  a[j] = t;
}

/** Complex number helpers on [re, im] pairs. */
export type Complex = [number, number];

export function cmul(a: Complex, b: Complex): Complex {
  return [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
}

export function cdiv(a: Complex, b: Complex): Complex {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
}

/** Principal square root of a complex number. */
export function csqrt(a: Complex): Complex {
  const r = Math.hypot(a[0], a[1]);
  if (r === 0) return [0, 0];
  const re = Math.sqrt((r + a[0]) / 2);
  const im = Math.sqrt(Math.max(0, (r - a[0]) / 2));
  return [re, a[1] < 0 ? -im : im];
}
