/**
 * Estimators: H1/H2/coherence against SciPy, analytic truths (exact FIR FRF, coherence of ±x),
 * identities (H1 = H2 = Hv for y = a·x, Hv symmetry), the ordering |H1| ≤ |Hv| ≤ |H2|, and
 * Carter–Knapp–Nuttall's E[γ̂²] = 1/n_d for independent signals.
 */
import { estimateFrf, h1Estimate, hvEstimate, coherenceEstimate } from '@/shared/engine/estimators';
import { welchCrossSpectra, type CrossSpectra, type WelchOptions } from '@/shared/engine/welch';
import { EngineInputError } from '@/shared/engine/errors';
import {
  gaussianNoise,
  maxComplexRelativeDifference,
  maxRelativeDifference,
  meanAndVariance,
  scipyCases,
  spectraForCase,
} from './spectra-helpers';

const hann: Omit<WelchOptions, 'blockLength'> = { sampleRateHz: 1000, window: 'hann', overlap: 0.5, detrend: 'none', scaling: 'density' };

describe('H1, H2 and coherence against SciPy', () => {
  // Source: SciPy csd/welch/coherence (fixtures from tests/fixtures/scipy/make-fixtures.py):
  // H1 = csd(x, y)/welch(x), H2 = welch(y)/conj(csd(x, y)). Agreement ≤ 1e-10 relative.
  // Ratios are compared on lines that carry signal: where mean detrending leaves the DC line at
  // rounding level (Gxx below 1e-12 of its peak in SciPy's result) both H values are 0/0 noise.
  it.each(scipyCases())('%s', (_label, c) => {
    const e = estimateFrf(spectraForCase(c));
    const peak = Math.max(...c.gxx);
    const lines = c.gxx.map((g, k) => (g >= 1e-12 * peak ? k : -1)).filter((k) => k >= 0);
    expect(lines.length).toBeGreaterThanOrEqual(c.gxx.length - 1);
    const pick = (a: ArrayLike<number>) => lines.map((k) => a[k]);
    expect(maxComplexRelativeDifference(pick(e.h1.re), pick(e.h1.im), pick(c.h1Re), pick(c.h1Im))).toBeLessThanOrEqual(1e-10);
    expect(maxComplexRelativeDifference(pick(e.h2.re), pick(e.h2.im), pick(c.h2Re), pick(c.h2Im))).toBeLessThanOrEqual(1e-10);
    expect(maxRelativeDifference(pick(e.coherence), pick(c.coherence))).toBeLessThanOrEqual(1e-10);
  });
});

/** A record in which the output is a fixed linear function of the input: y = a·x. */
function scaled(a: number, n = 8192) {
  const x = gaussianNoise('scaled-x', n);
  return { x, y: x.map((v) => a * v) };
}

describe('analytic truths', () => {
  it('an FIR filter on a periodic input: H1 = H2 = Hv = B(e^{iω}) exactly', () => {
    // Analytic: with an input of period N, every rectangular N-block holds whole periods, so
    // Y[k] = B(e^{−2πik/N})·X[k] with B(z) = Σ b_m z^{−m} (circular convolution theorem).
    const n = 256;
    const taps = [0.5, -0.3, 0.2, 0.1, -0.05];
    const period = gaussianNoise('fir-period', n);
    const x = new Float64Array(8 * n).map((_, i) => period[i % n]);
    const y = x.map((_, i) => taps.reduce((acc, b, m) => acc + b * period[(((i - m) % n) + n) % n], 0));
    const s = welchCrossSpectra(x, y, { ...hann, window: 'rectangular', blockLength: n, overlap: 0.5 });
    const e = estimateFrf(s);
    const bRe = new Float64Array(n / 2 + 1);
    const bIm = new Float64Array(n / 2 + 1);
    for (let k = 0; k <= n / 2; k++) {
      taps.forEach((b, m) => {
        bRe[k] += b * Math.cos((2 * Math.PI * k * m) / n);
        bIm[k] -= b * Math.sin((2 * Math.PI * k * m) / n);
      });
    }
    for (const h of [e.h1, e.h2, e.hv]) expect(maxComplexRelativeDifference(h.re, h.im, bRe, bIm, 0)).toBeLessThan(1e-10);
    expect(e.coherence.every((g) => Math.abs(g - 1) < 1e-10)).toBe(true);
  });

  it.each([1, -1])('coherence of x with %d·x is 1 at every line', (sign) => {
    const { x, y } = scaled(sign);
    const g = coherenceEstimate(welchCrossSpectra(x, y, { ...hann, blockLength: 512 }));
    expect(g.every((v) => Math.abs(v - 1) < 1e-12)).toBe(true);
  });
});

describe('identities', () => {
  it.each([
    [-2.5, 1],
    [0.01, 1],
    [40, 0.3],
    [3, 7],
  ])('y = %d·x: H1 = H2 = Hv = a (hvWeight %d)', (a, hvWeight) => {
    const { x, y } = scaled(a);
    const e = estimateFrf(welchCrossSpectra(x, y, { ...hann, blockLength: 256 }), { hvWeight });
    const aRe = new Float64Array(129).fill(a);
    const zero = new Float64Array(129);
    for (const h of [e.h1, e.h2, e.hv]) expect(maxComplexRelativeDifference(h.re, h.im, aRe, zero, 0)).toBeLessThan(1e-12);
    expect(e.outputNoise.every((v, k) => Math.abs(v) < 1e-12 * e.coherentOutputPower[k])).toBe(true);
  });

  it('Hv(x→y; κ)·Hv(y→x; 1/κ) = 1, also when Gxx ≫ Gyy (stable form)', () => {
    // Total least squares treats the channels alike: swapping them inverts the estimate.
    const x = gaussianNoise('sym-x', 8192);
    const ny = gaussianNoise('sym-ny', 8192, 1e-7);
    const y = x.map((v, i) => 1e-6 * v + ny[i]); // Gyy/Gxx ≈ 1e-12
    for (const kappa of [1, 1e-3, 1e3]) {
      const fwd = welchCrossSpectra(x, y, { ...hann, blockLength: 256 });
      const rev = welchCrossSpectra(y, x, { ...hann, blockLength: 256 });
      const a = hvEstimate(fwd, kappa);
      const b = hvEstimate(rev, 1 / kappa);
      const pRe = a.re.map((r, k) => r * b.re[k] - a.im[k] * b.im[k]);
      const pIm = a.re.map((r, k) => r * b.im[k] + a.im[k] * b.re[k]);
      expect(maxComplexRelativeDifference(pRe, pIm, new Float64Array(129).fill(1), new Float64Array(129), 0)).toBeLessThan(1e-10);
    }
  });

  it('coherent output power = |Gyx|²/Gxx and coherent + noise = Gyy', () => {
    // Bendat & Piersol, Random Data: coherent output spectrum γ²·Gyy = |H1|²·Gxx.
    const x = gaussianNoise('cop-x', 8192);
    const n = gaussianNoise('cop-n', 8192, 0.5);
    const y = x.map((v, i) => 0.8 * v + n[i]);
    const s = welchCrossSpectra(x, y, { ...hann, blockLength: 256 });
    const e = estimateFrf(s);
    const h1 = h1Estimate(s);
    const expected = s.gxx.map((g, k) => (h1.re[k] ** 2 + h1.im[k] ** 2) * g);
    expect(maxRelativeDifference(e.coherentOutputPower, expected)).toBeLessThan(1e-12);
    expect(maxRelativeDifference(e.coherentOutputPower.map((c, k) => c + e.outputNoise[k]), s.gyy)).toBeLessThan(1e-12);
  });

  it('hvWeight → ∞ gives H1 and hvWeight → 0 gives H2', () => {
    const x = gaussianNoise('lim-x', 8192);
    const nx = gaussianNoise('lim-nx', 8192, 0.3);
    const ny = gaussianNoise('lim-ny', 8192, 0.3);
    const y = x.map((v, i) => 1.5 * v + ny[i]);
    const s = welchCrossSpectra(x.map((v, i) => v + nx[i]), y, { ...hann, blockLength: 256 });
    const e = estimateFrf(s);
    const big = hvEstimate(s, 1e9);
    const small = hvEstimate(s, 1e-9);
    expect(maxComplexRelativeDifference(big.re, big.im, e.h1.re, e.h1.im)).toBeLessThan(1e-6);
    expect(maxComplexRelativeDifference(small.re, small.im, e.h2.re, e.h2.im)).toBeLessThan(1e-6);
  });
});

describe('ordering with noise on both channels', () => {
  it.each([1, 0.1, 10])('|H1| ≤ |Hv| ≤ |H2| at every line (hvWeight %d)', (hvWeight) => {
    // docs/engine.md; follows from γ² ≤ 1 (Cauchy–Schwarz) for any κ > 0.
    const u = gaussianNoise('ord-u', 16384);
    const nx = gaussianNoise('ord-nx', 16384, 0.4);
    const ny = gaussianNoise('ord-ny', 16384, 0.4);
    let state = 0;
    const y = u.map((v, i) => (state = 0.9 * state + v) + ny[i]); // a one-pole system plus noise
    const s = welchCrossSpectra(u.map((v, i) => v + nx[i]), y, { ...hann, blockLength: 512 });
    const e = estimateFrf(s, { hvWeight });
    const mag = (h: { re: Float64Array; im: Float64Array }, k: number) => Math.hypot(h.re[k], h.im[k]);
    let strict = 0;
    for (let k = 0; k < s.gxx.length; k++) {
      expect(mag(e.h1, k)).toBeLessThanOrEqual(mag(e.hv, k) * (1 + 1e-12));
      expect(mag(e.hv, k)).toBeLessThanOrEqual(mag(e.h2, k) * (1 + 1e-12));
      if (mag(e.h1, k) < 0.99 * mag(e.h2, k)) strict++;
    }
    expect(strict).toBeGreaterThan(s.gxx.length / 2); // the noise does separate them
  });
});

describe('Carter, Knapp & Nuttall: E[γ̂²] = 1/n_d for independent signals', () => {
  it('Monte Carlo, rectangular window, no overlap, n_d = 16', () => {
    // G. C. Carter, C. H. Knapp, A. H. Nuttall, IEEE Trans. Audio Electroacoust. AU-21(4), 1973:
    // for independent Gaussian x, y the estimate γ̂² is Beta(1, n_d − 1) distributed, mean 1/n_d,
    // variance (n_d − 1)/(n_d²(n_d + 1)). Interior lines of white noise under a rectangular window
    // are independent, so 800 records × 31 lines give 24 800 samples; tolerance 4 standard errors.
    const n = 64;
    const nd = 16;
    const values: number[] = [];
    for (let seed = 0; seed < 800; seed++) {
      const x = gaussianNoise(`ckn-x-${seed}`, n * nd);
      const y = gaussianNoise(`ckn-y-${seed}`, n * nd);
      const s = welchCrossSpectra(x, y, { ...hann, window: 'rectangular', overlap: 0, blockLength: n });
      expect(s.effectiveAverages).toBe(nd);
      const g = coherenceEstimate(s);
      for (let k = 1; k < n / 2; k++) values.push(g[k]);
    }
    const { mean, variance } = meanAndVariance(values);
    const betaVariance = (nd - 1) / (nd * nd * (nd + 1));
    expect(Math.abs(mean - 1 / nd)).toBeLessThan(4 * Math.sqrt(betaVariance / values.length));
    expect(Math.abs(variance / betaVariance - 1)).toBeLessThan(0.1); // the sampling error of a variance from 24 800 values is ~1.5 %
  });
});

describe('validation', () => {
  const s: CrossSpectra = welchCrossSpectra(gaussianNoise('v', 1024), gaussianNoise('w', 1024), { ...hann, blockLength: 256 });
  it.each([0, -1, NaN, Infinity])('hvWeight=%d is rejected', (hvWeight) => {
    expect(() => estimateFrf(s, { hvWeight })).toThrow(EngineInputError);
    expect(() => estimateFrf(s, { hvWeight })).toThrow(/^hvWeight=/);
  });
});
