/**
 * Quantiles of Snedecor's F distribution, for the exact confidence region of an FRF estimate.
 *
 * - General (d1, d2): the F cumulative distribution is the regularized incomplete beta function,
 *   P(F ≤ f) = I_x(d1/2, d2/2) with x = d1·f/(d1·f + d2) (M. Abramowitz & I. A. Stegun, Handbook of
 *   Mathematical Functions, 1964, eq. 26.6.2), I_x evaluated by its continued fraction (ibid. eq.
 *   26.5.8) with the modified Lentz algorithm, ln Γ by the Lanczos approximation (g = 7, nine
 *   coefficients); the quantile is found by bisection on x to double precision.
 * - Two numerator degrees of freedom (the case of a complex FRF): the closed form
 *   F(2, m; 1 − α) = (m/2)·(α^(−2/m) − 1), exact, since P(F > f) = (1 + 2f/m)^(−m/2) for d1 = 2
 *   (follows from Abramowitz & Stegun eq. 26.6.4 with ν1 = 2).
 * Degrees of freedom may be non-integer (effective averages with overlap).
 */
import { EngineInputError } from './errors';

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(z) for z > 0 (Lanczos, g = 7; relative accuracy about 1e-15). */
export function logGamma(z: number): number {
  if (z < 0.5) return Math.log(Math.PI / Math.abs(Math.sin(Math.PI * z))) - logGamma(1 - z);
  const x = z - 1;
  let a = LANCZOS[0];
  const t = x + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i] / (x + i);
  return 0.5 * Math.log(2 * Math.PI) + (x + 0.5) * Math.log(t) - t + Math.log(a);
}

/** Continued fraction of I_x(a, b) (Abramowitz & Stegun 26.5.8), modified Lentz. */
function betaContinuedFraction(a: number, b: number, x: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 1000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return h;
}

/** Regularized incomplete beta I_x(a, b), a, b > 0, x in [0, 1]. */
export function regularizedBeta(x: number, a: number, b: number): number {
  if (!(a > 0) || !(b > 0)) throw new EngineInputError('a, b', `${a}, ${b}`, 'must both be > 0');
  if (!(x >= 0 && x <= 1)) throw new EngineInputError('x', x, 'must be in [0, 1]');
  if (x === 0 || x === 1) return x;
  const front = Math.exp(logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log1p(-x));
  // The fraction converges fast for x < (a + 1)/(a + b + 2); use the symmetry otherwise.
  if (x < (a + 1) / (a + b + 2)) return (front * betaContinuedFraction(a, b, x)) / a;
  return 1 - (front * betaContinuedFraction(b, a, 1 - x)) / b;
}

/** P(F ≤ f) for F with (d1, d2) degrees of freedom. */
export function fCdf(f: number, d1: number, d2: number): number {
  if (!(f > 0)) return 0;
  return regularizedBeta((d1 * f) / (d1 * f + d2), d1 / 2, d2 / 2);
}

function requireDof(name: string, d: number): void {
  if (!(Number.isFinite(d) && d > 0)) throw new EngineInputError(name, d, 'must be a finite number > 0');
}

/** The quantile F(d1, d2; prob): the f with P(F ≤ f) = prob, prob in (0, 1). */
export function fQuantile(d1: number, d2: number, prob: number): number {
  requireDof('d1', d1);
  requireDof('d2', d2);
  if (!(prob > 0 && prob < 1)) throw new EngineInputError('probability', prob, 'must be in (0, 1)');
  if (d1 === 2) return fQuantileTwoNumerator(d2, prob);
  let lo = 0;
  let hi = 1;
  for (let i = 0; i < 200 && hi - lo > 1e-17; i++) {
    const mid = (lo + hi) / 2;
    if (regularizedBeta(mid, d1 / 2, d2 / 2) < prob) lo = mid;
    else hi = mid;
  }
  const x = (lo + hi) / 2;
  return (d2 * x) / (d1 * (1 - x));
}

/** Closed form F(2, m; prob) = (m/2)·((1 − prob)^(−2/m) − 1) (module doc). */
export function fQuantileTwoNumerator(m: number, prob: number): number {
  requireDof('d2', m);
  if (!(prob > 0 && prob < 1)) throw new EngineInputError('probability', prob, 'must be in (0, 1)');
  return (m / 2) * Math.expm1((-2 / m) * Math.log1p(-prob));
}
