/**
 * The exponential-window reference against a direct evaluation: for an SDOF, H(s) = 1/(m s² + c s + k),
 * so the windowed FRF must equal H(jω + a), a = 1/τ (Laplace shift theorem); mobility and
 * accelerance carry (jω + a) and (jω + a)². The shifted pole's damping is ζ + a/ω_n to first
 * order (the added damping 1/(ω_n τ) of an exponential window, common practice, quoted from memory).
 */
import { exponentialWindowReference } from '@/shared/engine/scores/windowed-reference';
import { modeErrors } from '@/shared/engine/scores/modes';
import { systemModalTerms, type SystemSpec } from '@/shared/engine/systems';
import { lines, sdofModeFacts, sdofReceptance } from './scores-helpers';

const m = 1.5;
const k = 1.5 * (2 * Math.PI * 60) ** 2;
const zeta = 0.01;
const c = 2 * zeta * Math.sqrt(k * m);
const tau = 0.5; // s

/** H(s)·s^p at s = a + jω, evaluated directly. */
function shiftedDirect(fHz: number, a: number, p: number): [number, number] {
  const w = 2 * Math.PI * fHz;
  const sr = a;
  const si = w;
  const s2r = sr * sr - si * si;
  const s2i = 2 * sr * si;
  const dr = m * s2r + c * sr + k;
  const di = m * s2i + c * si;
  const d = dr * dr + di * di;
  let hr = dr / d;
  let hi = -di / d;
  for (let i = 0; i < p; i++) [hr, hi] = [hr * sr - hi * si, hr * si + hi * sr];
  return [hr, hi];
}

describe('exponentialWindowReference', () => {
  const quantities = ['receptance', 'mobility', 'accelerance'] as const;
  it.each(quantities.map((q, p) => [q, p] as const))('%s equals H(jω + a)·(jω + a)^p to 1e-10', (quantity, p) => {
    const spec: SystemSpec = { kind: 'sdof', quantity, massKg: m, stiffnessNPerM: k, dampingNsPerM: c };
    const ref = exponentialWindowReference(systemModalTerms(spec), quantity, tau);
    const f = Float64Array.of(5, 30, 59.5, 60, 61, 200);
    const h = ref.frf(f);
    for (let i = 0; i < f.length; i++) {
      const [er, ei] = shiftedDirect(f[i], 1 / tau, p);
      const scale = Math.hypot(er, ei);
      expect(Math.abs(h.re[i] - er) / scale).toBeLessThan(1e-10);
      expect(Math.abs(h.im[i] - ei) / scale).toBeLessThan(1e-10);
    }
  });

  it('adds damping 1/(ω_n τ) to the mode, to first order in a/ω_n', () => {
    const spec: SystemSpec = { kind: 'sdof', quantity: 'receptance', massKg: m, stiffnessNPerM: k, dampingNsPerM: c };
    const ref = exponentialWindowReference(systemModalTerms(spec), 'receptance', tau);
    const added = 1 / (2 * Math.PI * 60 * tau);
    expect(ref.modes[0].dampingRatio).toBeCloseTo(zeta + added, 5);
    expect(ref.decayRatePerS).toBe(2);
  });

  it('rejects a non-positive decay time', () => {
    const spec: SystemSpec = { kind: 'sdof', quantity: 'receptance', massKg: m, stiffnessNPerM: k, dampingNsPerM: c };
    expect(() => exponentialWindowReference(systemModalTerms(spec), 'receptance', 0)).toThrow(/tauS/);
  });
});

describe('modeErrors with a damping correction', () => {
  it('subtracts the correction at the peak frequency from the half-power damping', () => {
    const sdof = { m: 1, k: (2 * Math.PI * 40) ** 2, zeta: 0.01 };
    const mode = sdofModeFacts(sdof);
    const f = lines(8000, 0.01);
    const est = sdofReceptance(sdof, f);
    const plain = modeErrors({ frequenciesHz: f, estimate: est, modes: [mode], band: { start: 1, end: 8000 } })[0];
    const corrected = modeErrors({
      frequenciesHz: f,
      estimate: est,
      modes: [mode],
      band: { start: 1, end: 8000 },
      dampingCorrection: () => 0.002,
    })[0];
    expect(corrected.estimatedDampingRatio!).toBeCloseTo(plain.estimatedDampingRatio! - 0.002, 14);
    expect(corrected.dampingErrorPercent!).toBeCloseTo(plain.dampingErrorPercent! - 20, 10);
  });
});
