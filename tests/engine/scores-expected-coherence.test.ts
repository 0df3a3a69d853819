/**
 * Expected coherence from the scenario's noise, against closed forms:
 * - γ² = 1/((1 + 1/s_in)(1 + 1/s_out)) with line SNRs s (Bendat & Piersol, Random Data ch. 9,
 *   quoted from memory);
 * - the half-sine pulse sin(πt/T) on [0, T] has |F(f)| = (2T/π)·|cos(πfT)/(1 − 4f²T²)|
 *   (its Fourier transform): 1 at f = 0 relative, (π/4)² at fT = ½ (the removable singularity),
 *   zero at fT = 3/2; two equal hits d apart cancel at f = 1/(2d);
 * - white noise of one-sided PSD G over a band B has power G·B (Parseval).
 */
import { expectedCoherence, forceSpectrumShape } from '@/shared/engine/scores/expected-coherence';
import type { ExcitationSpec } from '@/shared/engine/synthesis/excitation-schema';

const flatFrf = (f: Float64Array) => ({ re: new Float64Array(f.length).fill(2), im: new Float64Array(f.length) });
const random: ExcitationSpec = { kind: 'random', band: { lowHz: 10, highHz: 110 }, level: { rmsN: 3 } };
const f = Float64Array.of(20, 50, 100, 200);

describe('forceSpectrumShape', () => {
  it('half-sine pulse: 1 at DC, (π/4)² at fT = 1/2, 0 at fT = 3/2', () => {
    const e: ExcitationSpec = { kind: 'impact', pulseDurationS: 0.002, periodS: 1, level: { peakN: 100 } };
    const s = forceSpectrumShape(e, Float64Array.of(0, 250, 750));
    expect(s[0]).toBeCloseTo(1, 14);
    expect(s[1]).toBeCloseTo((Math.PI / 4) ** 2, 12);
    expect(s[2]).toBeLessThan(1e-20);
  });

  it('a second equal hit d later cancels the first at f = 1/(2d)', () => {
    const e: ExcitationSpec = { kind: 'impact', pulseDurationS: 0.001, periodS: 1, doubleHit: { delayS: 0.01, amplitudeRatio: 1 }, level: { peakN: 100 } };
    const s = forceSpectrumShape(e, Float64Array.of(0, 50));
    expect(s[0]).toBeCloseTo(4, 12);
    expect(s[1]).toBeLessThan(1e-20);
  });

  it('flat inside the band for random force, 1/f for a log chirp, zero outside', () => {
    expect(Array.from(forceSpectrumShape(random, f))).toEqual([1, 1, 1, 0]);
    const chirp: ExcitationSpec = { kind: 'chirp', band: { lowHz: 10, highHz: 110 }, periodS: 1, sweep: 'log', level: { rmsN: 1 } };
    expect(forceSpectrumShape(chirp, Float64Array.of(20))[0]).toBeCloseTo(1 / 20, 14);
  });
});

describe('expectedCoherence', () => {
  const base = { fHz: f.subarray(0, 3), frf: flatFrf, excitation: random, defaultNoiseBand: random.band, blockDurationS: 1 };

  it('10 dB SNR on one channel gives 10/11; on both, (10/11)²; none gives 1', () => {
    expect(expectedCoherence(base).coherence[1]).toBe(1);
    const input = expectedCoherence({ ...base, inputNoise: { snrDb: 10 } });
    const output = expectedCoherence({ ...base, outputNoise: { snrDb: 10 } });
    const both = expectedCoherence({ ...base, inputNoise: { snrDb: 10 }, outputNoise: { snrDb: 10 } });
    for (let i = 0; i < 3; i++) {
      expect(input.coherence[i]).toBeCloseTo(10 / 11, 10);
      expect(output.coherence[i]).toBeCloseTo(10 / 11, 10);
      expect(both.coherence[i]).toBeCloseTo(100 / 121, 10);
    }
    expect(input.outputSnr[0]).toBe(Infinity);
  });

  it('an SNR band twice the excitation band halves the mean signal PSD and so the line SNR', () => {
    const wide = expectedCoherence({ ...base, inputNoise: { snrDb: 10, bandHz: { lowHz: 10, highHz: 210 } } });
    expect(wide.inputSnr[1]).toBeCloseTo(20, 1); // 10 · 1/mean, mean ≈ 1/2 on the 4097-point grid
  });

  it('a PSD noise level against an RMS force: s = (rms²/B)/G', () => {
    const r = expectedCoherence({ ...base, inputNoise: { psd: 0.009 } });
    expect(r.inputSnr[0]).toBeCloseTo(9 / 100 / 0.009, 8);
    const out = expectedCoherence({ ...base, outputNoise: { psd: 0.009 } });
    expect(out.outputSnr[0]).toBeCloseTo((4 * 9) / 100 / 0.009, 8); // |H|² = 4
  });

  it('a PSD noise against an impact: s = 2|F|²/(T_block·G), |F(0)| = peak·2T/π', () => {
    const impact: ExcitationSpec = { kind: 'impact', pulseDurationS: 0.002, periodS: 1, level: { peakN: 100 } };
    const r = expectedCoherence({ ...base, fHz: Float64Array.of(0), excitation: impact, inputNoise: { psd: 1e-6 }, blockDurationS: 0.5 });
    const F0 = (100 * 2 * 0.002) / Math.PI;
    expect(r.inputSnr[0]).toBeCloseTo((2 * F0 * F0) / (0.5 * 1e-6), 4);
    expect(r.notes.some((n) => /conservative/.test(n))).toBe(true);
  });

  it('a PSD noise with a peak-level random force cannot be sized: noted, channel noise-free', () => {
    const peak: ExcitationSpec = { kind: 'random', band: { lowHz: 10, highHz: 110 }, level: { peakN: 3 } };
    const r = expectedCoherence({ ...base, excitation: peak, inputNoise: { psd: 0.01 } });
    expect(r.coherence[0]).toBe(1);
    expect(r.notes[0]).toMatch(/input noise is given as a PSD/);
  });
});
