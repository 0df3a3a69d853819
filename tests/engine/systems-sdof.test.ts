/**
 * SDOF known answers. Source of every analytic value: standard vibration textbook results for
 * the viscously damped single-degree-of-freedom oscillator (e.g. S. S. Rao, Mechanical
 * Vibrations): receptance 1/(k − mω² + jcω), phase −90° and |H| = 1/(2ζk) at ω_n, peak
 * 1/(2ζk·sqrt(1 − ζ²)) at ω_n·sqrt(1 − 2ζ²), half-power bandwidth ≈ 2ζf_n.
 */
import { buildSystem, type SystemSpec } from '@/shared/engine/systems';
import { EngineInputError } from '@/shared/engine/errors';

const k = 8.0e4; // N/m
const m = 2.0; // kg
const zeta = 0.02;
const omegaN = Math.sqrt(k / m);
const fn = omegaN / (2 * Math.PI);
const c = 2 * zeta * Math.sqrt(k * m);

const physicalForm: SystemSpec = { kind: 'sdof', quantity: 'receptance', massKg: m, stiffnessNPerM: k, dampingNsPerM: c };
const modalForm: SystemSpec = { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: fn, dampingRatio: zeta, stiffnessNPerM: k };

const magnitudeAt = (spec: SystemSpec, f: number) => {
  const h = buildSystem(spec).frf(Float64Array.of(f));
  return Math.hypot(h.re[0], h.im[0]);
};

/** Golden-section maximum of a unimodal function on [a, b]. */
function maximise(g: (x: number) => number, a: number, b: number): number {
  const r = (Math.sqrt(5) - 1) / 2;
  for (let i = 0; i < 300; i++) {
    const x1 = b - r * (b - a);
    const x2 = a + r * (b - a);
    if (g(x1) >= g(x2)) b = x2;
    else a = x1;
  }
  return (a + b) / 2;
}

/** Bisection for g(x) = target on [a, b] with a sign change. */
function solve(g: (x: number) => number, target: number, a: number, b: number): number {
  const sa = Math.sign(g(a) - target);
  for (let i = 0; i < 200; i++) {
    const mid = (a + b) / 2;
    if (Math.sign(g(mid) - target) === sa) a = mid;
    else b = mid;
  }
  return (a + b) / 2;
}

describe('SDOF receptance (textbook results, e.g. S. S. Rao, Mechanical Vibrations)', () => {
  it('matches 1/(k − mω² + jcω) at arbitrary frequencies', () => {
    const f = Float64Array.of(0, 3.3, fn, 47.1, 250);
    const h = buildSystem(physicalForm).frf(f);
    f.forEach((fi, i) => {
      const w = 2 * Math.PI * fi;
      const dr = k - m * w * w;
      const di = c * w;
      const d = dr * dr + di * di;
      expect(h.re[i]).toBeCloseTo(dr / d, 15);
      expect(Math.abs(h.im[i] - -di / d)).toBeLessThanOrEqual(1e-15 * Math.abs(di / d) + 1e-300);
    });
    // Static receptance 1/k.
    expect(h.re[0] * k).toBeCloseTo(1, 14);
  });

  it('has phase −90° and |H| = 1/(2ζk) at ω_n', () => {
    const h = buildSystem(physicalForm).frf(Float64Array.of(fn));
    const phaseDeg = (Math.atan2(h.im[0], h.re[0]) * 180) / Math.PI;
    expect(Math.abs(phaseDeg + 90)).toBeLessThan(1e-9);
    expect(Math.abs(Math.hypot(h.re[0], h.im[0]) * 2 * zeta * k - 1)).toBeLessThan(1e-12);
  });

  it('peaks at ω_n·sqrt(1 − 2ζ²) with 1/(2ζk·sqrt(1 − ζ²))', () => {
    const fPeak = maximise((f) => magnitudeAt(physicalForm, f), 0.9 * fn, 1.1 * fn);
    expect(Math.abs(fPeak / (fn * Math.sqrt(1 - 2 * zeta * zeta)) - 1)).toBeLessThan(1e-7);
    const peak = magnitudeAt(physicalForm, fn * Math.sqrt(1 - 2 * zeta * zeta));
    expect(Math.abs(peak * 2 * zeta * k * Math.sqrt(1 - zeta * zeta) - 1)).toBeLessThan(1e-12);
  });

  it('has a half-power bandwidth ≈ 2ζ·f_n (to O(ζ²)) and reports 2ζ·f_n', () => {
    const system = buildSystem(physicalForm);
    const peak = 1 / (2 * zeta * k * Math.sqrt(1 - zeta * zeta));
    const g = (f: number) => magnitudeAt(physicalForm, f);
    const fPeak = fn * Math.sqrt(1 - 2 * zeta * zeta);
    const f1 = solve(g, peak / Math.SQRT2, 0.8 * fn, fPeak);
    const f2 = solve(g, peak / Math.SQRT2, fPeak, 1.2 * fn);
    // The exact width differs from 2ζf_n by a relative O(ζ²) = 4e-4 here.
    expect(Math.abs((f2 - f1) / (2 * zeta * fn) - 1)).toBeLessThan(1e-3);
    expect(system.modes[0].halfPowerBandwidthHz).toBeCloseTo(2 * zeta * fn, 12);
  });

  it('gives the same system from (m, k, c) and from (f_n, ζ, k)', () => {
    const f = Float64Array.from({ length: 40 }, (_, i) => i * 1.7);
    const a = buildSystem(physicalForm).frf(f);
    const b = buildSystem(modalForm).frf(f);
    for (let i = 0; i < f.length; i++) {
      const rel = Math.hypot(a.re[i] - b.re[i], a.im[i] - b.im[i]) / Math.hypot(a.re[i], a.im[i]);
      expect(rel).toBeLessThan(1e-13);
    }
  });

  it('reports natural and damped frequencies and decay times ln(1/ε)/(ζω_n)', () => {
    const [mode] = buildSystem(modalForm).modes;
    expect(mode.naturalFrequencyHz).toBeCloseTo(fn, 12);
    expect(mode.dampingRatio).toBeCloseTo(zeta, 14);
    expect(mode.dampedFrequencyHz / fn).toBeCloseTo(Math.sqrt(1 - zeta * zeta), 14);
    // ln(100) = 4.60517, ln(1000) = 6.90776, ln(1e6) = 13.8155 (docs/engine.md: t ≈ 13.8/(ζω_n)).
    expect(mode.decayTimeS.to1Percent * zeta * omegaN).toBeCloseTo(4.60517, 5);
    expect(mode.decayTimeS.to01Percent * zeta * omegaN).toBeCloseTo(6.90776, 5);
    expect(mode.decayTimeS.to1e6 * zeta * omegaN).toBeCloseTo(13.81551, 5);
  });
});

describe('FRF quantities: mobility jω·H, accelerance −ω²·H (textbook relations)', () => {
  const f = Float64Array.from({ length: 30 }, (_, i) => 0.5 + i * 2.3);
  const h = buildSystem(physicalForm).frf(f);
  const y = buildSystem({ ...physicalForm, quantity: 'mobility' }).frf(f);
  const a = buildSystem({ ...physicalForm, quantity: 'accelerance' }).frf(f);

  it('relates the three quantities line by line', () => {
    for (let i = 0; i < f.length; i++) {
      const w = 2 * Math.PI * f[i];
      const scale = Math.hypot(h.re[i], h.im[i]);
      expect(Math.abs(y.re[i] - -w * h.im[i])).toBeLessThan(1e-14 * w * scale);
      expect(Math.abs(y.im[i] - w * h.re[i])).toBeLessThan(1e-14 * w * scale);
      expect(Math.abs(a.re[i] + w * w * h.re[i])).toBeLessThan(1e-14 * w * w * scale);
      expect(Math.abs(a.im[i] + w * w * h.im[i])).toBeLessThan(1e-14 * w * w * scale);
    }
  });

  it('has mobility 1/c (real) at ω_n and accelerance → 1/m (mass line) far above resonance', () => {
    const mob = buildSystem({ ...physicalForm, quantity: 'mobility' }).frf(Float64Array.of(fn));
    expect(mob.re[0] * c).toBeCloseTo(1, 12);
    expect(Math.abs(mob.im[0] * c)).toBeLessThan(1e-10);
    const acc = buildSystem({ ...physicalForm, quantity: 'accelerance' }).frf(Float64Array.of(1e4 * fn));
    expect(acc.re[0] * m).toBeCloseTo(1, 6);
  });

  it('names the SI unit of each quantity', () => {
    expect(buildSystem(physicalForm).unit).toBe('m/N');
    expect(buildSystem({ ...physicalForm, quantity: 'mobility' }).unit).toBe('m/(N·s)');
    expect(buildSystem({ ...physicalForm, quantity: 'accelerance' }).unit).toBe('m/(N·s²)');
    expect(buildSystem(physicalForm).antiResonancesHz).toEqual([]);
  });
});

describe('SDOF spec validation', () => {
  const cases: [string, string, unknown][] = [
    ['both forms', 'system.naturalFrequencyHz', { ...physicalForm, naturalFrequencyHz: 10, dampingRatio: 0.01 }],
    ['fn without ζ', 'system.dampingRatio', { kind: 'sdof', quantity: 'receptance', stiffnessNPerM: k, naturalFrequencyHz: 10 }],
    ['ζ without fn', 'system.naturalFrequencyHz', { kind: 'sdof', quantity: 'receptance', stiffnessNPerM: k, dampingRatio: 0.1 }],
    ['no mass', 'system.massKg', { kind: 'sdof', quantity: 'receptance', stiffnessNPerM: k, dampingNsPerM: 3 }],
    ['no damping', 'system.dampingNsPerM', { kind: 'sdof', quantity: 'receptance', stiffnessNPerM: k, massKg: 3 }],
    ['overdamped', 'system.dampingNsPerM', { ...physicalForm, dampingNsPerM: 2 * Math.sqrt(k * m) }],
    ['ζ ≥ 1', 'system.dampingRatio', { ...modalForm, dampingRatio: 1 }],
    ['ζ = 0', 'system.dampingRatio', { ...modalForm, dampingRatio: 0 }],
    ['negative stiffness', 'system.stiffnessNPerM', { ...physicalForm, stiffnessNPerM: -1 }],
    ['unknown field', 'system', { ...physicalForm, colour: 'red' }],
    ['bad quantity', 'system.quantity', { ...physicalForm, quantity: 'compliance' }],
    ['bad kind', 'system.kind', { ...physicalForm, kind: 'beam' }],
    ['infinite mass', 'system.massKg', { ...physicalForm, massKg: Infinity }],
  ];
  it.each(cases)('rejects %s naming %s', (_name, field, spec) => {
    let error: unknown;
    try {
      buildSystem(spec as SystemSpec);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(EngineInputError);
    expect((error as EngineInputError).field).toBe(field);
  });
});
