/**
 * processRecord: recipe applied end to end on records with known answers (stationary and impact),
 * the chosen estimator, band lines, confidence bands, warnings and the validation branches.
 */
import { processRecord, type TwoChannelRecord } from '@/shared/engine/process';
import { parseRecipe, type Recipe } from '@/shared/engine/recipe';
import { welchCrossSpectra } from '@/shared/engine/welch';
import { EngineInputError } from '@/shared/engine/errors';
import { gaussianNoise, maxComplexRelativeDifference } from './spectra-helpers';

const BASE = {
  name: 'Harbor Ridge drone arm, random',
  blockLength: 512,
  window: 'hann',
  overlap: 0.5,
  detrend: 'none',
  estimator: 'H1',
  band: { lowHz: 20, highHz: 400 },
  scaling: 'density',
  tolerances: { magnitudeDb: 0.5 },
} as const;

function noisyGain(a: number, noise: number, n = 16384): TwoChannelRecord {
  const input = gaussianNoise('proc-x', n);
  const e = gaussianNoise('proc-e', n, noise);
  return { sampleRateHz: 1024, input, output: input.map((v, i) => a * v + e[i]) };
}

describe('stationary records', () => {
  const record = noisyGain(3, 0.5);
  it.each(['H1', 'H2', 'Hv'] as const)('chosen = the recipe estimator (%s); spectra are Welch’s', (estimator) => {
    const p = processRecord(record, parseRecipe({ ...BASE, estimator }));
    const key = ({ H1: 'h1', H2: 'h2', Hv: 'hv' } as const)[estimator];
    expect(p.chosen).toBe(p.estimate[key]);
    const direct = welchCrossSpectra(record.input, record.output, { sampleRateHz: 1024, blockLength: 512, window: 'hann', overlap: 0.5, detrend: 'none', scaling: 'density' });
    expect(p.spectra.gxx).toEqual(direct.gxx);
    expect(p.frequenciesHz).toBe(p.spectra.frequenciesHz);
    expect(p.bandIndices).toEqual({ start: 10, end: 201 }); // Δf = 2 Hz: 20 Hz .. 400 Hz
    expect(p.addedDampingRatio).toBeUndefined();
    expect(p.warnings).toEqual([]);
  });
  it('95 % band brackets |chosen| and has the half-width 1.96·ε·|H|', () => {
    const p = processRecord(record, parseRecipe(BASE));
    for (let k = p.bandIndices.start; k < p.bandIndices.end; k++) {
      const m = Math.hypot(p.chosen.re[k], p.chosen.im[k]);
      expect(p.confidence95.magnitudeLow[k]).toBeLessThan(m);
      expect(p.confidence95.magnitudeHigh[k]).toBeGreaterThan(m);
      expect(p.confidence95.magnitudeHigh[k] - m).toBeCloseTo(1.959963984540054 * p.estimate.randomError.magnitude[k] * m, 12);
      expect(p.confidence95.phaseHalfWidthRad[k]).toBeCloseTo(1.959963984540054 * p.estimate.randomError.phaseRad[k], 12);
    }
  });
  it('reports adjustments as warnings (frequency resolution, averages)', () => {
    const { blockLength: _b, ...rest } = BASE;
    const p = processRecord(record, parseRecipe({ ...rest, frequencyResolutionHz: 1.5, averages: 500 }));
    expect(p.spectra.blocks).toBe(31);
    expect(p.warnings.join('\n')).toMatch(/resolved to blockLength=1024[\s\S]*averages=500/);
  });
  it('hvWeight reaches the Hv estimate', () => {
    const a = processRecord(record, parseRecipe({ ...BASE, estimator: 'Hv', hvWeight: 1e9 }));
    expect(maxComplexRelativeDifference(a.chosen.re, a.chosen.im, a.estimate.h1.re, a.estimate.h1.im)).toBeLessThan(1e-6);
  });
});

describe('transient records: force + exponential windows on an impact', () => {
  // A discrete resonator h[m] = r^m cos(θm) (f_n = 50 Hz, ζ = 1 %) struck once by an impulse of
  // 5 N at sample q. With the trigger at the impulse, the force window passes it unchanged and the
  // exponential window multiplies the response by exp(−m/(fs·τ)), so exactly
  //   H1[k] = Σ_{m=0}^{N−p−1} (r·e^{−1/(fs·τ)})^m cos(θm) e^{−2πi k m/N}      (analytic)
  const fs = 1024;
  const n = 4096;
  const fn = 50;
  const zeta = 0.01;
  const r = Math.exp((-2 * Math.PI * fn * zeta) / fs);
  const theta = (2 * Math.PI * fn * Math.sqrt(1 - zeta * zeta)) / fs;
  const q = 300;
  const input = new Float64Array(3 * n);
  const output = new Float64Array(3 * n);
  input[q] = 5;
  for (let i = q; i < output.length; i++) output[i] = 5 * r ** (i - q) * Math.cos(theta * (i - q));
  const recipe: Recipe = parseRecipe({
    ...BASE,
    blockLength: n,
    window: 'rectangular',
    overlap: 0,
    band: { lowHz: 10, highHz: 200 },
    transient: { forceWindowFraction: 0.02, exponentialDecayFraction: 0.1, triggerLevelFraction: 0.5, pretriggerFraction: 0.01 },
  });
  const p = processRecord({ sampleRateHz: fs, input, output }, recipe);
  const tau = 0.1 * (n / fs);

  it('one triggered block; τ = exponentialDecayFraction·T', () => {
    expect(p.spectra.blocks).toBe(1);
    expect(p.exponentialTauS).toBeCloseTo(tau, 15);
    expect(p.warnings).toEqual([]);
  });
  it('H1 equals the analytic transform of the windowed impulse response', () => {
    // cos(θm) = (e^{iθm} + e^{−iθm})/2 turns the sum into two finite geometric series:
    // H1[k] = ½ Σ_± (1 − q±^M)/(1 − q±), q± = ρ·e^{i(±θ − ω_k)}, ρ = r·e^{−1/(fs·τ)}, M = N − p.
    const pre = Math.round(0.01 * n);
    const rho = r * Math.exp(-1 / (fs * tau));
    const terms = n - pre;
    const lines = n / 2 + 1;
    const re = new Float64Array(lines);
    const im = new Float64Array(lines);
    for (let k = 0; k < lines; k++) {
      const omega = (2 * Math.PI * k) / n;
      for (const phi of [theta - omega, -theta - omega]) {
        const qRe = rho * Math.cos(phi);
        const qIm = rho * Math.sin(phi);
        const qmAbs = rho ** terms;
        const numRe = 1 - qmAbs * Math.cos(terms * phi);
        const numIm = -qmAbs * Math.sin(terms * phi);
        const denRe = 1 - qRe;
        const denIm = -qIm;
        const den = denRe * denRe + denIm * denIm;
        re[k] += (0.5 * (numRe * denRe + numIm * denIm)) / den;
        im[k] += (0.5 * (numIm * denRe - numRe * denIm)) / den;
      }
    }
    expect(maxComplexRelativeDifference(p.estimate.h1.re, p.estimate.h1.im, re, im, 0)).toBeLessThan(1e-10);
  });
  it('half-power damping of |H1| is ζ + ζ_add, ζ_add = 1/(ω_n·τ) (common practice, quoted from memory)', () => {
    // Half-power bandwidth ≈ 2ζf_n (standard vibration textbook result), read with linear
    // interpolation at 0.25 Hz line spacing on a 1.8 Hz bandwidth: allow 2 %.
    const mag = p.chosen.re.map((v, k) => Math.hypot(v, p.chosen.im[k]));
    let peak = 1;
    for (let k = 1; k < mag.length; k++) if (mag[k] > mag[peak]) peak = k;
    const half = mag[peak] / Math.SQRT2;
    let lo = peak;
    while (mag[lo] > half) lo--;
    let hi = peak;
    while (mag[hi] > half) hi++;
    const df = fs / n;
    const f1 = (lo + (half - mag[lo]) / (mag[lo + 1] - mag[lo])) * df;
    const f2 = (hi - 1 + (mag[hi - 1] - half) / (mag[hi - 1] - mag[hi])) * df;
    const estimated = (f2 - f1) / (2 * fn);
    const predicted = zeta + p.addedDampingRatio!(fn);
    expect(p.addedDampingRatio!(fn)).toBeCloseTo(1 / (2 * Math.PI * fn * tau), 15);
    expect(Math.abs(estimated / predicted - 1)).toBeLessThan(0.02);
  });
  it('input noise after the force window does not reach the estimate', () => {
    const noisy = input.slice();
    const noise = gaussianNoise('after-force', noisy.length, 0.2);
    for (let i = q + 200; i < noisy.length; i++) noisy[i] += noise[i]; // the force window (82 + 10 taper samples) ends 51 samples after the hit
    const b = processRecord({ sampleRateHz: fs, input: noisy, output }, recipe);
    expect(b.estimate.h1.re).toEqual(p.estimate.h1.re);
    expect(b.estimate.h1.im).toEqual(p.estimate.h1.im);
  });
});

describe('validation', () => {
  const record = noisyGain(1, 0.1, 4096);
  const recipe = parseRecipe(BASE);
  const withNaN = record.input.slice();
  withNaN[5] = NaN;
  it.each<[string, () => unknown]>([
    ['record.input[5]', () => processRecord({ ...record, input: withNaN }, recipe)],
    ['record.output[0]', () => processRecord({ ...record, output: new Float64Array(4096).fill(Infinity) }, recipe)],
    ['record.output.length', () => processRecord({ ...record, output: record.output.slice(1) }, recipe)],
    ['record.input', () => processRecord({ ...record, input: [] as unknown as Float64Array }, recipe)],
    ['record.output', () => processRecord({ ...record, output: null as unknown as Float64Array }, recipe)],
    ['record.sampleRateHz', () => processRecord({ ...record, sampleRateHz: -1 }, recipe)],
    ['record.sampleRateHz', () => processRecord({ ...record, sampleRateHz: NaN }, recipe)],
    ['overlap', () => processRecord(record, { ...recipe, overlap: 1 })],
    ['blockLength', () => processRecord(record, { ...recipe, blockLength: 8192 })],
    ['band.highHz', () => processRecord(record, { ...recipe, band: { lowHz: 0, highHz: 600 } })],
    ['transient.triggerLevelFraction', () => processRecord(record, { ...recipe, blockLength: 4096, transient: { forceWindowFraction: 0.1, exponentialDecayFraction: 1, triggerLevelFraction: 1, pretriggerFraction: 0 } })],
  ])('throws EngineInputError naming %s', (field, call) => {
    let error: unknown;
    try {
      call();
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(EngineInputError);
    expect((error as EngineInputError).field).toBe(field);
  });
});
