/**
 * Time integration with a cubic spring. Sources:
 * - with k₃ = 0 the Runge–Kutta solution must reproduce the exact linear synthesis (the same
 *   band-limited input; RK4 global error O(h⁴), J. C. Butcher, Numerical Methods for Ordinary
 *   Differential Equations, 2008);
 * - the Duffing oscillator's free-vibration frequency at amplitude a is, to first order,
 *   ω ≈ ω₀·(1 + 3k₃a²/(8k)) (Lindstedt–Poincaré; A. H. Nayfeh and D. T. Mook, Nonlinear
 *   Oscillations, 1979).
 */
import { simulateScenario, type ScenarioInput } from '@/shared/engine/scenario';
import { EngineInputError } from '@/shared/engine/errors';
import type { SystemSpec } from '@/shared/engine/systems';

const fs = 512;
const chain: SystemSpec = {
  kind: 'physical',
  quantity: 'mobility',
  massesKg: [1, 0.6, 0.8],
  springs: [
    { between: ['ground', 0], stiffnessNPerM: 6e4 },
    { between: [0, 1], stiffnessNPerM: 3e4 },
    { between: [1, 2], stiffnessNPerM: 4e4 },
  ],
  dampers: [
    { between: ['ground', 0], dampingNsPerM: 25 },
    { between: [1, 2], dampingNsPerM: 15 },
  ],
  inputNode: 2,
  outputNode: 0,
};

const random = (system: SystemSpec): ScenarioInput => ({
  name: 'cubic',
  system,
  acquisition: { sampleRateHz: fs, durationS: 8 },
  excitation: { kind: 'random', band: { lowHz: 5, highHz: 150 }, level: { rmsN: 2 } },
});

function relativeRms(a: Float64Array, b: Float64Array): number {
  let num = 0;
  let den = 0;
  for (let i = 0; i < a.length; i++) {
    num += (a[i] - b[i]) ** 2;
    den += b[i] ** 2;
  }
  return Math.sqrt(num / den);
}

describe('Runge–Kutta integration against the exact linear synthesis (k₃ = 0)', () => {
  it.each(['receptance', 'mobility', 'accelerance'] as const)('reproduces a 3-DOF chain in %s within 1e-6', (quantity) => {
    const scenario = random({ ...chain, quantity });
    const exact = simulateScenario(scenario, 8);
    const integrated = simulateScenario({ ...scenario, errors: { cubicStiffness: { k3NPerM3: 0, springIndex: 1 } } }, 8);
    expect(Buffer.from(integrated.input.buffer).equals(Buffer.from(exact.input.buffer))).toBe(true);
    expect(relativeRms(integrated.output, exact.output)).toBeLessThan(1e-6);
    expect(integrated.report.nonlinear).toBe(false);
    expect(integrated.referenceNote).toBeUndefined();
  });

  it('applies the output delay and gain mismatch as the exact synthesis does', () => {
    const scenario = random({ kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 60, dampingRatio: 0.02, stiffnessNPerM: 1e4 });
    const errors = { delayS: 2.7e-3, gainMismatch: 0.97 };
    const exact = simulateScenario({ ...scenario, errors }, 3);
    const integrated = simulateScenario({ ...scenario, errors: { ...errors, cubicStiffness: { k3NPerM3: 0 } } }, 3);
    // A mode at 0.12·fs: the RK4 error at 16 sub-steps is about 1.4e-6 here.
    expect(relativeRms(integrated.output, exact.output)).toBeLessThan(1e-5);
  });
});

describe('cubic stiffness k₃ > 0', () => {
  it('changes the response and says the reference is the underlying linear FRF', () => {
    const scenario = random(chain);
    const linear = simulateScenario(scenario, 8);
    // Spring 1 stretches by about 1e-4 m here; k₃δ² ≈ k at k₃ = 3e12 N/m³.
    const cubic = simulateScenario({ ...scenario, errors: { cubicStiffness: { k3NPerM3: 3e12, springIndex: 1 } } }, 8);
    expect(relativeRms(cubic.output, linear.output)).toBeGreaterThan(0.01);
    expect(cubic.report.nonlinear).toBe(true);
    expect(cubic.referenceNote).toMatch(/underlying linear FRF/);
    const f = Float64Array.of(10, 40, 90);
    const a = cubic.reference.frf(f);
    const b = linear.reference.frf(f);
    expect(Array.from(a.re)).toEqual(Array.from(b.re));
  });

  it('raises the free-vibration frequency as ω₀(1 + 3k₃a²/(8k)) (Duffing backbone, first order)', () => {
    const k = 1e4;
    const f0 = 10; // 51.2 samples per cycle
    const scenario: ScenarioInput = {
      name: 'Duffing free decay',
      system: { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: f0, dampingRatio: 0.002, stiffnessNPerM: k },
      acquisition: { sampleRateHz: fs, durationS: 4 },
      excitation: { kind: 'impact', pulseDurationS: 10 / fs, periodS: 4, offsetS: 0, level: { peakN: 100 } },
    };
    const linear = simulateScenario(scenario, 1);
    const aLinear = Math.max(...linear.output.slice(20, 600).map(Math.abs));
    const k3 = (0.1 * k) / (aLinear * aLinear); // k₃a²/k ≈ 0.1: a 3.75 % frequency rise
    const record = simulateScenario({ ...scenario, errors: { cubicStiffness: { k3NPerM3: k3 } } }, 1);
    // Zero crossings after the pulse, over 10 cycles; the amplitude decays by 12 % over them, so
    // a² is taken as the window's mean square × 2 (exact for a sinusoid of slowly varying size).
    const y = record.output;
    const crossings: number[] = [];
    for (let n = 20; n < y.length - 1 && crossings.length < 21; n++) {
      if (y[n] === 0 || y[n] * y[n + 1] < 0) crossings.push(n + y[n] / (y[n] - y[n + 1]));
    }
    const measured = (10 * fs) / (crossings[20] - crossings[0]);
    let sum = 0;
    let count = 0;
    for (let n = Math.ceil(crossings[0]); n < crossings[20]; n++, count++) sum += y[n] * y[n];
    const a2 = (2 * sum) / count;
    const predicted = f0 * (1 + (3 * k3 * a2) / (8 * k));
    expect(measured / f0).toBeGreaterThan(1.02);
    // First-order formula: the O((k₃a²/k)²) terms are about 1e-3 here.
    expect(Math.abs(measured / predicted - 1)).toBeLessThan(1.5e-3);
  });
});

describe('cubic stiffness validation', () => {
  const base = random(chain);
  it.each([
    ['a modal system', 'errors.cubicStiffness', { ...base, system: { kind: 'modal', quantity: 'receptance', modes: [{ naturalFrequencyHz: 20, dampingRatio: 0.02, modalConstant: 1 }] }, errors: { cubicStiffness: { k3NPerM3: 1 } } }],
    ['a spring index out of range', 'errors.cubicStiffness.springIndex', { ...base, errors: { cubicStiffness: { k3NPerM3: 1, springIndex: 3 } } }],
    ['too few sub-steps', 'errors.cubicStiffness.oversampling', { ...base, errors: { cubicStiffness: { k3NPerM3: 1, oversampling: 2 } } }],
    ['a diverging softening spring', 'errors.cubicStiffness.k3NPerM3', { ...base, errors: { cubicStiffness: { k3NPerM3: -1e16, springIndex: 0 } } }],
  ])('rejects %s naming %s', (_name, field, scenario) => {
    try {
      simulateScenario(scenario as ScenarioInput, 1);
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      expect((e as EngineInputError).field).toBe(field);
    }
  });
});
