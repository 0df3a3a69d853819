/**
 * Measurement noise. Sources:
 * - Parseval's theorem for the DFT, Σ|X_k|² = N·Σx_n² (exact), and its consequence that white
 *   noise of variance σ² at rate fs has the one-sided PSD 2σ²/fs (docs/engine.md check table);
 * - the periodogram of Gaussian white noise: each line is σ²-scaled χ² with 2 degrees of freedom,
 *   so a mean over M independent lines has relative standard error 1/sqrt(M) (e.g. J. S. Bendat
 *   and A. G. Piersol, Random Data, 4th ed., 2010, ε[Ĝ] = 1/sqrt(n_d); quoted from memory).
 */
import { addWhiteNoise, bandPower, noiseSigma } from '@/shared/engine/synthesis/noise';
import { createRandom } from '@/shared/engine/random';
import { realFft } from '@/shared/engine/fft';
import { simulateScenario, type ScenarioInput } from '@/shared/engine/scenario';

const fs = 2048;

describe('white noise PSD 2σ²/fs (Parseval)', () => {
  const sigma = 0.3;
  const n = 1 << 16;
  const x = addWhiteNoise(new Float64Array(n), sigma, createRandom(9, 'output-noise'));

  it('satisfies Parseval exactly: Σ|X_k|² = N·Σx²', () => {
    const s = realFft(x);
    let spectral = s.re[0] ** 2 + s.re[n / 2] ** 2;
    for (let k = 1; k < n / 2; k++) spectral += 2 * (s.re[k] ** 2 + s.im[k] ** 2);
    const temporal = x.reduce((a, v) => a + v * v, 0);
    expect(spectral / (n * temporal)).toBeCloseTo(1, 12);
  });

  it('has a mean one-sided PSD level 2σ²/fs within the 1/sqrt(M) sampling error', () => {
    // Periodogram G_k = 2|X_k|²/(fs·N), averaged over the M = N/2 − 1 interior lines.
    const s = realFft(x);
    let sum = 0;
    for (let k = 1; k < n / 2; k++) sum += (2 * (s.re[k] ** 2 + s.im[k] ** 2)) / (fs * n);
    const level = sum / (n / 2 - 1);
    expect(Math.abs(level / ((2 * sigma * sigma) / fs) - 1)).toBeLessThan(4 / Math.sqrt(n / 2 - 1));
  });

  it('turns a PSD level G into σ = sqrt(G·fs/2), and an SNR over a band into the matching σ', () => {
    expect(noiseSigma({ psd: 1e-4 }, new Float64Array(8), fs, { lowHz: 0, highHz: 1 })).toBeCloseTo(Math.sqrt(1e-4 * 1024), 14);
    // A unit sine in the band has in-band power 1/2; SNR 20 dB → noise power 0.005 over 500 Hz.
    const sine = Float64Array.from({ length: 4096 }, (_, i) => Math.sin((2 * Math.PI * 256 * i) / 4096));
    const band = { lowHz: 100, highHz: 600 };
    expect(bandPower(sine, fs, band)).toBeCloseTo(0.5, 12);
    const expected = Math.sqrt((0.005 * fs) / (2 * 500));
    expect(noiseSigma({ snrDb: 20, bandHz: band }, sine, fs, band) / expected).toBeCloseTo(1, 12);
  });
});

describe('noise in a simulated record', () => {
  const scenario: ScenarioInput = {
    name: 'noise',
    system: { kind: 'sdof', quantity: 'accelerance', naturalFrequencyHz: 150, dampingRatio: 0.02, stiffnessNPerM: 5e5 },
    acquisition: { sampleRateHz: fs, durationS: 16 }, // 32768 samples
    excitation: { kind: 'random', band: { lowHz: 20, highHz: 600 }, level: { rmsN: 3 } },
  };
  const clean = simulateScenario(scenario, 21);

  it.each([
    ['outputNoise', 'output', 25],
    ['inputNoise', 'input', 40],
  ] as const)('realises the %s SNR in the band within sampling tolerance', (field, channel, snrDb) => {
    const noisy = simulateScenario({ ...scenario, errors: { [field]: { snrDb } } }, 21);
    const noise = Float64Array.from(noisy[channel], (v, i) => v - clean[channel][i]);
    const band = scenario.excitation.kind === 'random' ? scenario.excitation.band : { lowHz: 0, highHz: 1 };
    const realised = 10 * Math.log10(bandPower(clean[channel], fs, band) / bandPower(noise, fs, band));
    // The band holds M = 580·16 = 9280 lines; the noise power's relative error is 1/sqrt(M),
    // i.e. 0.045 dB; allow 4 of those.
    expect(Math.abs(realised - snrDb)).toBeLessThan(4 * (10 / Math.LN10) / Math.sqrt(9280));
  });

  it('adds noise only to its own channel, from independent streams', () => {
    const both = simulateScenario({ ...scenario, errors: { inputNoise: { psd: 1e-3 }, outputNoise: { psd: 1e-3 } } }, 21);
    const inputOnly = simulateScenario({ ...scenario, errors: { inputNoise: { psd: 1e-3 } } }, 21);
    expect(Buffer.from(inputOnly.output.buffer).equals(Buffer.from(clean.output.buffer))).toBe(true);
    expect(Buffer.from(inputOnly.input.buffer).equals(Buffer.from(both.input.buffer))).toBe(true);
    const a = Float64Array.from(both.input, (v, i) => v - clean.input[i]);
    const b = Float64Array.from(both.output, (v, i) => v - clean.output[i]);
    let ab = 0;
    let aa = 0;
    let bb = 0;
    for (let i = 0; i < a.length; i++) {
      ab += a[i] * b[i];
      aa += a[i] * a[i];
      bb += b[i] * b[i];
    }
    // Correlation coefficient of independent white sequences: standard error 1/sqrt(N).
    expect(Math.abs(ab / Math.sqrt(aa * bb))).toBeLessThan(4 / Math.sqrt(a.length));
    // PSD 1e-3 N²/Hz → variance G·fs/2 = 1.024 N², within 4·sqrt(2/N) relative.
    expect(Math.abs(aa / a.length / 1.024 - 1)).toBeLessThan(4 * Math.sqrt(2 / a.length));
  });
});
