/**
 * Eigenvalues of a small real non-symmetric matrix (the 2n × 2n state matrix of a damped
 * structure), which has complex-conjugate eigenvalue pairs.
 *
 * Method: Householder reduction to upper Hessenberg form, then the single-shift complex QR
 * algorithm with Givens rotations, Wilkinson shifts, deflation on negligible subdiagonal elements
 * and exceptional shifts after 10 and 20 iterations (J. G. F. Francis, "The QR transformation",
 * Computer J. 4, 1961–62; G. H. Golub and C. F. Van Loan, Matrix Computations, 4th ed., 2013,
 * §7.4–7.5). Eigenvalues only; eigenvectors are found afterwards by inverse iteration on the
 * quadratic eigenproblem (see physical.ts), which also polishes the eigenvalues.
 */
import type { Complex } from './complex-linear';

/** Eigenvalues of the real n × n matrix `a` (row-major), in no particular order. */
export function eigenvaluesReal(a: Float64Array, n: number): Complex[] {
  const re = Float64Array.from(a);
  const im = new Float64Array(n * n);
  reduceToHessenberg(re, n);
  return hessenbergQrEigenvalues(re, im, n);
}

/** In-place Householder reduction of a real matrix to upper Hessenberg form (similarity). */
function reduceToHessenberg(h: Float64Array, n: number): void {
  const v = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    let alpha = 0;
    for (let i = k + 1; i < n; i++) alpha += h[i * n + k] * h[i * n + k];
    alpha = Math.sqrt(alpha);
    if (alpha === 0) continue;
    const x0 = h[(k + 1) * n + k];
    if (x0 > 0) alpha = -alpha;
    // v = x − alpha·e1, normalised
    v.fill(0);
    for (let i = k + 1; i < n; i++) v[i] = h[i * n + k];
    v[k + 1] -= alpha;
    let vn = 0;
    for (let i = k + 1; i < n; i++) vn += v[i] * v[i];
    if (vn === 0) continue;
    // H ← (I − 2vvᵀ/vᵀv) H (I − 2vvᵀ/vᵀv)
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let i = k + 1; i < n; i++) s += v[i] * h[i * n + j];
      s = (2 * s) / vn;
      for (let i = k + 1; i < n; i++) h[i * n + j] -= s * v[i];
    }
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = k + 1; j < n; j++) s += h[i * n + j] * v[j];
      s = (2 * s) / vn;
      for (let j = k + 1; j < n; j++) h[i * n + j] -= s * v[j];
    }
    for (let i = k + 2; i < n; i++) h[i * n + k] = 0;
  }
}

/** Complex single-shift QR iterations on an upper Hessenberg matrix (overwritten). */
function hessenbergQrEigenvalues(re: Float64Array, im: Float64Array, n: number): Complex[] {
  const values: Complex[] = [];
  const cs = new Float64Array(n);
  const sRe = new Float64Array(n);
  const sIm = new Float64Array(n);
  let hi = n - 1;
  let iterations = 0;
  let sinceDeflation = 0;
  const at = (i: number, j: number) => i * n + j;
  while (hi >= 0) {
    if (hi === 0) {
      values.push([re[0], im[0]]);
      break;
    }
    // Find the start of the active unreduced block.
    let lo = hi;
    while (lo > 0) {
      const sub = Math.hypot(re[at(lo, lo - 1)], im[at(lo, lo - 1)]);
      const diag =
        Math.hypot(re[at(lo, lo)], im[at(lo, lo)]) + Math.hypot(re[at(lo - 1, lo - 1)], im[at(lo - 1, lo - 1)]);
      if (sub <= Number.EPSILON * diag || sub < Number.MIN_VALUE * 1e10) {
        re[at(lo, lo - 1)] = 0;
        im[at(lo, lo - 1)] = 0;
        break;
      }
      lo--;
    }
    if (lo === hi) {
      values.push([re[at(hi, hi)], im[at(hi, hi)]]);
      hi--;
      sinceDeflation = 0;
      continue;
    }
    if (++iterations > 60 * n) throw new Error('QR eigenvalue iteration did not converge');
    sinceDeflation++;
    const [muRe, muIm] = chooseShift(re, im, n, hi, sinceDeflation);
    for (let i = lo; i <= hi; i++) {
      re[at(i, i)] -= muRe;
      im[at(i, i)] -= muIm;
    }
    // QR: G_k acting on rows k, k+1.
    for (let k = lo; k < hi; k++) {
      const ar = re[at(k, k)];
      const ai = im[at(k, k)];
      const br = re[at(k + 1, k)];
      const bi = im[at(k + 1, k)];
      const absA = Math.hypot(ar, ai);
      const r = Math.hypot(absA, Math.hypot(br, bi));
      let c: number;
      let sr: number;
      let si: number;
      if (r === 0) {
        c = 1;
        sr = 0;
        si = 0;
      } else if (absA === 0) {
        c = 0;
        sr = 1;
        si = 0;
      } else {
        c = absA / r;
        // s = (a/|a|)·conj(b)/r
        const ur = ar / absA;
        const ui = ai / absA;
        sr = (ur * br + ui * bi) / r;
        si = (ui * br - ur * bi) / r;
      }
      cs[k] = c;
      sRe[k] = sr;
      sIm[k] = si;
      for (let j = k; j <= hi; j++) {
        const pr = re[at(k, j)];
        const pi = im[at(k, j)];
        const qr = re[at(k + 1, j)];
        const qi = im[at(k + 1, j)];
        // row k ← c·p + s·q ; row k+1 ← −conj(s)·p + c·q
        re[at(k, j)] = c * pr + (sr * qr - si * qi);
        im[at(k, j)] = c * pi + (sr * qi + si * qr);
        re[at(k + 1, j)] = -(sr * pr + si * pi) + c * qr;
        im[at(k + 1, j)] = -(sr * pi - si * pr) + c * qi;
      }
    }
    // RQ: multiply by G_k^H on columns k, k+1.
    for (let k = lo; k < hi; k++) {
      const c = cs[k];
      const sr = sRe[k];
      const si = sIm[k];
      const last = Math.min(k + 2, hi);
      for (let i = lo; i <= last; i++) {
        const xr = re[at(i, k)];
        const xi = im[at(i, k)];
        const yr = re[at(i, k + 1)];
        const yi = im[at(i, k + 1)];
        // [x, y]·G^H = [c·x + conj(s)·y, −s·x + c·y]
        re[at(i, k)] = c * xr + (sr * yr + si * yi);
        im[at(i, k)] = c * xi + (sr * yi - si * yr);
        re[at(i, k + 1)] = -(sr * xr - si * xi) + c * yr;
        im[at(i, k + 1)] = -(sr * xi + si * xr) + c * yi;
      }
    }
    for (let i = lo; i <= hi; i++) {
      re[at(i, i)] += muRe;
      im[at(i, i)] += muIm;
    }
  }
  return values;
}

/** Wilkinson shift from the trailing 2 × 2 block, or an exceptional shift when stalled. */
function chooseShift(re: Float64Array, im: Float64Array, n: number, hi: number, count: number): Complex {
  const at = (i: number, j: number) => i * n + j;
  if (count === 10 || count === 20) {
    const s = Math.hypot(re[at(hi, hi - 1)], im[at(hi, hi - 1)]);
    return [re[at(hi, hi)] + 0.75 * s, im[at(hi, hi)] + 0.75 * s];
  }
  const a: Complex = [re[at(hi - 1, hi - 1)], im[at(hi - 1, hi - 1)]];
  const b: Complex = [re[at(hi - 1, hi)], im[at(hi - 1, hi)]];
  const c: Complex = [re[at(hi, hi - 1)], im[at(hi, hi - 1)]];
  const d: Complex = [re[at(hi, hi)], im[at(hi, hi)]];
  // eigenvalues of [[a, b], [c, d]]: m ± sqrt(((a − d)/2)² + b·c), m = (a + d)/2
  const hr = (a[0] - d[0]) / 2;
  const hiPart = (a[1] - d[1]) / 2;
  const discRe = hr * hr - hiPart * hiPart + (b[0] * c[0] - b[1] * c[1]);
  const discIm = 2 * hr * hiPart + (b[0] * c[1] + b[1] * c[0]);
  const rad = Math.hypot(discRe, discIm);
  const qr = Math.sqrt(Math.max(0, (rad + discRe) / 2));
  let qi = Math.sqrt(Math.max(0, (rad - discRe) / 2));
  if (discIm < 0) qi = -qi;
  const mr = (a[0] + d[0]) / 2;
  const mi = (a[1] + d[1]) / 2;
  const e1: Complex = [mr + qr, mi + qi];
  const e2: Complex = [mr - qr, mi - qi];
  const d1 = Math.hypot(e1[0] - d[0], e1[1] - d[1]);
  const d2 = Math.hypot(e2[0] - d[0], e2[1] - d[1]);
  return d1 <= d2 ? e1 : e2;
}
