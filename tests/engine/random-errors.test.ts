/**
 * Bendat & Piersol's random errors against Monte Carlo, and the 95 % bands' coverage.
 * Source: J. S. Bendat & A. G. Piersol, Random Data, 4th ed., Wiley 2010 (formulas quoted from
 * memory in docs/engine.md). Tolerances come from the number of Monte Carlo samples.
 */
import {
  autospectrumRandomError,
  coherenceRandomError,
  confidence95,
  frfMagnitudeRandomError,
  frfPhaseStdRad,
  NORMAL_95,
} from '@/shared/engine/random-errors';
import { estimateFrf } from '@/shared/engine/estimators';
import { welchCrossSpectra } from '@/shared/engine/welch';
import { EngineInputError } from '@/shared/engine/errors';
import { gaussianNoise, meanAndVariance } from './spectra-helpers';

const rect = { sampleRateHz: 1, window: 'rectangular', overlap: 0, detrend: 'none', scaling: 'density' } as const;

describe('formulas (hand-sized cases)', () => {
  it('values at γ² = 0.8, n_d = 50', () => {
    const g = new Float64Array([0.8]);
    expect(autospectrumRandomError(25)).toBeCloseTo(0.2, 15);
    expect(frfMagnitudeRandomError(g, 50)[0]).toBeCloseTo(Math.sqrt(0.2) / (Math.sqrt(0.8) * 10), 15);
    expect(frfPhaseStdRad(g, 50)[0]).toBeCloseTo(0.05, 15);
    expect(coherenceRandomError(g, 50)[0]).toBeCloseTo((Math.SQRT2 * 0.2) / (Math.sqrt(0.8) * Math.sqrt(50)), 15);
  });
  it('γ² above 1 by rounding is clamped: zero error, not NaN', () => {
    expect(frfMagnitudeRandomError(new Float64Array([1 + 1e-15]), 10)[0]).toBe(0);
  });
  it('95 % band: |H|(1 ± 1.96ε), never below 0', () => {
    const c = confidence95(new Float64Array([2, 2]), new Float64Array([0.1, 0.8]), new Float64Array([0.1, 0.8]));
    expect(NORMAL_95).toBeCloseTo(1.959964, 6); // standard normal 97.5 % quantile
    expect(c.magnitudeLow[0]).toBeCloseTo(2 * (1 - 0.1 * NORMAL_95), 15);
    expect(c.magnitudeHigh[0]).toBeCloseTo(2 * (1 + 0.1 * NORMAL_95), 15);
    expect(c.magnitudeLow[1]).toBe(0);
    expect(c.phaseHalfWidthRad[1]).toBeCloseTo(0.8 * NORMAL_95, 15);
  });
  it.each([0, -3, NaN])('effectiveAverages=%d is rejected', (nd) => {
    expect(() => autospectrumRandomError(nd)).toThrow(EngineInputError);
    expect(() => frfMagnitudeRandomError(new Float64Array(1), nd)).toThrow(/^effectiveAverages=/);
    expect(() => coherenceRandomError(new Float64Array(1), nd)).toThrow(/^effectiveAverages=/);
  });
});

describe('Monte Carlo: autospectrum, ε[Ĝxx] = 1/sqrt(n_d)', () => {
  it('white noise, rectangular, no overlap, n_d = 16', () => {
    // Each interior line is (2σ²/fs)·χ²(2n_d)/(2n_d): exactly 1/sqrt(n_d) relative scatter.
    // 600 records × 31 independent lines; the standard error of a sample standard deviation is
    // ≈ sqrt((2 + 6/n_d)/C)/2 relative (χ² kurtosis); tolerance 4 of them.
    const n = 64;
    const nd = 16;
    const values: number[] = [];
    for (let seed = 0; seed < 600; seed++) {
      const x = gaussianNoise(`gxx-${seed}`, n * nd);
      const s = welchCrossSpectra(x, x, { ...rect, blockLength: n });
      for (let k = 1; k < n / 2; k++) values.push(s.gxx[k] / 2); // E[Gxx] = 2σ²/fs = 2
    }
    const { mean, variance } = meanAndVariance(values);
    const se = Math.sqrt((2 + 6 / nd) / values.length) / 2;
    expect(Math.abs(Math.sqrt(variance) / mean / autospectrumRandomError(nd) - 1)).toBeLessThan(4 * se);
  });
});

describe('Monte Carlo: FRF magnitude, phase and coherence, γ² = 0.8, n_d = 64', () => {
  // y = a·x + n with a = 2 and noise power a²(1/γ² − 1), so γ² = 0.8 at every line; rectangular
  // window, no overlap, so interior lines are independent: 300 records × 31 lines = 9300 samples.
  // The relative standard error of a sample standard deviation is ≈ 1/sqrt(2C) = 0.73 %; tolerance
  // 4 of them. (A conditional-variance argument gives n_d − 1 in place of n_d for |H1|, 0.8 % here.)
  const a = 2;
  const g2 = 0.8;
  const nd = 64;
  const n = 64;
  const magnitudes: number[] = [];
  const phases: number[] = [];
  const coherences: number[] = [];
  let inside = 0;
  let insidePhase = 0;
  beforeAll(() => {
    for (let seed = 0; seed < 300; seed++) {
      const x = gaussianNoise(`frf-x-${seed}`, n * nd);
      const noise = gaussianNoise(`frf-n-${seed}`, n * nd, Math.sqrt(a * a * (1 / g2 - 1)));
      const s = welchCrossSpectra(x, x.map((v, i) => a * v + noise[i]), { ...rect, blockLength: n });
      const e = estimateFrf(s);
      const mag = e.h1.re.map((r, k) => Math.hypot(r, e.h1.im[k]));
      const band = confidence95(mag, e.randomError.magnitude, e.randomError.phaseRad);
      for (let k = 1; k < n / 2; k++) {
        magnitudes.push(mag[k] / a);
        const phase = Math.atan2(e.h1.im[k], e.h1.re[k]);
        phases.push(phase);
        coherences.push(e.coherence[k]);
        if (a >= band.magnitudeLow[k] && a <= band.magnitudeHigh[k]) inside++;
        if (Math.abs(phase) <= band.phaseHalfWidthRad[k]) insidePhase++;
      }
    }
  });
  const predicted = () => frfMagnitudeRandomError(new Float64Array([g2]), nd)[0];
  const tolerance = () => 4 / Math.sqrt(2 * magnitudes.length);

  it('ε[|Ĥ1|] = sqrt(1 − γ²)/(|γ|·sqrt(2n_d))', () => {
    expect(Math.abs(Math.sqrt(meanAndVariance(magnitudes).variance) / predicted() - 1)).toBeLessThan(tolerance());
  });
  it('σ[φ̂] = the same value, in radians', () => {
    expect(Math.abs(Math.sqrt(meanAndVariance(phases).variance) / predicted() - 1)).toBeLessThan(tolerance());
  });
  it('ε[γ̂²] = sqrt(2)(1 − γ²)/(|γ|·sqrt(n_d))', () => {
    const { mean, variance } = meanAndVariance(coherences);
    const eps = coherenceRandomError(new Float64Array([g2]), nd)[0];
    expect(Math.abs(Math.sqrt(variance) / g2 / eps - 1)).toBeLessThan(tolerance());
    expect(Math.abs(mean - g2)).toBeLessThan(0.01); // bias of γ̂² is O(1/n_d)
  });
  it('the 95 % bands cover the exact |H| and phase on 95 % of lines', () => {
    // Binomial standard error sqrt(0.95·0.05/C) = 0.23 %; tolerance 4 of them.
    const se = Math.sqrt((0.95 * 0.05) / magnitudes.length);
    expect(Math.abs(inside / magnitudes.length - 0.95)).toBeLessThan(4 * se);
    expect(Math.abs(insidePhase / phases.length - 0.95)).toBeLessThan(4 * se);
  });
});
