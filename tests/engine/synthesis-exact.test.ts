/**
 * Exactness of the frequency-domain synthesis (docs/engine.md, "Known-answer signals").
 * Analytic truths used:
 * - the steady-state response of a linear system to A·cos(ωt + φ) is A·|H(ω)|·cos(ωt + φ + ∠H(ω))
 *   (standard textbook result, e.g. S. S. Rao, Mechanical Vibrations);
 * - a delay τ multiplies the spectrum by exp(−jωτ) (shift theorem of the Fourier transform);
 * - the DFT of y = IFFT(H·X) is H·X (the DFT is invertible).
 * A record from rest is also compared with a Runge–Kutta integration started at rest, an
 * independent route to the same response.
 */
import { buildSystem, type SystemSpec } from '@/shared/engine/systems';
import { synthesiseExact, outputChannelFactor } from '@/shared/engine/synthesis/exact';
import { simulateScenario, type ScenarioInput } from '@/shared/engine/scenario';
import { realFft } from '@/shared/engine/fft';

const fs = 1024;
const sdof: SystemSpec = { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 61, dampingRatio: 0.03, stiffnessNPerM: 2e4 };
const system = buildSystem(sdof);

function sineThrough(length: number, k0: number, amplitude: number, phase: number, channel = {}) {
  const x = Float64Array.from({ length }, (_, n) => amplitude * Math.cos((2 * Math.PI * k0 * n) / length + phase));
  return synthesiseExact(x, { sampleRateHz: fs, frf: system.frf, channel });
}

describe('exact synthesis of a bin-centred sine (steady-state sinusoidal response)', () => {
  const length = 4096;
  const k0 = 240; // 60 Hz, near the resonance
  const f0 = (k0 * fs) / length;
  const h = system.frf(Float64Array.of(f0));
  const gain = Math.hypot(h.re[0], h.im[0]);
  const angle = Math.atan2(h.im[0], h.re[0]);

  it('gives y = A·|H|·cos(ωt + φ + ∠H) to 1e-12 of the amplitude', () => {
    const { input, output } = sineThrough(length, k0, 3, 0.4);
    let worst = 0;
    let worstInput = 0;
    for (let n = 0; n < length; n++) {
      const expected = 3 * gain * Math.cos((2 * Math.PI * k0 * n) / length + 0.4 + angle);
      worst = Math.max(worst, Math.abs(output[n] - expected));
      worstInput = Math.max(worstInput, Math.abs(input[n] - 3 * Math.cos((2 * Math.PI * k0 * n) / length + 0.4)));
    }
    expect(worst / (3 * gain)).toBeLessThan(1e-12);
    expect(worstInput / 3).toBeLessThan(1e-12);
  });

  it('applies a fractional delay exactly: A·|H|·cos(ω(t − τ) + φ + ∠H)', () => {
    const tau = 0.37 / fs + 2e-3;
    const { output } = sineThrough(length, k0, 1, 0, { delayS: tau });
    let worst = 0;
    for (let n = 0; n < length; n++) {
      const t = n / fs;
      worst = Math.max(worst, Math.abs(output[n] - gain * Math.cos(2 * Math.PI * f0 * (t - tau) + angle)));
    }
    expect(worst / gain).toBeLessThan(1e-12);
  });

  it('applies a gain and phase mismatch g·exp(jφ) exactly', () => {
    const { output } = sineThrough(length, k0, 1, 0, { gain: 1.05, phaseDeg: -7 });
    let worst = 0;
    for (let n = 0; n < length; n++) {
      const expected = 1.05 * gain * Math.cos((2 * Math.PI * k0 * n) / length + angle - (7 * Math.PI) / 180);
      worst = Math.max(worst, Math.abs(output[n] - expected));
    }
    expect(worst / gain).toBeLessThan(1e-12);
    expect(outputChannelFactor(0, { gain: 2, phaseDeg: 30, delayS: 1 })).toEqual([2, 0]);
  });

  it('removes the Nyquist line from the input record', () => {
    const x = Float64Array.from({ length: 64 }, (_, n) => (n % 2 === 0 ? 1 : -1) + 0.5);
    const { input, output } = synthesiseExact(x, { sampleRateHz: fs, frf: system.frf });
    expect(Math.max(...input.map((v) => Math.abs(v - 0.5)))).toBeLessThan(1e-14);
    // DC through the static receptance 1/k.
    expect(Math.max(...output.map((v) => Math.abs(v * 2e4 - 0.5)))).toBeLessThan(1e-12);
  });
});

describe('exact synthesis of a random record (DFT of IFFT(H·X) = H·X)', () => {
  const scenario: ScenarioInput = {
    name: 'Random on an SDOF',
    system: { ...sdof, quantity: 'mobility' },
    acquisition: { sampleRateHz: fs, durationS: 16 }, // 16384 samples = the whole synthesis record
    excitation: { kind: 'random', band: { lowHz: 10, highHz: 300 }, level: { rmsN: 5 } },
  };

  it('has an output spectrum equal to H·X on every line of the synthesis grid', () => {
    const record = simulateScenario(scenario, 11);
    expect(record.input.length).toBe(16384);
    const x = realFft(record.input);
    const y = realFft(record.output);
    const f = Float64Array.from(x.re, (_, k) => (k * fs) / record.input.length);
    const h = record.reference.frf(f);
    let largest = 0;
    for (let k = 0; k < f.length; k++) largest = Math.max(largest, Math.hypot(y.re[k], y.im[k]));
    let worst = 0;
    for (let k = 0; k < f.length - 1; k++) {
      const pr = h.re[k] * x.re[k] - h.im[k] * x.im[k];
      const pi = h.re[k] * x.im[k] + h.im[k] * x.re[k];
      worst = Math.max(worst, Math.hypot(y.re[k] - pr, y.im[k] - pi));
    }
    expect(worst / largest).toBeLessThan(1e-12);
  });

  it('delays the output channel by exp(−2πifτ) exactly', () => {
    const tau = 3.3e-3;
    const plain = simulateScenario(scenario, 5);
    const delayed = simulateScenario({ ...scenario, errors: { delayS: tau } }, 5);
    expect(Buffer.from(delayed.input.buffer).equals(Buffer.from(plain.input.buffer))).toBe(true);
    const a = realFft(plain.output);
    const b = realFft(delayed.output);
    let largest = 0;
    let worst = 0;
    for (let k = 0; k < a.re.length - 1; k++) {
      const w = (-2 * Math.PI * k * fs * tau) / plain.output.length;
      const er = a.re[k] * Math.cos(w) - a.im[k] * Math.sin(w);
      const ei = a.re[k] * Math.sin(w) + a.im[k] * Math.cos(w);
      largest = Math.max(largest, Math.hypot(a.re[k], a.im[k]));
      worst = Math.max(worst, Math.hypot(b.re[k] - er, b.im[k] - ei));
    }
    expect(worst / largest).toBeLessThan(1e-12);
  });

  it('delays by a whole number of samples as a circular shift', () => {
    const plain = simulateScenario(scenario, 5);
    const delayed = simulateScenario({ ...scenario, errors: { delayS: 7 / fs } }, 5);
    const n = plain.output.length;
    let worst = 0;
    let peak = 0;
    for (let i = 0; i < n; i++) {
      worst = Math.max(worst, Math.abs(delayed.output[i] - plain.output[(i - 7 + n) % n]));
      peak = Math.max(peak, Math.abs(plain.output[i]));
    }
    expect(worst / peak).toBeLessThan(1e-12);
  });
});

describe('records from rest', () => {
  const impact: ScenarioInput = {
    name: 'Impact on an SDOF',
    system: sdof,
    acquisition: { sampleRateHz: fs, durationS: 2 },
    excitation: { kind: 'impact', pulseDurationS: 20e-3, periodS: 1, level: { peakN: 200 } },
  };

  it('is at rest before the first hit (1e-6 decay padding, band-limited ringing aside)', () => {
    const record = simulateScenario(impact, 1);
    const hit = Math.round(0.05 * fs); // default offset: 5 % of the period
    let peak = 0;
    for (const v of record.output) peak = Math.max(peak, Math.abs(v));
    // The response to the band-limited force rings slightly ahead of the hit: about 1e-4 of the
    // peak one sample before it, 1e-6 ten samples before (20-sample pulse), 1e-8 at the record start.
    const before = (x: Float64Array, from: number, to: number) => Math.max(...x.slice(from, to).map(Math.abs));
    expect(before(record.output, 0, hit - 10)).toBeLessThan(2e-6 * peak);
    expect(before(record.output, hit - 10, hit)).toBeLessThan(2e-4 * peak);
    expect(Math.abs(record.output[0])).toBeLessThan(1e-7 * peak);
    // The Nyquist-balanced force is zero before the hit to rounding.
    expect(before(record.input, 0, hit)).toBeLessThan(1e-12 * 200);
    expect(Math.max(...record.input)).toBeCloseTo(200, 9);
    expect(record.report.warnings).toEqual([]);
  });

  it('agrees with a Runge–Kutta integration started at rest (k3 = 0)', () => {
    const exact = simulateScenario(impact, 1);
    const integrated = simulateScenario({ ...impact, errors: { cubicStiffness: { k3NPerM3: 0 } } }, 1);
    let worst = 0;
    let peak = 0;
    for (let n = 0; n < exact.output.length; n++) {
      worst = Math.max(worst, Math.abs(exact.output[n] - integrated.output[n]));
      peak = Math.max(peak, Math.abs(exact.output[n]));
    }
    expect(worst / peak).toBeLessThan(1e-6);
    expect(integrated.report.nonlinear).toBe(false);
  });
});

describe('exact synthesis input rules', () => {
  it.each([
    ['a length that is not a power of two', 12],
    ['a length below 4', 2],
  ])('rejects %s naming synthesis.length', (_name, length) => {
    try {
      synthesiseExact(new Float64Array(length), { sampleRateHz: fs, frf: system.frf });
      throw new Error('no error');
    } catch (e) {
      expect((e as { field?: string }).field).toBe('synthesis.length');
    }
  });
});
