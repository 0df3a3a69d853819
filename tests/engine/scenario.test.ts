/**
 * Scenario parsing, defaults, determinism and every validation rule (each names its field).
 * Analytic check: the reference is the system's own exact FRF (SDOF receptance
 * 1/(k − mω² + jcω), e.g. S. S. Rao, Mechanical Vibrations).
 */
import { parseScenario, resolveScenario, simulateScenario, type ScenarioInput } from '@/shared/engine/scenario';
import { EngineInputError } from '@/shared/engine/errors';

const base: ScenarioInput = {
  name: 'Harbor Ridge Test Lab — drone motor arm, first mode',
  description: 'One lightly damped mode near 340 Hz.',
  expectation: 'H1 within 0.5 dB in the band.',
  system: { kind: 'sdof', quantity: 'accelerance', naturalFrequencyHz: 340, dampingRatio: 0.01, stiffnessNPerM: 4e5 },
  acquisition: { sampleRateHz: 2048, durationS: 4 },
  excitation: { kind: 'random', band: { lowHz: 50, highHz: 800 }, level: { rmsN: 4 } },
};

const bytes = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

function fieldOf(run: () => unknown): string | undefined {
  try {
    run();
  } catch (e) {
    if (e instanceof EngineInputError) return e.field;
    throw e;
  }
  return undefined;
}

describe('parseScenario', () => {
  it('fills in the defaults', () => {
    const s = parseScenario({
      ...base,
      excitation: { kind: 'burst-random', band: { lowHz: 50, highHz: 800 }, blockLengthS: 0.5, burstFraction: 0.5, level: { rmsN: 1 } },
      errors: { quantisation: { bits: 16 }, cubicStiffness: { k3NPerM3: 1 } },
    });
    expect(s.errors.quantisation).toEqual({ bits: 16, inputFullScale: 'auto', outputFullScale: 'auto' });
    expect(s.errors.cubicStiffness).toEqual({ k3NPerM3: 1, springIndex: 0, oversampling: 16 });
    expect(s.excitation).toMatchObject({ offsetS: 0 });
    expect(parseScenario(base).errors).toEqual({});
    const chirp = parseScenario({ ...base, excitation: { kind: 'chirp', band: { lowHz: 50, highHz: 800 }, periodS: 1, level: { rmsN: 1 } } });
    expect(chirp.excitation).toMatchObject({ sweep: 'linear' });
    const periodic = parseScenario({ ...base, excitation: { kind: 'periodic-random', band: { lowHz: 50, highHz: 800 }, periodS: 0.5, level: { rmsN: 1 } } });
    expect(periodic.excitation).toMatchObject({ periodsPerRealisation: 3 });
  });

  it('chooses steady state for stationary kinds and rest for burst random and impact', () => {
    expect(resolveScenario(base).plan.start).toBe('steady-state');
    const impact = { ...base, excitation: { kind: 'impact', pulseDurationS: 0.01, periodS: 1, level: { peakN: 10 } } };
    expect(resolveScenario(impact).plan.start).toBe('from-rest');
    expect(resolveScenario({ ...base, acquisition: { ...base.acquisition, start: 'from-rest' } }).plan.start).toBe('from-rest');
  });
});

describe('simulateScenario', () => {
  const noisy: ScenarioInput = {
    ...base,
    errors: { inputNoise: { snrDb: 30 }, outputNoise: { psd: 1e-3 }, delayS: 1e-4, quantisation: { bits: 14 } },
  };

  it('is deterministic: the same seed gives identical Float64 bytes, another seed does not', () => {
    const a = simulateScenario(noisy, 17);
    const b = simulateScenario(noisy, 17);
    const c = simulateScenario(noisy, 18);
    expect(bytes(a.input).equals(bytes(b.input))).toBe(true);
    expect(bytes(a.output).equals(bytes(b.output))).toBe(true);
    expect(bytes(a.input).equals(bytes(c.input))).toBe(false);
    expect(bytes(a.output).equals(bytes(c.output))).toBe(false);
  });

  it('returns N samples per channel with units and the exact linear reference', () => {
    const r = simulateScenario(base, 1);
    expect(r.sampleRateHz).toBe(2048);
    expect(r.input).toHaveLength(8192);
    expect(r.output).toHaveLength(8192);
    expect(r.inputUnit).toBe('N');
    expect(r.outputUnit).toBe('m/s²');
    expect(r.reference.unit).toBe('m/(N·s²)');
    expect(r.referenceNote).toBeUndefined();
    expect(r.report).toEqual({ inputClippedSamples: 0, outputClippedSamples: 0, nonlinear: false, warnings: [] });
    // Accelerance −ω²/(k − mω² + jcω) at 200 Hz.
    const m = 4e5 / (2 * Math.PI * 340) ** 2;
    const c = 2 * 0.01 * Math.sqrt(4e5 * m);
    const w = 2 * Math.PI * 200;
    const h = r.reference.frf(Float64Array.of(200));
    const dr = 4e5 - m * w * w;
    const di = c * w;
    const d = dr * dr + di * di;
    expect(h.re[0] / ((-w * w * dr) / d)).toBeCloseTo(1, 12);
    expect(h.im[0] / ((w * w * di) / d)).toBeCloseTo(1, 12);
  });

  it('reports the units of the other quantities', () => {
    expect(simulateScenario({ ...base, system: { ...base.system, quantity: 'receptance' } }, 1).outputUnit).toBe('m');
    expect(simulateScenario({ ...base, system: { ...base.system, quantity: 'mobility' } }, 1).outputUnit).toBe('m/s');
  });

  it('warns about transients the record cannot hold', () => {
    const slow = { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 20, dampingRatio: 0.005, stiffnessNPerM: 1e4 } as const;
    const burst = simulateScenario(
      { ...base, system: slow, excitation: { kind: 'burst-random', band: { lowHz: 5, highHz: 200 }, blockLengthS: 1, burstFraction: 0.5, level: { rmsN: 1 } } },
      1,
    );
    expect(burst.report.warnings.join('\n')).toMatch(/off-time is shorter than the 1 % decay time/);
    expect(burst.report.warnings.join('\n')).toMatch(/record ends before the response decays/);
    const impact = simulateScenario({ ...base, system: slow, excitation: { kind: 'impact', pulseDurationS: 0.002, periodS: 1, level: { peakN: 10 } } }, 1);
    expect(impact.report.warnings.join('\n')).toMatch(/period is shorter than the 1 % decay time/);
    expect(impact.report.warnings.join('\n')).toMatch(/pulse lasts 4.1 samples/);
    const rounded = resolveScenario({ ...base, acquisition: { sampleRateHz: 2048, durationS: 4.0001 } });
    expect(rounded.plan.warnings.join('\n')).toMatch(/rounded to 8192 samples/);
    const long = resolveScenario({ ...base, excitation: { kind: 'pseudo-random', band: { lowHz: 50, highHz: 800 }, periodS: 8, level: { rmsN: 1 } } });
    expect(long.plan.warnings.join('\n')).toMatch(/longer than the record/);
  });
});

describe('scenario validation (each rule names its field)', () => {
  const band = { lowHz: 50, highHz: 800 };
  const with_ = (patch: Record<string, unknown>) => ({ ...base, ...patch });
  const excitation = (e: Record<string, unknown>) => with_({ excitation: { band, level: { rmsN: 1 }, ...e } });
  const errors = (e: Record<string, unknown>) => with_({ errors: e });
  const impact = (e: Record<string, unknown>) =>
    with_({ excitation: { kind: 'impact', pulseDurationS: 0.01, periodS: 1, level: { peakN: 1 }, ...e } });
  const cases: [string, string, unknown][] = [
    ['no name', 'name', { ...base, name: '' }],
    ['an unknown top-level field', 'scenario', { ...base, colour: 'red' }],
    ['a bad system', 'system.kind', with_({ system: { kind: 'beam' } })],
    ['a zero sample rate', 'acquisition.sampleRateHz', with_({ acquisition: { sampleRateHz: 0, durationS: 1 } })],
    ['too short a record', 'acquisition.durationS', with_({ acquisition: { sampleRateHz: 2048, durationS: 0.01 } })],
    ['too long a record', 'acquisition.durationS', with_({ acquisition: { sampleRateHz: 2048, durationS: 5000 } })],
    ['an unknown start', 'acquisition.start', with_({ acquisition: { sampleRateHz: 2048, durationS: 4, start: 'warm' } })],
    ['a band above Nyquist', 'excitation.band.highHz', excitation({ kind: 'random', band: { lowHz: 10, highHz: 1024 } })],
    ['a reversed band', 'excitation.band.lowHz', excitation({ kind: 'random', band: { lowHz: 900, highHz: 800 } })],
    ['an unknown excitation', 'excitation.kind', excitation({ kind: 'sine' })],
    ['a level with both forms', 'excitation.level', excitation({ kind: 'random', level: { rmsN: 1, peakN: 2 } })],
    ['a log sweep from 0 Hz', 'excitation.band.lowHz', excitation({ kind: 'chirp', band: { lowHz: 0, highHz: 800 }, periodS: 1, sweep: 'log' })],
    ['a period of part samples', 'excitation.periodS', excitation({ kind: 'pseudo-random', periodS: 0.0001 })],
    ['a period not a power of two', 'excitation.periodS', excitation({ kind: 'periodic-random', periodS: 0.75 })],
    ['a band between two lines', 'excitation.band', excitation({ kind: 'pseudo-random', periodS: 0.125, band: { lowHz: 101, highHz: 103 } })],
    ['a steady-state chirp period not a power of two', 'excitation.periodS', excitation({ kind: 'chirp', periodS: 0.75 })],
    ['a burst outside its block', 'excitation.offsetS', excitation({ kind: 'burst-random', blockLengthS: 0.5, burstFraction: 0.5, offsetS: 0.3 })],
    ['a burst block of part samples', 'excitation.blockLengthS', excitation({ kind: 'burst-random', blockLengthS: 0.10001, burstFraction: 0.5 })],
    ['a steady-state burst block not a power of two', 'excitation.blockLengthS', with_({ acquisition: { ...base.acquisition, start: 'steady-state' }, excitation: { kind: 'burst-random', band, blockLengthS: 0.75, burstFraction: 0.5, level: { rmsN: 1 } } })],
    ['a burst fraction of 0', 'excitation.burstFraction', excitation({ kind: 'burst-random', blockLengthS: 0.5, burstFraction: 0 })],
    ['an impact pulse under 2 samples', 'excitation.pulseDurationS', impact({ pulseDurationS: 0.0005 })],
    ['an impact outside its period', 'excitation.offsetS', impact({ offsetS: 0.995 })],
    ['a default-offset pulse longer than its period', 'excitation.pulseDurationS', impact({ pulseDurationS: 0.99 })],
    ['a second hit outside the period', 'excitation.doubleHit.delayS', impact({ doubleHit: { delayS: 0.97, amplitudeRatio: 0.5 } })],
    ['a second hit louder than the first', 'excitation.doubleHit.amplitudeRatio', impact({ doubleHit: { delayS: 0.01, amplitudeRatio: 1.5 } })],
    ['no force in the record', 'excitation', with_({ acquisition: { sampleRateHz: 2048, durationS: 0.25 }, excitation: { kind: 'impact', pulseDurationS: 0.01, periodS: 1, offsetS: 0.5, level: { peakN: 1 } } })],
    ['a delay as long as the record', 'errors.delayS', errors({ delayS: 4 })],
    ['a zero gain', 'errors.gainMismatch', errors({ gainMismatch: 0 })],
    ['a phase beyond 180°', 'errors.phaseMismatchDeg', errors({ phaseMismatchDeg: 200 })],
    ['an SNR band above Nyquist', 'errors.outputNoise.bandHz.highHz', errors({ outputNoise: { snrDb: 20, bandHz: { lowHz: 0, highHz: 2000 } } })],
    ['noise with both forms', 'errors.inputNoise', errors({ inputNoise: { snrDb: 20, psd: 1 } })],
    ['a negative PSD', 'errors.inputNoise.psd', errors({ inputNoise: { psd: -1 } })],
    ['1-bit quantisation', 'errors.quantisation.bits', errors({ quantisation: { bits: 1 } })],
    ['a zero ADC range', 'errors.quantisation.inputFullScale', errors({ quantisation: { bits: 12, inputFullScale: 0 } })],
    ['empty clipping', 'errors.clipping', errors({ clipping: {} })],
    ['an unknown error source', 'errors', errors({ hum: 50 })],
    ['decay padding beyond 2^24 samples', 'acquisition.durationS', with_({ system: { ...base.system, dampingRatio: 1e-7 }, acquisition: { sampleRateHz: 2048, durationS: 4, start: 'from-rest' } })],
    ['an oversampled force table beyond memory', 'errors.cubicStiffness.oversampling', with_({ acquisition: { sampleRateHz: 2048, durationS: 4000 }, errors: { cubicStiffness: { k3NPerM3: 1, oversampling: 4 } } })],
  ];
  it.each(cases)('rejects %s naming %s', (_name, field, scenario) => {
    expect(fieldOf(() => simulateScenario(scenario as ScenarioInput, 1))).toBe(field);
  });

  it('rejects a bad seed', () => {
    expect(fieldOf(() => simulateScenario(base, -3))).toBe('seed');
    expect(fieldOf(() => simulateScenario(base, 0.5))).toBe('seed');
  });

  it('reduces the oversampling with a warning when the force table would be too large', () => {
    const plan = resolveScenario({ ...base, acquisition: { sampleRateHz: 2048, durationS: 1000 }, errors: { cubicStiffness: { k3NPerM3: 1 } } }).plan;
    expect(plan.oversampling).toBe(8);
    expect(plan.warnings.join('\n')).toMatch(/oversampling reduced from 16 to 8/);
  });
});
