/**
 * The advice follows the same rules as a study's pre-flight check.
 * Sources of the figures checked:
 * - lines without force carry only leakage and noise: nothing is promised there (the exact
 *   synthesis puts no force outside the excitation band, engine.md);
 * - a resonance read from the lines sits on the line grid, so the spacing must not exceed the
 *   resonance-frequency tolerance (common practice); 0.5 Hz / 85 Hz = 0.588 % (arithmetic);
 * - a delay τ scales E[Ĝyx] by the window's correlation at the lag, 1 − τ/T for rectangular
 *   (J. S. Bendat & A. G. Piersol, Random Data, 4th ed., ch. 9, quoted from memory), and shifts the
 *   phase by −360·f·τ degrees (the Fourier shift theorem).
 */
import { adviseRecipe } from '@/shared/engine/advice';
import { delayBias } from '@/shared/engine/delay-bias';
import { processRecord } from '@/shared/engine/process';
import { simulateScenario } from '@/shared/engine/scenario';
import { sdofRandomScenario } from './study-helpers';

describe('advice and the pre-flight rules', () => {
  it('a band reaching past the force: no promise above 120 Hz (the study measures more than 1 dB there), and the warning', () => {
    const scenario = sdofRandomScenario(); // no noise, force 0–120 Hz, fs 256 Hz
    const advice = adviseRecipe(scenario, { targetMagnitudeDb: 1, band: { lowHz: 100, highHz: 127 } });
    const f = advice.lines.frequenciesHz;
    for (let i = 0; i < f.length; i++) {
      if (f[i] > 120) {
        expect(advice.lines.expectedCoherence[i]).toBe(0);
        expect(advice.lines.predictedRandomError[i]).toBe(Infinity);
      }
    }
    expect(advice.worstLineHz).toBeLessThanOrEqual(120);
    expect(advice.preflight.warnings.map((w) => w.code)).toContain('band-outside-excitation');
    expect(advice.warnings.some((w) => w.includes('the lines in 120–127 Hz carry no force'))).toBe(true);
    // What a run of the draft measures above the force edge: far outside the 1 dB tolerance.
    const p = processRecord(simulateScenario(scenario, 1), advice.recipe);
    const exact = simulateScenario(scenario, 1).reference.frf(p.frequenciesHz);
    let worstAbove = 0;
    for (let k = p.bandIndices.start; k < p.bandIndices.end; k++) {
      if (p.frequenciesHz[k] <= 121) continue;
      const db = 20 * Math.log10(Math.hypot(p.chosen.re[k], p.chosen.im[k]) / Math.hypot(exact.re[k], exact.im[k]));
      worstAbove = Math.max(worstAbove, Math.abs(db));
    }
    expect(worstAbove).toBeGreaterThan(1);
  });

  it('a 0.5 % resonance tolerance at 85 Hz refines 0.5 Hz lines (0.588 % each) to 0.25 Hz, and the draft passes the check', () => {
    const scenario = sdofRandomScenario({ fn: 85, zeta: 1 / 85, fs: 512, durationS: 256 }); // B_r = 2 Hz, B_r/4 = 0.5 Hz
    const plain = adviseRecipe(scenario, { targetMagnitudeDb: 3 });
    expect(plain.frequencyResolutionHz).toBe(0.5);
    const withTolerance = adviseRecipe(scenario, { targetMagnitudeDb: 3, resonanceFrequencyPercent: 0.5 });
    expect(withTolerance.frequencyResolutionHz).toBeLessThanOrEqual((0.5 * 85) / 100);
    expect(withTolerance.frequencyResolutionHz).toBe(0.25);
    expect(withTolerance.recipe.tolerances.resonanceFrequencyPercent).toBe(0.5);
    expect(withTolerance.preflight.warnings.map((w) => w.code)).not.toContain('resolution-coarser-than-tolerance');
    expect(withTolerance.preflight.refusals).toEqual([]);
  });

  it('a delay is priced with the advised window, costs phase, and the price matches a noise-free run', () => {
    const delayS = 8 / 256; // 8 samples at 256 Hz
    const scenario = sdofRandomScenario({ delayS });
    const advice = adviseRecipe(scenario, { targetMagnitudeDb: 1, band: { lowHz: 30, highHz: 70 } });
    const note = advice.notes.find((n) => n.startsWith('a channel delay'))!;
    expect(advice.window).toBe('hann');
    expect(note).toContain('with the hann window');
    expect(note).toContain(`${-360 * 70 * delayS}° at 70 Hz`); // −787.5°
    // Rectangular over 256 samples: exactly 1 − τ/T = 1 − 8/256.
    expect(delayBias('rectangular', 256, 256, delayS, 70).magnitudeFactor).toBeCloseTo(1 - 8 / 256, 12);
    // A noise-free run: the mean |Ĥ1|/|H| over 20–100 Hz follows the window's figure, not 1 − τ/T.
    const record = simulateScenario(scenario, 1);
    for (const window of ['hann', 'rectangular'] as const) {
      const p = processRecord(record, { name: 'delay', blockLength: 256, window, overlap: 0, detrend: 'none', estimator: 'H1', band: { lowHz: 20, highHz: 100 }, scaling: 'density', tolerances: {} });
      const exact = record.reference.frf(p.frequenciesHz);
      let sum = 0;
      for (let k = p.bandIndices.start; k < p.bandIndices.end; k++) sum += Math.hypot(p.chosen.re[k], p.chosen.im[k]) / Math.hypot(exact.re[k], exact.im[k]);
      const measured = sum / (p.bandIndices.end - p.bandIndices.start);
      expect(Math.abs(measured - delayBias(window, 256, 256, delayS, 100).magnitudeFactor)).toBeLessThan(0.01);
    }
  });
});
