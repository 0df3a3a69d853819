/**
 * The what-if bench's computation (shared/ui/screens/what-if/what-if-run.ts) against published
 * and analytic results:
 * - no noise, periodic excitation whose period is the block, rectangular window: no leakage, so
 *   H1 = H2 = Hv = H and γ² = 1 (docs/engine.md check; exact synthesis);
 * - uncorrelated input noise of power ratio r = Gnn/Gxx biases H1 to |H|/(1 + r) and leaves H2
 *   unbiased; output noise leaves H1 unbiased (J. S. Bendat & A. G. Piersol, Random Data, 4th ed.,
 *   ch. 9, quoted from memory);
 * - a delay τ between the channels with a rectangular window of length T biases |Ĥ1| to about
 *   (1 − τ/T)·|H| (Bendat & Piersol, ch. 9, quoted from memory).
 * Medians over the band's lines, so that the few lines near a resonance (leakage) do not decide.
 */
import frameOutputNoise from '@/scenarios/frame-output-noise.json';
import { runWhatIf, type WhatIfSettings } from '@/shared/ui/screens/what-if/what-if-run';

const clock = () => 0;
const base: WhatIfSettings = {
  noise: 'none',
  snrDb: 10,
  delayMs: 0,
  blockLength: 4096,
  window: 'hann',
  estimator: 'H1',
  durationS: 128,
  seed: 1,
  toleranceDb: 1,
};

function median(values: Float64Array): number {
  const v = Array.from(values).filter(Number.isFinite).sort((a, b) => a - b);
  return v[Math.floor(v.length / 2)];
}

const dbOfRatio = (x: number) => 20 * Math.log10(x);
const magnitudeDb = (re: Float64Array, im: Float64Array, exact: { re: Float64Array; im: Float64Array }) =>
  Float64Array.from(re, (_, i) => dbOfRatio(Math.hypot(re[i], im[i]) / Math.hypot(exact.re[i], exact.im[i])));

describe('what-if bench computation', () => {
  test('periodic excitation, block = period, no noise: H1 = H2 = Hv = exact and γ² = 1', () => {
    const periodic = { ...frameOutputNoise, excitation: { kind: 'pseudo-random', band: { lowHz: 10, highHz: 150 }, periodS: 8, level: { rmsN: 20 } } };
    const r = runWhatIf(periodic, { ...base, window: 'rectangular', durationS: 64 }, clock);
    for (let i = 0; i < r.frequenciesHz.length; i++) {
      const h = Math.hypot(r.exact.re[i], r.exact.im[i]);
      expect(Math.hypot(r.h1.re[i] - r.exact.re[i], r.h1.im[i] - r.exact.im[i]) / h).toBeLessThan(1e-9);
      expect(Math.hypot(r.h2.re[i] - r.exact.re[i], r.h2.im[i] - r.exact.im[i]) / h).toBeLessThan(1e-9);
      expect(Math.hypot(r.hv.re[i] - r.exact.re[i], r.hv.im[i] - r.exact.im[i]) / h).toBeLessThan(1e-9);
      expect(r.coherence[i]).toBeGreaterThan(1 - 1e-9);
    }
    expect(r.summary.maxAbsMagnitudeDb).toBeLessThan(1e-7);
  });

  test('noise on the force at 10 dB SNR: H1 reads 20·log10(1/1.1) = −0.83 dB low, H2 stays unbiased', () => {
    const r = runWhatIf(frameOutputNoise, { ...base, noise: 'input', snrDb: 10 }, clock);
    expect(median(r.magnitudeErrorDb)).toBeCloseTo(dbOfRatio(1 / 1.1), 1); // within 0.05 dB
    expect(Math.abs(median(magnitudeDb(r.h2.re, r.h2.im, r.exact)))).toBeLessThan(0.1);
  });

  test('the same noise moved to the response: H1 unbiased as a complex ratio, H2 reads high', () => {
    const r = runWhatIf(frameOutputNoise, { ...base, noise: 'output', snrDb: 10 }, clock);
    // E[H1] = H with output noise: the mean of H1/H − 1 over the band's 1120 lines is near 0. (Its
    // magnitude in dB is not: where the response is far below the noise, |Ĥ1| carries the noise.)
    let re = 0;
    let im = 0;
    for (let i = 0; i < r.frequenciesHz.length; i++) {
      const d = r.exact.re[i] ** 2 + r.exact.im[i] ** 2;
      re += (r.h1.re[i] * r.exact.re[i] + r.h1.im[i] * r.exact.im[i]) / d - 1;
      im += (r.h1.im[i] * r.exact.re[i] - r.h1.re[i] * r.exact.im[i]) / d;
    }
    expect(Math.hypot(re, im) / r.frequenciesHz.length).toBeLessThan(0.05);
    // H2 = Gyy/Gxy = H·(1 + Gnn/Gvv): above |H| at every line; 10 dB over the band means the noise
    // power is at least a tenth of the response's at a typical (non-resonant) line.
    expect(median(magnitudeDb(r.h2.re, r.h2.im, r.exact))).toBeGreaterThan(dbOfRatio(1.1));
  });

  test('a 100 ms delay against a 1 s rectangular block: |H1| about (1 − τ/T) = 0.9, −0.92 dB', () => {
    const r = runWhatIf(frameOutputNoise, { ...base, noise: 'none', delayMs: 100, blockLength: 512, window: 'rectangular' }, clock);
    expect(median(r.magnitudeErrorDb)).toBeCloseTo(dbOfRatio(0.9), 1);
  });

  test('settings the engine refuses come back as its error', () => {
    expect(() => runWhatIf(frameOutputNoise, { ...base, blockLength: 1000 }, clock)).toThrow(/blockLength/);
  });
});
