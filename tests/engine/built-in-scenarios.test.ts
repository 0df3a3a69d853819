/**
 * Each built-in scenario (scenarios/*.json) shows the one mechanism it is built to isolate, by the
 * numbers its `expectation` states. Checks compare against published formulas or analytic
 * results, named beside each; "control" runs are the same scenario and seed with the error
 * sources off (same force samples), so a ratio to the control isolates the mechanism.
 */
import { join } from 'node:path';
import { buildSystem } from '@/shared/engine/systems';
import { parseRecipe } from '@/shared/engine/recipe';
import { parseScenario, simulateScenario } from '@/shared/engine/scenario';
import { exactModeReferences, modeErrors } from '@/shared/engine/scores/modes';
import { scoreFrf } from '@/shared/engine/scores/line-scores';
import {
  RECIPES_DIR,
  SCENARIOS_DIR,
  dB,
  jsonFiles,
  linesIn,
  loadRecipe,
  loadScenario,
  magnitude,
  mean,
  meanSquare,
  nearestLine,
  processOnce,
  readJson,
  runOnce,
  testRecipe,
  withoutErrors,
} from './built-in-helpers';

jest.setTimeout(60_000);

describe('the built-in suite', () => {
  it('holds at least twelve scenarios and two recipes, each valid, named and explained', () => {
    const scenarios = jsonFiles(SCENARIOS_DIR);
    const recipes = jsonFiles(RECIPES_DIR);
    expect(scenarios.length).toBeGreaterThanOrEqual(12);
    expect(recipes.length).toBeGreaterThanOrEqual(2);
    const names = new Set<string>();
    for (const file of scenarios) {
      const s = parseScenario(readJson(join(SCENARIOS_DIR, file)));
      expect(s.description).toContain('Harbor Ridge Test Lab');
      expect((s.expectation ?? '').length).toBeGreaterThan(80);
      names.add(s.name);
    }
    expect(names.size).toBe(scenarios.length);
    for (const file of recipes) expect(parseRecipe(readJson(join(RECIPES_DIR, file))).name.length).toBeGreaterThan(0);
  });
});

const FRAME_SURVEY = testRecipe({ blockLength: 4096 }); // 0.125 Hz at 512 Hz, Hann 50 %
const SEEDS = [1, 2, 3, 4];

/** |Ĥ1| and |Ĥ2| of noisy runs over their control runs at given frequencies, over seeds. */
function noisyAgainstControl(name: string, atHz: number[], seeds = SEEDS): { h1: number[]; h2: number[] } {
  const scenario = loadScenario(name);
  const control = withoutErrors(scenario);
  const h1: number[] = [];
  const h2: number[] = [];
  for (const seed of seeds) {
    const noisy = runOnce(scenario, seed, FRAME_SURVEY).processed;
    const clean = runOnce(control, seed, FRAME_SURVEY).processed;
    for (const hz of atHz) {
      const k = nearestLine(noisy.frequenciesHz, hz);
      h1.push(magnitude(noisy.estimate.h1, k) / magnitude(clean.estimate.h1, k));
      h2.push(magnitude(noisy.estimate.h2, k) / magnitude(clean.estimate.h2, k));
    }
  }
  return { h1, h2 };
}

describe('frame: uncorrelated noise on one channel or both', () => {
  const frame = buildSystem(loadScenario('frame-output-noise').system);
  const resonancesHz = frame.modes.map((m) => m.naturalFrequencyHz);
  const antiResonancesHz = frame.antiResonancesHz;

  it('output noise: H1 holds, H2 reads high at the anti-resonances by 1 + Gnn/Gvv', () => {
    const scenario = loadScenario('frame-output-noise');
    const band = 140; // excitation band 10–150 Hz, where the SNR is defined
    const h1 = antiResonancesHz.map(() => [] as number[]);
    const h2 = antiResonancesHz.map(() => [] as number[]);
    const predicted = antiResonancesHz.map(() => [] as number[]);
    const h1AtResonances: number[] = [];
    for (const seed of SEEDS) {
      const { processed, exact } = runOnce(scenario, seed, FRAME_SURVEY);
      const clean = processOnce(simulateScenario(withoutErrors(scenario), seed), FRAME_SURVEY);
      // Output noise of in-band power P_y·10^(−SNR/10), white: Gnn = that / B. Input flat:
      // Gxx = P_x / B. H2 = H·(1 + Gnn/Gvv), Gvv = |H|²·Gxx (Bendat & Piersol, Random Data, 4th ed., 2010).
      const gnn = (meanSquare(clean.record.output) * 10 ** (-20 / 10)) / band;
      const gxx = meanSquare(clean.record.input) / band;
      antiResonancesHz.forEach((hz, a) => {
        const k = nearestLine(processed.frequenciesHz, hz);
        h1[a]!.push(magnitude(processed.estimate.h1, k) / magnitude(exact, k));
        h2[a]!.push(magnitude(processed.estimate.h2, k) / magnitude(exact, k));
        predicted[a]!.push(1 + gnn / (magnitude(exact, k) ** 2 * gxx));
      });
      for (const hz of resonancesHz) {
        const k = nearestLine(processed.frequenciesHz, hz);
        h1AtResonances.push(magnitude(processed.estimate.h1, k) / magnitude(clean.processed.estimate.h1, k));
      }
    }
    antiResonancesHz.forEach((_, a) => {
      expect(mean(h2[a]!)).toBeGreaterThan(mean(h1[a]!) + 0.3);
      expect(Math.abs(mean(h2[a]!) / mean(predicted[a]!) - 1)).toBeLessThan(0.2);
      // H1 is unbiased by output noise; its scatter at a coherence near 0.5 is ±15 % per seed.
      expect(Math.abs(mean(h1[a]!) - 1)).toBeLessThan(0.15);
    });
    // At the resonances the output SNR is high: H1 equals the noise-free H1 within 1 %.
    for (const r of h1AtResonances) expect(Math.abs(r - 1)).toBeLessThan(0.01);
  });

  it('input noise: H1 reads low by 1/(1 + N/S) at the resonances, H2 holds', () => {
    // Input SNR 10 dB, flat force and white noise: E[H1] = H·Guu/(Guu + Gmm) = H/(1 + 10^(−1))
    // at every line (Bendat & Piersol, Random Data, 4th ed., 2010).
    const { h1, h2 } = noisyAgainstControl('frame-input-noise', resonancesHz);
    expect(Math.abs(mean(h1) - 1 / 1.1)).toBeLessThan(0.02);
    expect(Math.abs(mean(h2) - 1)).toBeLessThan(0.04);
  });

  it('noise on both channels: H1 low, H2 high, Hv between them and close to H with the true noise ratio', () => {
    const scenario = loadScenario('frame-both-noise');
    const control = withoutErrors(scenario);
    const h1AtResonances: number[] = [];
    const h2AtAnti: number[] = [];
    const hvAtAnti: number[] = [];
    for (const seed of [1, 2, 3]) {
      const clean = simulateScenario(control, seed);
      // κ = output- over input-noise power: (P_y·10^(−2)) / (P_x·10^(−1.5)) over the same band.
      const kappa = (meanSquare(clean.output) * 10 ** -2) / (meanSquare(clean.input) * 10 ** -1.5);
      const noisy = runOnce(scenario, seed, testRecipe({ blockLength: 4096, estimator: 'Hv', hvWeight: kappa })).processed;
      const reference = processOnce(clean, FRAME_SURVEY).processed;
      const { h1, h2, hv } = noisy.estimate;
      // docs/engine.md: with noise, |H1| ≤ |Hv| ≤ |H2| at every line.
      for (let k = noisy.bandIndices.start; k < noisy.bandIndices.end; k++) {
        expect(magnitude(h1, k)).toBeLessThanOrEqual(magnitude(hv, k) * (1 + 1e-12));
        expect(magnitude(hv, k)).toBeLessThanOrEqual(magnitude(h2, k) * (1 + 1e-12));
      }
      for (const hz of resonancesHz) {
        const k = nearestLine(noisy.frequenciesHz, hz);
        h1AtResonances.push(magnitude(h1, k) / magnitude(reference.estimate.h1, k));
      }
      for (const hz of antiResonancesHz) {
        const k = nearestLine(noisy.frequenciesHz, hz);
        h2AtAnti.push(magnitude(h2, k) / magnitude(reference.estimate.h2, k));
        hvAtAnti.push(magnitude(hv, k) / magnitude(reference.estimate.h1, k));
      }
    }
    // Input SNR 15 dB: H1 low by 1/(1 + 10^(−1.5)) = 0.969 (Bendat & Piersol, Random Data).
    expect(Math.abs(mean(h1AtResonances) - 1 / (1 + 10 ** -1.5))).toBeLessThan(0.02);
    expect(mean(h2AtAnti)).toBeGreaterThan(1.3);
    // Hv weighted by the true noise ratio is the total-least-squares estimate, consistent when
    // the ratio is known (errors-in-variables regression, e.g. S. Van Huffel & J. Vandewalle,
    // The Total Least Squares Problem, SIAM 1991; from memory).
    expect(Math.abs(mean(hvAtAnti) - 1)).toBeLessThan(0.15);
  });
});

describe('frame: leakage with random excitation, rectangular against Hann', () => {
  it('the rectangular window floods the anti-resonances and the lines between; Hann keeps them', () => {
    // Side lobes: rectangular −13 dB falling 6 dB/octave, Hann −31 dB falling 18 dB/octave
    // (F. J. Harris, Proc. IEEE 66(1), 1978): resonance power leaks far with the first.
    const scenario = loadScenario('frame-leakage-random');
    const antiResonancesHz = buildSystem(scenario.system).antiResonancesHz;
    const figures = (window: 'rectangular' | 'hann') => {
      const recipe = testRecipe({ blockLength: 4096, window, overlap: window === 'hann' ? 0.5 : 0, band: { lowHz: 20, highHz: 120 } });
      const errorsDb: number[] = [];
      const coherenceAtAnti: number[] = [];
      const bandCoherence: number[] = [];
      for (const seed of [1, 2]) {
        const { processed, exact } = runOnce(scenario, seed, recipe);
        for (const hz of antiResonancesHz) {
          coherenceAtAnti.push(processed.estimate.coherence[nearestLine(processed.frequenciesHz, hz)]!);
        }
        const { start, end } = processed.bandIndices;
        for (let k = start; k < end; k++) errorsDb.push(Math.abs(dB(magnitude(processed.estimate.h1, k) / magnitude(exact, k))));
        bandCoherence.push(mean(Array.from(processed.estimate.coherence.slice(start, end))));
      }
      return { errorDb: mean(errorsDb), coherenceAtAnti: mean(coherenceAtAnti), bandCoherence: mean(bandCoherence) };
    };
    const rectangular = figures('rectangular');
    const hann = figures('hann');
    // Mean |magnitude error| over the band's lines (per line it scatters ±1–2 dB with rectangular).
    expect(rectangular.errorDb).toBeGreaterThan(0.2);
    expect(hann.errorDb).toBeLessThan(0.05);
    expect(rectangular.errorDb).toBeGreaterThan(5 * hann.errorDb);
    expect(rectangular.coherenceAtAnti).toBeLessThan(0.7);
    expect(hann.coherenceAtAnti).toBeGreaterThan(0.9);
    expect(rectangular.bandCoherence).toBeLessThan(0.96);
    expect(hann.bandCoherence).toBeGreaterThan(0.99);
  });
});

describe('arm: leakage-free excitations', () => {
  it('burst random with aligned rectangular blocks matches the exact FRF; Hann on it does not', () => {
    const scenario = loadScenario('arm-burst-random');
    const recipe = loadRecipe('arm-burst-random-rectangular');
    const record = simulateScenario(scenario, 1);
    const { processed, exact } = processOnce(record, recipe);
    const score = scoreFrf({ frequenciesHz: processed.frequenciesHz, exact, estimate: processed.chosen, band: processed.bandIndices });
    // The response decays to exp(−ζω·0.6 s) = 0.2 % before the next burst: the block holds all of it.
    expect(score.summary.maxAbsMagnitudeDb).toBeLessThan(0.1);
    const { start, end } = processed.bandIndices;
    expect(Math.min(...processed.estimate.coherence.slice(start, end))).toBeGreaterThan(0.999);
    // A Hann window on the same transient record cuts its decaying tail: several dB at the peak.
    const hann = processOnce(record, { ...recipe, window: 'hann' });
    const k = nearestLine(hann.processed.frequenciesHz, 340);
    expect(Math.abs(dB(magnitude(hann.processed.chosen, k) / magnitude(hann.exact, k)))).toBeGreaterThan(1);
  });

  it('periodic excitation with the block equal to the period is exact to rounding', () => {
    const record = simulateScenario(loadScenario('arm-periodic-excitation'), 1);
    const band = { lowHz: 200, highHz: 1200 };
    // The DFT of one period of a periodic signal has no leakage (analytic): Ĥ = H at every line.
    const rectangular = processOnce(record, testRecipe({ blockLength: 1024, window: 'rectangular', overlap: 0, band }));
    const exactScore = scoreFrf({ frequenciesHz: rectangular.processed.frequenciesHz, exact: rectangular.exact, estimate: rectangular.processed.chosen, band: rectangular.processed.bandIndices });
    expect(exactScore.summary.maxAbsMagnitudeDb).toBeLessThan(1e-9);
    expect(exactScore.summary.maxAbsPhaseDeg).toBeLessThan(1e-8);
    const hann = processOnce(record, testRecipe({ blockLength: 1024, window: 'hann', overlap: 0, band }));
    const hannScore = scoreFrf({ frequenciesHz: hann.processed.frequenciesHz, exact: hann.exact, estimate: hann.processed.chosen, band: hann.processed.bandIndices });
    expect(hannScore.summary.maxAbsMagnitudeDb).toBeGreaterThan(1);
  });
});

describe('arm: delay between the channels', () => {
  it('coherence falls by (1 − τ/T)² and |H1| by (1 − τ/T)', () => {
    // Rectangular window, T = 512/4096 = 0.125 s, τ = 12.5 ms: τ/T = 0.1 (Bendat & Piersol,
    // Random Data, from memory; docs/engine.md). Ratios to the control remove the leakage of
    // the short block, which is there with or without the delay.
    const scenario = loadScenario('arm-channel-delay');
    const control = withoutErrors(scenario);
    const recipe = testRecipe({ blockLength: 512, window: 'rectangular', overlap: 0, band: { lowHz: 200, highHz: 1200 } });
    let delayed = 0;
    let clean = 0;
    const gain: number[] = [];
    for (const seed of [1, 2]) {
      const d = runOnce(scenario, seed, recipe).processed;
      const c = runOnce(control, seed, recipe).processed;
      for (let k = d.bandIndices.start; k < d.bandIndices.end; k++) {
        delayed += d.estimate.coherence[k]!;
        clean += c.estimate.coherence[k]!;
        gain.push(magnitude(d.estimate.h1, k) / magnitude(c.estimate.h1, k));
      }
    }
    expect(Math.abs(delayed / clean - 0.81)).toBeLessThan(0.02);
    expect(Math.abs(mean(gain) - 0.9)).toBeLessThan(0.02);
  });
});

describe('arm: impact record too short for the decay', () => {
  it('|H1| at the 340 Hz resonance reads low by 1 − exp(−ζωT) with 0.25 s blocks, exact with 1 s', () => {
    // Truncating the impulse response after T multiplies the resonant term at its damped
    // frequency by 1 − exp(−σT), σ = ζω_n (analytic: ∫₀ᵀ e^(−σt) dt · σ). 340 Hz lies on both grids.
    const scenario = loadScenario('arm-short-record');
    const record = simulateScenario(scenario, 1);
    const mode = record.reference.modes[0]!;
    const sigma = mode.dampingRatio * 2 * Math.PI * mode.naturalFrequencyHz;
    for (const [blockLength, tolerance] of [[4096, 0.05], [16384, 0.01]] as const) {
      const { processed, exact } = processOnce(record, testRecipe({ blockLength, window: 'rectangular', overlap: 0, band: { lowHz: 200, highHz: 1200 } }));
      const k = nearestLine(processed.frequenciesHz, 340);
      expect(processed.frequenciesHz[k]).toBe(340);
      const T = blockLength / record.sampleRateHz;
      const predictedDb = dB(1 - Math.exp(-sigma * T));
      expect(Math.abs(dB(magnitude(processed.estimate.h1, k) / magnitude(exact, k)) - predictedDb)).toBeLessThan(tolerance);
    }
  });
});

describe('frame: resolution against the half-power bandwidth', () => {
  it('the Hann peak bias falls as (Δf/B_r)²', () => {
    const scenario = loadScenario('frame-resolution-sweep');
    const mode = buildSystem(scenario.system).modes[1]!; // 46 Hz, B_r = 0.506 Hz
    const blocks = [1024, 2048, 4096]; // B_r/Δf = 2, 4, 8 at 256 Hz
    const errors = blocks.map(() => [] as number[]);
    for (const seed of [1, 2]) {
      const record = simulateScenario(scenario, seed);
      blocks.forEach((blockLength, b) => {
        const { processed, exact } = processOnce(record, testRecipe({ blockLength, band: { lowHz: 10, highHz: 120 } }));
        const k = nearestLine(processed.frequenciesHz, mode.naturalFrequencyHz);
        errors[b]!.push(dB(magnitude(processed.estimate.h1, k) / magnitude(exact, k)));
      });
    }
    const [coarse, middle, fine] = errors.map(mean) as [number, number, number];
    expect(coarse).toBeLessThan(middle);
    expect(middle).toBeLessThan(fine);
    expect(fine).toBeLessThan(0);
    // Asymptotic law: bias ∝ (Δf/B_r)² (Bendat & Piersol, Random Data, from memory), so halving Δf
    // divides it by about 4 once B_r/Δf ≥ 4; higher-order terms and the Monte Carlo scatter
    // (±0.03 dB per seed at Δf = B_r/8) widen the band.
    expect(middle / fine).toBeGreaterThan(3);
    expect(middle / fine).toBeLessThan(6);
    // Second-order expansion of the window-kernel smoothing (P. D. Welch 1967): bias/H ≈
    // −4·μ₂/B_r², Hann kernel second moment μ₂ = Δf²/3 (Parseval) → −(4/3)(Δf/B_r)².
    const deltaF = 256 / 4096;
    const secondOrderDb = dB(1 - (4 / 3) * (deltaF / mode.halfPowerBandwidthHz) ** 2);
    expect(Math.abs(fine / secondOrderDb - 1)).toBeLessThan(0.35);
    // Common practice: Δf ≤ B_r/4 keeps the peak within 1 dB.
    expect(Math.abs(middle)).toBeLessThan(1);
  });
});

describe('arm: cubic stiffness', () => {
  it('coherence near the first resonance falls and the peak moves up as the force grows', () => {
    const scenario = loadScenario('arm-cubic-stiffness');
    const recipe = testRecipe({ blockLength: 4096, band: { lowHz: 200, highHz: 1200 } });
    const figures = [2, 6, 20].map((rmsN) => {
      const s = { ...scenario, excitation: { ...scenario.excitation, level: { rmsN } } };
      const { processed, record } = runOnce(s, 1, recipe);
      expect(record.report.nonlinear).toBe(true);
      expect(record.referenceNote).toContain('underlying linear FRF');
      const f = processed.frequenciesHz;
      const near = linesIn(f, 300, 400);
      let peak = near[0]!;
      for (const k of near) if (magnitude(processed.estimate.h1, k) > magnitude(processed.estimate.h1, peak)) peak = k;
      return { coherence: mean(near.map((k) => processed.estimate.coherence[k]!)), peakHz: f[peak]! };
    });
    // A hardening (Duffing) spring: the response frequency rises with amplitude and the
    // distortion is not coherent with the force (G. Duffing, 1918; any nonlinear vibration text).
    expect(figures[0]!.coherence).toBeGreaterThan(0.98);
    expect(figures[1]!.coherence).toBeLessThan(figures[0]!.coherence - 0.01);
    expect(figures[2]!.coherence).toBeLessThan(figures[1]!.coherence - 0.1);
    expect(figures[1]!.peakHz).toBeGreaterThan(figures[0]!.peakHz);
    expect(figures[2]!.peakHz).toBeGreaterThan(figures[1]!.peakHz);
  });
});

describe('arm: impact with force and exponential windows', () => {
  it('half-power damping minus the true damping equals the added 1/(ω_n·τ)', () => {
    const recipe = loadRecipe('arm-impact-force-exponential');
    const { processed, record } = runOnce(loadScenario('arm-impact-exponential'), 1, recipe);
    const { start, end } = processed.bandIndices;
    const f = processed.frequenciesHz.slice(start, end);
    const estimate = { re: processed.chosen.re.slice(start, end), im: processed.chosen.im.slice(start, end) };
    const modes = modeErrors({ frequenciesHz: f, estimate, modes: record.reference.modes });
    expect(processed.exponentialTauS).toBeCloseTo(0.25, 12);
    // Added damping of an exponential window, ζ_add = 1/(ω_n·τ) (common practice, from memory).
    const [first, second] = modes;
    const added = (hz: number) => 1 / (2 * Math.PI * hz * 0.25);
    expect(first!.status).toBe('resolved');
    expect(Math.abs((first!.estimatedDampingRatio! - first!.dampingRatio) / added(340) - 1)).toBeLessThan(0.1);
    expect(Math.abs((second!.estimatedDampingRatio! - second!.dampingRatio) / added(910) - 1)).toBeLessThan(0.25);
  });
});

describe('arm: ADC quantisation and overload', () => {
  it('8-bit quantisation noise q²/12 sets the coherence at the anti-resonance', () => {
    const scenario = loadScenario('arm-quantisation');
    const recipe = testRecipe({ blockLength: 4096, band: { lowHz: 200, highHz: 1200 } });
    const ratios: number[] = [];
    const atResonances: number[] = [];
    for (const seed of [1, 2]) {
      const clean = simulateScenario(withoutErrors(scenario), seed);
      const noisy = runOnce(scenario, seed, recipe);
      const control = processOnce(clean, recipe).processed;
      const peak = (x: Float64Array) => x.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
      // Step q = 2·(1.25·peak)/2^8; white quantisation noise of power q²/12, one-sided PSD
      // 2(q²/12)/fs (B. Widrow & I. Kollár, Quantization Noise, 2008; Parseval). Coherence with
      // noise on both channels: 1/((1 + Gmm/Guu)(1 + Gnn/Gvv)) (Bendat & Piersol, Random Data).
      const psd = (x: Float64Array) => (2 * (((2 * 1.25 * peak(x)) / 256) ** 2 / 12)) / clean.sampleRateHz;
      const gmm = psd(clean.input);
      const gnn = psd(clean.output);
      const guu = meanSquare(clean.input) / 1400;
      const f = noisy.processed.frequenciesHz;
      for (const k of linesIn(f, 200, 1200)) {
        const gvv = magnitude(noisy.exact, k) ** 2 * guu;
        const predicted = 1 / ((1 + gmm / guu) * (1 + gnn / gvv));
        if (predicted < 0.9) ratios.push(noisy.processed.estimate.coherence[k]! / (predicted * control.estimate.coherence[k]!));
      }
      for (const hz of [340, 910]) {
        const k = nearestLine(f, hz);
        atResonances.push(noisy.processed.estimate.coherence[k]! / control.estimate.coherence[k]!);
      }
    }
    expect(ratios.length).toBeGreaterThan(4);
    expect(Math.abs(mean(ratios) - 1)).toBeLessThan(0.1);
    for (const r of atResonances) expect(Math.abs(r - 1)).toBeLessThan(0.005);
  });

  it('force overload clips about 2·Q(2.5) of the samples and H1 reads high by at most 1/α', () => {
    const scenario = loadScenario('arm-force-overload');
    const recipe = testRecipe({ blockLength: 4096, band: { lowHz: 200, highHz: 1200 } });
    const { processed, record } = runOnce(scenario, 1, recipe);
    const control = runOnce(withoutErrors(scenario), 1, recipe).processed;
    // ±5 N range on a 2 N RMS Gaussian force: P(|x| > 2.5σ) = 1.242 % (normal distribution table).
    expect(Math.abs(record.report.inputClippedSamples / record.input.length - 0.01242)).toBeLessThan(0.002);
    expect(record.report.warnings.join(' ')).toContain('overloaded');
    // Bussgang's theorem (J. J. Bussgang, MIT RLE Tech. Rep. 216, 1952; from memory): the clipped
    // force is α·x plus distortion uncorrelated with x, α = P(|x| < 2.5σ) = 0.98758, so
    // H1 = H·α·Gxx/(α²·Gxx + Gdd) lies between 1 and 1/α times H.
    const alpha = 0.98758;
    const ratios = linesIn(processed.frequenciesHz, 200, 1200).map((k) => magnitude(processed.estimate.h1, k) / magnitude(control.estimate.h1, k));
    expect(mean(ratios)).toBeGreaterThan(1.003);
    expect(mean(ratios)).toBeLessThan(1 / alpha + 0.002);
  });
});

describe('frame: two close modes', () => {
  it('merge at 0.5 Hz resolution and separate at 0.0625 Hz', () => {
    const scenario = loadScenario('frame-close-modes');
    const record = simulateScenario(scenario, 1);
    const modesAt = (blockLength: number) => {
      const { processed } = processOnce(record, testRecipe({ blockLength, band: { lowHz: 20, highHz: 120 } }));
      const { start, end } = processed.bandIndices;
      const f = processed.frequenciesHz.slice(start, end);
      const estimate = { re: processed.chosen.re.slice(start, end), im: processed.chosen.im.slice(start, end) };
      const references = exactModeReferences(record.reference.modes, record.reference.frf, f[0]!, f[f.length - 1]!);
      return { modes: modeErrors({ frequenciesHz: f, estimate, modes: record.reference.modes, references }), references };
    };
    const coarse = modesAt(1024).modes;
    expect(coarse[1]!.status).toBe('not-resolvable');
    expect(coarse[2]!.status).toBe('not-resolvable');
    const { modes: fine, references } = modesAt(8192);
    for (const m of fine.slice(1)) {
      expect(m.status).toBe('resolved');
      expect(Math.abs(m.resonanceFrequencyErrorPercent!)).toBeLessThan(0.3);
    }
    // The half-power method on the exact FRF itself misreads the damping of overlapping modes
    // (textbook half-power bandwidth 2ζf_n holds for an isolated mode, e.g. S. S. Rao).
    expect(Math.abs(references[2]!.halfPowerDampingRatio! / 0.006 - 1)).toBeGreaterThan(0.03);
    expect(Math.abs(fine[2]!.estimatedDampingRatio! / references[2]!.halfPowerDampingRatio! - 1)).toBeLessThan(0.1);
  });
});

describe('frame: gain and phase mismatch between the channels', () => {
  it('every estimator reads +20·log10(1.05) dB and +3°, coherence unchanged', () => {
    const scenario = loadScenario('frame-channel-mismatch');
    const mismatched = runOnce(scenario, 1, FRAME_SURVEY).processed;
    const control = runOnce(withoutErrors(scenario), 1, FRAME_SURVEY).processed;
    for (let k = mismatched.bandIndices.start; k < mismatched.bandIndices.end; k++) {
      for (const e of ['h1', 'h2', 'hv'] as const) {
        const a = mismatched.estimate[e];
        const b = control.estimate[e];
        // H·g·exp(jφ): |Ĥ| scales by g, arg by φ (analytic).
        expect(dB(magnitude(a, k) / magnitude(b, k))).toBeCloseTo(dB(1.05), 5);
        const phaseDeg = (Math.atan2(a.im[k]! * b.re[k]! - a.re[k]! * b.im[k]!, a.re[k]! * b.re[k]! + a.im[k]! * b.im[k]!) * 180) / Math.PI;
        expect(phaseDeg).toBeCloseTo(3, 4);
      }
      expect(mismatched.estimate.coherence[k]).toBeCloseTo(control.estimate.coherence[k]!, 8);
    }
  });
});
