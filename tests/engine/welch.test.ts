/**
 * Welch cross-spectra: SciPy golden vectors, Parseval, a sine peak, identities, Welch's overlap
 * variance formula by Monte Carlo, and every validation branch.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { accumulateCrossSpectra, effectiveAverages, welchCrossSpectra, type WelchOptions } from '@/shared/engine/welch';
import { overlapCorrelation, windowSamples } from '@/shared/engine/windows';
import { EngineInputError } from '@/shared/engine/errors';
import type { Detrend, SpectrumScaling, WindowName } from '@/shared/engine/types';
import {
  gaussianNoise,
  loadScipyFixture,
  scipyCases,
  spectraForCase,
  type ScipyFile,
  maxComplexRelativeDifference,
  maxRelativeDifference,
  meanAndVariance,
  scipySignals,
  SCIPY_FILES,
} from './spectra-helpers';

const TOLERANCE = 1e-10; // docs/engine.md: agree with SciPy to ≤ 1e-10 relative

describe('Welch spectra against SciPy welch / csd / coherence', () => {
  // Source: SciPy scipy.signal.welch, csd, coherence; fixtures and their seed/version from
  // tests/fixtures/scipy/make-fixtures.py. scipy csd(x, y) = mean conj(X)·Y = our Gyx.
  it("every fixture was made by the repository's script, in one run, with its seed and sample rate", () => {
    // The constants of tests/fixtures/scipy/make-fixtures.py, read from the script itself: a
    // fixture left over from another seed, rate or script version fails here.
    const script = readFileSync(join(__dirname, '..', 'fixtures', 'scipy', 'make-fixtures.py'), 'utf8');
    const constant = (name: string) => Number(new RegExp(`^${name} = ([0-9.]+)$`, 'm').exec(script)![1]);
    const [seed, sampleRateHz, samples] = [constant('SEED'), constant('FS'), constant('SAMPLES')];
    const signals = loadScipyFixture<ScipyFile & { generator: string; sampleRateHz: number; x: string[]; y: string[] }>('signals.json');
    expect(signals.x).toHaveLength(samples);
    expect(signals.y).toHaveLength(samples);
    for (const name of ['signals.json', 'windows.json', ...SCIPY_FILES]) {
      const f = loadScipyFixture<ScipyFile & { generator: string; sampleRateHz: number }>(name);
      expect({ name, generator: f.generator, seed: f.seed, sampleRateHz: f.sampleRateHz, scipy: f.scipy }).toEqual({
        name,
        generator: 'tests/fixtures/scipy/make-fixtures.py',
        seed,
        sampleRateHz,
        scipy: signals.scipy,
      });
    }
    // Welch's block count for the stored signal length (scipy.signal.welch: (n − N)/(N − overlap) + 1).
    for (const [, c] of scipyCases()) {
      const step = c.options.blockLength - Math.round(c.options.overlap * c.options.blockLength);
      expect(c.blocks).toBe(Math.floor((samples - c.options.blockLength) / step) + 1);
    }
  });

  it('a stored SciPy value is recomputed from the stored samples by a plain DFT', () => {
    // Independent of the engine: rectangular window, N = 256, 50 % overlap, no detrend, density.
    // One-sided PSD at an interior line k: Gxx[k] = 2/(fs·N) · mean over blocks of |Σ x[n]·e^(−2πikn/N)|²
    // (scipy.signal.welch with window='boxcar', scaling='density'; Σw² = N for the boxcar).
    const c = loadScipyFixture<ScipyFile>('welch-windows.json').cases.find((k) => k.options.window === 'rectangular')!;
    expect(c.options).toMatchObject({ blockLength: 256, overlap: 0.5, detrend: 'none', scaling: 'density', signals: 'plain' });
    const { x, sampleRateHz } = scipySignals();
    const n = 256;
    for (const k of [7, 31, 100]) {
      let sum = 0;
      let blocks = 0;
      for (let start = 0; start + n <= x.length; start += n / 2) {
        let re = 0;
        let im = 0;
        for (let i = 0; i < n; i++) {
          re += x[start + i] * Math.cos((2 * Math.PI * k * i) / n);
          im -= x[start + i] * Math.sin((2 * Math.PI * k * i) / n);
        }
        sum += re * re + im * im;
        blocks++;
      }
      expect(blocks).toBe(c.blocks);
      expect(c.frequenciesHz[k]).toBe((k * sampleRateHz) / n);
      const gxx = (2 / (sampleRateHz * n)) * (sum / blocks);
      expect(Math.abs(gxx / c.gxx[k] - 1)).toBeLessThan(1e-9);
    }
  });
  it.each(scipyCases())('%s', (_label, c) => {
    const s = spectraForCase(c);
    expect(s.blocks).toBe(c.blocks);
    expect(maxRelativeDifference(s.frequenciesHz, c.frequenciesHz)).toBeLessThanOrEqual(TOLERANCE);
    expect(maxRelativeDifference(s.gxx, c.gxx)).toBeLessThanOrEqual(TOLERANCE);
    expect(maxRelativeDifference(s.gyy, c.gyy)).toBeLessThanOrEqual(TOLERANCE);
    expect(maxComplexRelativeDifference(s.gyx.re, s.gyx.im, c.gyxRe, c.gyxIm)).toBeLessThanOrEqual(TOLERANCE);
  });
});

describe('analytic truths', () => {
  it("Parseval: white noise of variance σ² has one-sided PSD 2σ²/fs", () => {
    // Parseval's theorem. Averaged over 0 < f < fs/2 the estimate's mean is exactly unbiased for
    // white noise; its relative scatter over M lines of n_d averages is ~1/sqrt(M·n_d).
    const sigma = 0.7;
    const fs = 2000;
    const x = gaussianNoise('parseval', 1 << 16, sigma);
    const s = welchCrossSpectra(x, x, { sampleRateHz: fs, blockLength: 512, window: 'hann', overlap: 0.5, detrend: 'none', scaling: 'density' });
    const interior = s.gxx.slice(1, -1);
    const { mean } = meanAndVariance(interior);
    const expected = (2 * sigma * sigma) / fs;
    // ±5 standard errors of the line mean (n_d ≈ 240, 255 lines; Hann lines correlate, so allow 2x).
    const standardError = 2 / Math.sqrt(interior.length * s.effectiveAverages);
    expect(Math.abs(mean / expected - 1)).toBeLessThan(5 * standardError);
  });

  it('Parseval, exactly: with a rectangular window Σ_k Gxx[k]·Δf equals the mean square', () => {
    // Parseval for one block: Σ_n x² = (1/N) Σ_k |X[k]|²; the one-sided density sums back to it.
    const x = gaussianNoise('parseval-exact', 1024);
    const s = welchCrossSpectra(x, x, { sampleRateHz: 100, blockLength: 1024, window: 'rectangular', overlap: 0, detrend: 'none', scaling: 'density' });
    const total = s.gxx.reduce((a, v) => a + v, 0) * (100 / 1024);
    const meanSquare = x.reduce((a, v) => a + v * v, 0) / x.length;
    expect(total).toBeCloseTo(meanSquare, 12);
  });

  it.each(['rectangular', 'hann', 'flattop', 'blackman-harris'] as WindowName[])(
    "sine of amplitude A on a line: 'spectrum' scaling peaks at A²/2 (%s)",
    (window) => {
      // Analytic: a window's transform at the tone's own line is A/2·Σw, so (A/2·Σw)²/(Σw)²·2 = A²/2.
      const n = 256;
      const fs = 1024;
      const amplitude = 2.5;
      const line = 40;
      const x = new Float64Array(8 * n).map((_, i) => amplitude * Math.sin((2 * Math.PI * line * i) / n + 0.3));
      const s = welchCrossSpectra(x, x, { sampleRateHz: fs, blockLength: n, window, overlap: 0.5, detrend: 'none', scaling: 'spectrum' });
      expect(s.frequenciesHz[line]).toBe((line * fs) / n);
      expect(s.gxx[line]).toBeCloseTo((amplitude * amplitude) / 2, 10);
    },
  );
});

describe('identities', () => {
  const { x, y, sampleRateHz } = scipySignals();
  const o: WelchOptions = { sampleRateHz, blockLength: 256, window: 'hamming', overlap: 0.75, detrend: 'linear', scaling: 'density' };
  it('welch(x) = csd(x, x): Gyx of (x, x) is Gxx, real', () => {
    const s = welchCrossSpectra(x, x, o);
    expect(maxRelativeDifference(s.gyx.re, s.gxx)).toBeLessThan(1e-15);
    // Two-for-one packing separates X and Y by different sums, so Im is zero only to rounding.
    expect(s.gyx.im.every((v, k) => Math.abs(v) <= 1e-15 * s.gxx[k])).toBe(true);
    expect(maxRelativeDifference(s.gyy, s.gxx)).toBeLessThan(1e-14);
  });
  it('swapping channels conjugates Gyx', () => {
    const a = welchCrossSpectra(x, y, o);
    const b = welchCrossSpectra(y, x, o);
    expect(maxComplexRelativeDifference(b.gyx.re, b.gyx.im.map((v) => -v), a.gyx.re, a.gyx.im)).toBeLessThan(1e-13);
  });
  it('a channel 1e-7 times the other keeps its precision in the shared FFT', () => {
    // Its spectrum packed beside a large channel must equal its spectrum packed beside itself.
    const small = y.map((v) => 1e-7 * v);
    const paired = welchCrossSpectra(x, small, o);
    const alone = welchCrossSpectra(small, small, o);
    expect(maxRelativeDifference(paired.gyy, alone.gxx)).toBeLessThan(1e-13);
  });
  it('averages = K equals the first K blocks of the record', () => {
    const a = welchCrossSpectra(x, y, { ...o, averages: 10 });
    const b = welchCrossSpectra(x.slice(0, 256 + 9 * 64), y.slice(0, 256 + 9 * 64), o);
    expect(a.blocks).toBe(10);
    expect(b.blocks).toBe(10);
    expect(maxRelativeDifference(a.gxx, b.gxx)).toBe(0);
  });
});

describe("Welch's overlap correction", () => {
  it('effective averages follow K/[1 + 2 Σ (1 − j/K) c(j)²] (hand-computed for Hann 50 %)', () => {
    // P. D. Welch 1967. Hann at 50 % overlap: c(1) = 1/6, c(j ≥ 2) = 0.
    const w = windowSamples('hann', 256);
    expect(overlapCorrelation(w, 128)).toBeCloseTo(1 / 6, 12);
    expect(effectiveAverages(w, 128, 32)).toBeCloseTo(32 / (1 + 2 * (31 / 32) * (1 / 36)), 10);
    expect(effectiveAverages(w, 256, 32)).toBe(32);
  });

  it('Monte Carlo: variance of Gxx for Hann 50 % matches 1/n_eff, not 1/K', () => {
    // White Gaussian noise, N = 256, K = 32 blocks at 50 % overlap, 1500 records. Lines 3 apart are
    // uncorrelated for the periodic Hann window (its squared window has only 3 Fourier terms), so
    // every 3rd interior line is an independent sample of Gxx/E[Gxx]. The sampling error of a
    // variance from C near-Gaussian samples is sqrt(2/C) relative; allow 4 of them.
    const n = 256;
    const blocks = 32;
    const length = n + (blocks - 1) * (n / 2);
    const ratios: number[] = [];
    let neff = 0;
    for (let seed = 0; seed < 1500; seed++) {
      const x = gaussianNoise(`welch-mc-${seed}`, length);
      const s = welchCrossSpectra(x, x, { sampleRateHz: 1, blockLength: n, window: 'hann', overlap: 0.5, detrend: 'none', scaling: 'density' });
      neff = s.effectiveAverages;
      for (let k = 3; k < n / 2; k += 3) ratios.push(s.gxx[k] / 2); // E[Gxx] = 2σ²/fs = 2
    }
    const { variance } = meanAndVariance(ratios);
    const tolerance = 4 * Math.sqrt(2 / ratios.length);
    expect(s_round(neff)).toBe(s_round(32 / 1.0538194444444444));
    expect(Math.abs(variance * neff - 1)).toBeLessThan(tolerance);
    // The uncorrected count K would predict a variance 5.4 % lower: the test can tell them apart.
    expect(Math.abs(variance * blocks - 1)).toBeGreaterThan(tolerance);
  });
});

function s_round(v: number): number {
  return Math.round(v * 1e9) / 1e9;
}

describe('warnings', () => {
  const x = gaussianNoise('warn', 2048);
  const base: WelchOptions = { sampleRateHz: 1, blockLength: 256, window: 'hann', overlap: 0.5, detrend: 'none', scaling: 'density' };
  it('asks for more averages than the record holds: uses what is there and says so', () => {
    const s = welchCrossSpectra(x, x, { ...base, averages: 40 });
    expect(s.blocks).toBe(15);
    expect(s.warnings.join()).toMatch(/averages=40 .* only 15 blocks/);
  });
  it('an overlap that is not a whole number of samples is rounded, with a warning', () => {
    const s = welchCrossSpectra(x, x, { ...base, overlap: 0.3 });
    expect(s.warnings.join()).toMatch(/rounded to 77 samples/);
  });
  it('no warnings for a plain request', () => {
    expect(welchCrossSpectra(x, x, base).warnings).toEqual([]);
  });
});

describe('validation', () => {
  const x = gaussianNoise('valid', 1024);
  const base: WelchOptions = { sampleRateHz: 1, blockLength: 256, window: 'hann', overlap: 0.5, detrend: 'none', scaling: 'density' };
  const withNaN = x.slice();
  withNaN[17] = NaN;
  const withInf = x.slice();
  withInf[3] = Infinity;
  const hannBlock = windowSamples('hann', 256);
  const blockOptions = {
    sampleRateHz: 1,
    blockStarts: [0],
    inputWindow: hannBlock,
    outputWindow: hannBlock,
    scaleWindow: hannBlock,
    detrend: 'none' as const,
    scaling: 'density' as const,
  };
  it.each<[string, () => unknown]>([
    ['y.length', () => welchCrossSpectra(x, x.slice(1), base)],
    ['x', () => welchCrossSpectra([1, 2] as unknown as Float64Array, x, base)],
    ['x[17]', () => welchCrossSpectra(withNaN, x, base)],
    ['y[3]', () => welchCrossSpectra(x, withInf, base)],
    ['x[3]', () => welchCrossSpectra(withInf.map((v, i) => (i === 9 ? NaN : v)), x, base)],
    ['x[2]', () => welchCrossSpectra(x.map((v, i) => (i === 2 ? -Infinity : v)), x, base)],
    ['sampleRateHz', () => welchCrossSpectra(x, x, { ...base, sampleRateHz: 0 })],
    ['sampleRateHz', () => welchCrossSpectra(x, x, { ...base, sampleRateHz: NaN })],
    ['blockLength', () => welchCrossSpectra(x, x, { ...base, blockLength: 300 })],
    ['blockLength', () => welchCrossSpectra(x, x, { ...base, blockLength: 2 })],
    ['blockLength', () => welchCrossSpectra(x, x, { ...base, blockLength: 2048 })],
    ['overlap', () => welchCrossSpectra(x, x, { ...base, overlap: 1 })],
    ['overlap', () => welchCrossSpectra(x, x, { ...base, overlap: -0.1 })],
    ['overlap', () => welchCrossSpectra(x, x, { ...base, overlap: NaN })],
    ['overlap', () => welchCrossSpectra(x, x, { ...base, blockLength: 4, overlap: 0.9 })],
    ['averages', () => welchCrossSpectra(x, x, { ...base, averages: 0 })],
    ['averages', () => welchCrossSpectra(x, x, { ...base, averages: 2.5 })],
    ['window', () => welchCrossSpectra(x, x, { ...base, window: 'gauss' as WindowName })],
    ['windowParams.kaiserBeta', () => welchCrossSpectra(x, x, { ...base, window: 'kaiser' })],
    ['detrend', () => welchCrossSpectra(x, x, { ...base, detrend: 'quadratic' as Detrend })],
    ['scaling', () => welchCrossSpectra(x, x, { ...base, scaling: 'power' as SpectrumScaling })],
    // accumulateCrossSpectra, the block loop shared with transient processing
    ['blockStarts[1]', () => accumulateCrossSpectra(x, x, { ...blockOptions, blockStarts: [0, 900] })],
    ['blockStarts[0]', () => accumulateCrossSpectra(x, x, { ...blockOptions, blockStarts: [1.5] })],
    ['blocks', () => accumulateCrossSpectra(x, x, { ...blockOptions, blockStarts: [] })],
    ['outputWindow.length', () => accumulateCrossSpectra(x, x, { ...blockOptions, outputWindow: new Float64Array(128) })],
    ['scaleWindow.length', () => accumulateCrossSpectra(x, x, { ...blockOptions, scaleWindow: new Float64Array(128) })],
    ['y.length', () => accumulateCrossSpectra(x, x.slice(2), blockOptions)],
  ])('throws EngineInputError naming %s', (field, call) => {
    let error: unknown;
    try {
      call();
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(EngineInputError);
    expect((error as EngineInputError).field).toBe(field);
    expect((error as Error).message.startsWith(`${field}=`)).toBe(true);
  });
});
