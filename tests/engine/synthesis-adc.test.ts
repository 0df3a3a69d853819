/**
 * ADC quantisation, overload and clipping. Sources: the uniform mid-tread quantiser (step
 * q = 2V/2^bits, error within ±q/2 in range) and its additive-noise model with variance q²/12
 * for a busy signal (B. Widrow and I. Kollár, Quantization Noise, Cambridge University Press,
 * 2008); clip counts are checked by counting directly.
 */
import { clipInPlace, quantise } from '@/shared/engine/synthesis/adc';
import { createRandom } from '@/shared/engine/random';
import { EngineInputError } from '@/shared/engine/errors';
import { simulateScenario, type ScenarioInput } from '@/shared/engine/scenario';

describe('mid-tread quantiser', () => {
  const bits = 8;
  const fullScale = 2.5;
  const q = (2 * fullScale) / 2 ** bits;

  it('has step 2V/2^bits, maps 0 to 0 and stays within ±q/2 in range', () => {
    const x = Float64Array.from({ length: 2001 }, (_, i) => -2.4 + (4.8 * i) / 2000);
    const r = quantise(x, { bits, fullScale });
    expect(r.step).toBe(q);
    expect(r.clipped).toBe(0);
    let worst = 0;
    let offGrid = 0;
    r.values.forEach((v, i) => {
      worst = Math.max(worst, Math.abs(v - x[i]));
      offGrid = Math.max(offGrid, Math.abs(v / q - Math.round(v / q)));
    });
    expect(worst).toBeLessThanOrEqual(q / 2 + 1e-15);
    expect(offGrid).toBeLessThan(1e-9);
    expect(quantise(Float64Array.of(0, 0.49 * q, -0.49 * q, 0.51 * q), { bits, fullScale }).values).toEqual(
      Float64Array.of(0, 0, -0, q),
    );
  });

  it('counts overloads exactly: codes beyond −2^(b−1) … 2^(b−1) − 1 clip to the end codes', () => {
    // A ramp over ±2V: samples with x/q ≥ 127.5 or x/q < −128.5 overload.
    const x = Float64Array.from({ length: 10001 }, (_, i) => -2 * fullScale + (4 * fullScale * i) / 10000);
    const expected = Array.from(x).filter((v) => Math.round(v / q) > 127 || Math.round(v / q) < -128).length;
    const mask = new Uint8Array(x.length);
    const r = quantise(x, { bits, fullScale }, mask);
    expect(r.clipped).toBe(expected);
    expect(mask.reduce((a, v) => a + v, 0)).toBe(expected);
    expect(Math.max(...r.values)).toBeCloseTo(127 * q, 14);
    expect(Math.min(...r.values)).toBeCloseTo(-128 * q, 14);
  });

  it('adds noise of variance q²/12 to a busy signal (within sampling tolerance)', () => {
    const n = 100000;
    const x = createRandom(2, 'excitation').fillGaussian(new Float64Array(n), 0.6);
    const r = quantise(x, { bits: 10, fullScale: 4 });
    const step = r.step;
    let s = 0;
    for (let i = 0; i < n; i++) s += (r.values[i] - x[i]) ** 2;
    // Uniform error: variance q²/12, relative standard error of the mean square sqrt(0.8/n).
    expect(Math.abs(s / n / ((step * step) / 12) - 1)).toBeLessThan(4 * Math.sqrt(0.8 / n));
  });

  it.each([
    ['1 bit', 1, 1, 'errors.quantisation.bits'],
    ['33 bits', 33, 1, 'errors.quantisation.bits'],
    ['fractional bits', 8.5, 1, 'errors.quantisation.bits'],
    ['zero full scale', 8, 0, 'errors.quantisation.fullScale'],
    ['infinite full scale', 8, Infinity, 'errors.quantisation.fullScale'],
  ])('rejects %s', (_name, b, v, field) => {
    try {
      quantise(new Float64Array(4), { bits: b, fullScale: v });
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      expect((e as EngineInputError).field).toBe(field);
    }
  });
});

describe('ADC and clipping in a simulated record', () => {
  const scenario: ScenarioInput = {
    name: 'adc',
    system: { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 40, dampingRatio: 0.02, stiffnessNPerM: 1e4 },
    acquisition: { sampleRateHz: 512, durationS: 8 },
    excitation: { kind: 'random', band: { lowHz: 5, highHz: 200 }, level: { rmsN: 1 } },
  };
  const clean = simulateScenario(scenario, 4);

  it("quantises both channels on their ranges; 'auto' (1.25 × peak) never overloads", () => {
    const r = simulateScenario({ ...scenario, errors: { quantisation: { bits: 12 } } }, 4);
    expect(r.report.inputClippedSamples).toBe(0);
    expect(r.report.outputClippedSamples).toBe(0);
    const q = (2 * 1.25 * Math.max(...clean.input.map(Math.abs))) / 4096;
    expect(Math.max(...r.input.map((v, i) => Math.abs(v - clean.input[i])))).toBeLessThanOrEqual(q / 2 + 1e-12);
  });

  it('counts ADC overload samples on a fixed range and warns', () => {
    const range = 2; // N; a unit-RMS Gaussian force exceeds ±2 N on about 4.6 % of samples
    const r = simulateScenario({ ...scenario, errors: { quantisation: { bits: 12, inputFullScale: range, outputFullScale: 1 } } }, 4);
    const direct = quantise(clean.input, { bits: 12, fullScale: range });
    expect(r.report.inputClippedSamples).toBe(direct.clipped);
    expect(direct.clipped).toBeGreaterThan(0);
    expect(r.report.outputClippedSamples).toBe(0);
    expect(r.report.warnings.some((w) => w.includes('input ADC overloaded'))).toBe(true);
    expect(r.report.nonlinear).toBe(false);
  });

  it('clips the response at ±limit, counts the samples and notes the linear reference', () => {
    const peak = Math.max(...clean.output.map(Math.abs));
    const limit = 0.5 * peak;
    const expected = Array.from(clean.output).filter((v) => Math.abs(v) > limit).length;
    const r = simulateScenario({ ...scenario, errors: { clipping: { outputLimit: limit } } }, 4);
    expect(r.report.outputClippedSamples).toBe(expected);
    expect(Math.max(...r.output.map(Math.abs))).toBe(limit);
    expect(r.report.nonlinear).toBe(true);
    expect(r.referenceNote).toMatch(/underlying linear FRF/);
    const copy = Float64Array.from(clean.output);
    expect(clipInPlace(copy, limit)).toBe(expected);
  });
});
