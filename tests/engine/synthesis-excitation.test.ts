/**
 * Excitation signals. Sources:
 * - DFT identities (band-limited construction: nothing outside the band's lines);
 * - the normal distribution's kurtosis 3 (sum of many independent lines, central limit theorem);
 * - stationary phase for sweeps: a sweep spends time ∝ 1/(df/dt) at each frequency, so a linear
 *   sweep puts equal energy in equal bandwidths and a log sweep equal energy per octave
 *   (e.g. A. Papoulis, The Fourier Integral and its Applications, 1962);
 * - the Fourier transform of a half-sine pulse of duration d and height A,
 *   |F(f)| = (2Ad/π)·|cos(πfd)/(1 − 4f²d²)| (standard transform tables).
 */
import { bandLimitedRandom, excitationSamples, levelFactor, multisinePeriod } from '@/shared/engine/synthesis/excitation';
import { EngineInputError } from '@/shared/engine/errors';
import type { ExcitationSpec } from '@/shared/engine/synthesis/excitation-schema';
import { createRandom } from '@/shared/engine/random';
import { realFft } from '@/shared/engine/fft';
import { simulateScenario, type ScenarioInput } from '@/shared/engine/scenario';

const fs = 1024;
const random = (seed = 1) => createRandom(seed, 'excitation');
const magnitude = (x: Float64Array) => {
  const s = realFft(x);
  return Float64Array.from(s.re, (re, k) => Math.hypot(re, s.im[k]));
};
const rms = (x: Float64Array) => Math.sqrt(x.reduce((a, v) => a + v * v, 0) / x.length);

describe('random', () => {
  const spec: ExcitationSpec = { kind: 'random', band: { lowHz: 20, highHz: 300 }, level: { rmsN: 1 } };
  const length = 65536;
  const x = excitationSamples(spec, length, fs, random());

  it('has lines only inside the band (DFT of the construction)', () => {
    const m = magnitude(x);
    const largest = Math.max(...m);
    let outside = 0;
    let smallestInside = Infinity;
    m.forEach((v, k) => {
      const f = (k * fs) / length;
      if (f < 20 || f > 300) outside = Math.max(outside, v);
      else smallestInside = Math.min(smallestInside, v);
    });
    expect(outside).toBeLessThan(1e-12 * largest);
    expect(smallestInside).toBeGreaterThan(0);
  });

  it('is Gaussian: kurtosis 3 within sampling tolerance', () => {
    let m2 = 0;
    let m4 = 0;
    for (const v of x) {
      m2 += v * v;
      m4 += v ** 4;
    }
    const kurtosis = m4 / length / (m2 / length) ** 2;
    // Standard error sqrt(24/n) for n independent samples; band-limiting to 55 % of the lines
    // leaves about 0.55·n independent values, so allow 4·sqrt(24/(0.55 n)).
    expect(Math.abs(kurtosis - 3)).toBeLessThan(4 * Math.sqrt(24 / (0.55 * length)));
  });

  it('scales exactly to an RMS or peak level over the record', () => {
    const base: ScenarioInput = {
      name: 'level',
      system: { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 50, dampingRatio: 0.05, stiffnessNPerM: 1e4 },
      acquisition: { sampleRateHz: fs, durationS: 3 },
      excitation: spec,
    };
    const a = simulateScenario({ ...base, excitation: { ...spec, level: { rmsN: 7.5 } } }, 2);
    expect(rms(a.input) / 7.5).toBeCloseTo(1, 12);
    const b = simulateScenario({ ...base, excitation: { ...spec, level: { peakN: 40 } } }, 2);
    expect(Math.max(...b.input.map(Math.abs))).toBeCloseTo(40, 10);
    expect(levelFactor({ rmsN: 2 }, Float64Array.of(1, -1, 1, -1), 4)).toBe(2);
  });
});

describe('burst random', () => {
  it('is zero outside each burst (to the Nyquist-line residue) and random inside', () => {
    const record = simulateScenario(
      {
        name: 'burst',
        system: { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 50, dampingRatio: 0.05, stiffnessNPerM: 1e4 },
        acquisition: { sampleRateHz: fs, durationS: 4 },
        excitation: { kind: 'burst-random', band: { lowHz: 5, highHz: 400 }, blockLengthS: 1, burstFraction: 0.25, offsetS: 0.125, level: { rmsN: 1 } },
      },
      3,
    );
    const level = rms(record.input);
    let off = 0;
    for (let n = 0; n < record.input.length; n++) {
      const inBlock = n % 1024;
      if (inBlock < 128 || inBlock >= 128 + 256) off = Math.max(off, Math.abs(record.input[n]));
    }
    expect(off).toBeLessThan(1e-3 * level);
    const burst = record.input.slice(128, 384);
    expect(rms(burst)).toBeGreaterThan(level); // all the energy sits in a quarter of the time
  });
});

describe('periodic random and pseudo-random', () => {
  const band = { lowHz: 10, highHz: 200 };
  const period = 512;

  it('periodic random repeats within a realisation and renews between them', () => {
    const spec: ExcitationSpec = { kind: 'periodic-random', band, periodS: period / fs, periodsPerRealisation: 3, level: { rmsN: 1 } };
    const x = excitationSamples(spec, 6 * period, fs, random(4));
    const scale = rms(x);
    let repeat = 0;
    for (let n = 0; n < 2 * period; n++) repeat = Math.max(repeat, Math.abs(x[n + period] - x[n]));
    expect(repeat).toBeLessThan(1e-12 * scale);
    let change = 0;
    for (let n = 0; n < period; n++) change = Math.max(change, Math.abs(x[n + 3 * period] - x[n]));
    expect(change).toBeGreaterThan(0.1 * scale);
    // One period holds only the lines k·fs/M of the band.
    const m = magnitude(x.slice(0, period));
    const largest = Math.max(...m);
    const outside = Math.max(...m.filter((_, k) => (k * fs) / period < 10 || (k * fs) / period > 200));
    expect(outside).toBeLessThan(1e-12 * largest);
  });

  it('pseudo-random repeats one flat-magnitude period over the whole record', () => {
    const spec: ExcitationSpec = { kind: 'pseudo-random', band, periodS: period / fs, level: { rmsN: 1 } };
    const x = excitationSamples(spec, 8 * period, fs, random(5));
    const scale = rms(x);
    let repeat = 0;
    for (let n = 0; n < 7 * period; n++) repeat = Math.max(repeat, Math.abs(x[n + period] - x[n]));
    expect(repeat).toBeLessThan(1e-12 * scale);
    const m = magnitude(x.slice(0, period));
    const first = Math.ceil((10 * period) / fs);
    const last = Math.floor((200 * period) / fs);
    let spread = 0;
    for (let k = first; k <= last; k++) spread = Math.max(spread, Math.abs(m[k] / m[first] - 1));
    expect(spread).toBeLessThan(1e-12);
  });
});

describe('chirp (stationary-phase energy distribution)', () => {
  const energyIn = (m: Float64Array, period: number, lo: number, hi: number) => {
    let e = 0;
    m.forEach((v, k) => {
      const f = (k * fs) / period;
      if (f >= lo && f < hi) e += v * v;
    });
    return e;
  };
  const period = 4096;

  it('a linear sweep puts its energy in the band, equally in equal bandwidths', () => {
    const x = excitationSamples({ kind: 'chirp', band: { lowHz: 50, highHz: 350 }, periodS: period / fs, sweep: 'linear', level: { rmsN: 1 } }, period, fs, random());
    const m = magnitude(x);
    const total = energyIn(m, period, 0, fs);
    expect(energyIn(m, period, 50, 350) / total).toBeGreaterThan(0.97);
    expect(energyIn(m, period, 50, 200) / energyIn(m, period, 200, 350)).toBeCloseTo(1, 1);
  });

  it('a log sweep puts equal energy in equal frequency ratios', () => {
    const x = excitationSamples({ kind: 'chirp', band: { lowHz: 25, highHz: 400 }, periodS: period / fs, sweep: 'log', level: { rmsN: 1 } }, period, fs, random());
    const m = magnitude(x);
    expect(energyIn(m, period, 25, 100) / energyIn(m, period, 100, 400)).toBeCloseTo(1, 1);
  });
});

describe('impact (Fourier transform of a half-sine pulse)', () => {
  const d = 40 / fs; // 40 samples
  const period = 1024;
  const spec: ExcitationSpec = { kind: 'impact', pulseDurationS: d, periodS: period / fs, offsetS: 0, level: { peakN: 1 } };

  it('has the half-sine pulse spectrum (2Ad/π)|cos(πfd)/(1 − 4f²d²)| at low frequency', () => {
    const x = excitationSamples(spec, period, fs, random());
    const s = realFft(x);
    for (const f of [0, 4, 10, 20, 30]) {
      const k = Math.round((f * period) / fs);
      const fk = (k * fs) / period;
      const expected = ((2 * d) / Math.PI) * Math.abs(Math.cos(Math.PI * fk * d) / (1 - 4 * fk * fk * d * d));
      // DFT/fs approximates the continuous transform (rectangle rule on 40 samples) and the
      // Nyquist balancing alters samples by ±1/40²: together well under 0.5 %.
      expect(Math.abs(Math.hypot(s.re[k], s.im[k]) / fs / expected - 1)).toBeLessThan(5e-3);
    }
  });

  it('repeats every period and adds a second hit of the given amplitude ratio', () => {
    const x = excitationSamples(
      { ...spec, doubleHit: { delayS: 100 / fs, amplitudeRatio: 0.3 } },
      3 * period,
      fs,
      random(),
    );
    let repeat = 0;
    for (let n = 0; n < 2 * period; n++) repeat = Math.max(repeat, Math.abs(x[n + period] - x[n]));
    expect(repeat).toBeLessThan(1e-14);
    const first = Math.max(...x.slice(0, 60));
    const second = Math.max(...x.slice(90, 160));
    // Nyquist balancing scales samples by (1 ± α), |α| ≈ 1/(40²) here.
    expect(second / first).toBeCloseTo(0.3, 3);
    expect(Math.abs(x[80])).toBe(0);
  });
});

describe('excitation input rules', () => {
  const narrow = { lowHz: 100.01, highHz: 100.02 }; // between two lines of either grid below
  it.each([
    ['random', () => bandLimitedRandom(narrow, 4096, fs, random())],
    ['multisine', () => multisinePeriod(narrow, 512, fs, random(), 'flat')],
    ['a random scenario', () =>
      simulateScenario(
        {
          name: 'narrow',
          system: { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 50, dampingRatio: 0.05, stiffnessNPerM: 1e4 },
          acquisition: { sampleRateHz: fs, durationS: 4 },
          excitation: { kind: 'random', band: narrow, level: { rmsN: 1 } },
        },
        1,
      )],
  ])('rejects a band without lines for %s, naming excitation.band', (_name, run) => {
    try {
      run();
      throw new Error('no error');
    } catch (e) {
      expect(e).toBeInstanceOf(EngineInputError);
      expect((e as EngineInputError).field).toBe('excitation.band');
    }
  });
});
