/**
 * Modal superposition against the SDOF closed form and across its three equivalent inputs.
 * Source: partial-fraction identity R/(ω_r² − ω² + 2jζω_rω) = A/(jω − λ) + conj(A)/(jω − conj λ)
 * with A = R/(2jω_d), λ = −ζω_r + jω_d (standard modal analysis result, e.g. D. J. Ewins, Modal
 * Testing: Theory, Practice and Application, 2000); SDOF receptance 1/(k − mω² + jcω) (e.g.
 * S. S. Rao, Mechanical Vibrations).
 */
import { buildSystem, type SystemSpec } from '@/shared/engine/systems';
import { EngineInputError } from '@/shared/engine/errors';

const f = Float64Array.from({ length: 300 }, (_, i) => i * 0.9);

function maxRelativeDifference(a: { re: Float64Array; im: Float64Array }, b: { re: Float64Array; im: Float64Array }) {
  let worst = 0;
  for (let i = 0; i < a.re.length; i++) {
    worst = Math.max(worst, Math.hypot(a.re[i] - b.re[i], a.im[i] - b.im[i]) / Math.hypot(a.re[i], a.im[i]));
  }
  return worst;
}

describe('modal superposition (partial fractions of the SDOF receptance)', () => {
  const m = 0.8;
  const fn = 57.3;
  const zeta = 0.015;
  const wn = 2 * Math.PI * fn;
  const wd = wn * Math.sqrt(1 - zeta * zeta);
  const sdof: SystemSpec = { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: fn, dampingRatio: zeta, stiffnessNPerM: m * wn * wn };

  it('equals the SDOF receptance for one mode with modal constant 1/m', () => {
    const modal = buildSystem({ kind: 'modal', quantity: 'receptance', modes: [{ naturalFrequencyHz: fn, dampingRatio: zeta, modalConstant: 1 / m }] });
    expect(maxRelativeDifference(buildSystem(sdof).frf(f), modal.frf(f))).toBeLessThan(1e-12);
  });

  it('gives the same FRF from a modal constant, the residue R/(2jω_d) and a mode shape', () => {
    const forms: SystemSpec[] = [
      { kind: 'modal', quantity: 'mobility', modes: [{ naturalFrequencyHz: fn, dampingRatio: zeta, modalConstant: 0.6 / m }] },
      { kind: 'modal', quantity: 'mobility', modes: [{ naturalFrequencyHz: fn, dampingRatio: zeta, residue: { re: 0, im: -0.6 / m / (2 * wd) } }] },
      { kind: 'modal', quantity: 'mobility', modes: [{ naturalFrequencyHz: fn, dampingRatio: zeta, shape: { atInput: 1.2, atOutput: 0.5, modalMassKg: m } }] },
    ];
    const [a, b, c] = forms.map((s) => buildSystem(s).frf(f.subarray(1)));
    expect(maxRelativeDifference(a, b)).toBeLessThan(1e-13);
    expect(maxRelativeDifference(a, c)).toBeLessThan(1e-13);
  });

  it('sorts modes by natural frequency and reports the minimum between them', () => {
    const system = buildSystem({
      kind: 'modal',
      quantity: 'receptance',
      modes: [
        { naturalFrequencyHz: 120, dampingRatio: 0.01, modalConstant: 2 },
        { naturalFrequencyHz: 40, dampingRatio: 0.02, modalConstant: 1 },
      ],
    });
    expect(system.modes.map((x) => x.naturalFrequencyHz)).toEqual([40, 120]);
    // Two modes with modal constants of the same sign: an anti-resonance where the terms cancel,
    // 1/(40² − f²) + 2/(120² − f²) = 0 ⇒ f² = (120² + 2·40²)/3 (undamped; damping moves it by O(ζ²)).
    const undamped = Math.sqrt((120 ** 2 + 2 * 40 ** 2) / 3);
    expect(system.antiResonancesHz).toHaveLength(1);
    expect(Math.abs(system.antiResonancesHz[0] / undamped - 1)).toBeLessThan(1e-3);
  });
});

describe('modal spec validation', () => {
  const mode = { naturalFrequencyHz: 10, dampingRatio: 0.02, modalConstant: 1 };
  const cases: [string, string, unknown][] = [
    ['no modes', 'system.modes', { kind: 'modal', quantity: 'receptance', modes: [] }],
    ['two residue forms', 'system.modes.0.residue', { kind: 'modal', quantity: 'receptance', modes: [{ ...mode, residue: { re: 1, im: 0 } }] }],
    ['no residue form', 'system.modes.0.modalConstant', { kind: 'modal', quantity: 'receptance', modes: [{ naturalFrequencyHz: 10, dampingRatio: 0.02 }] }],
    ['a zero modal constant', 'system.modes.0.modalConstant', { kind: 'modal', quantity: 'receptance', modes: [{ ...mode, modalConstant: 0 }] }],
    ['a zero residue', 'system.modes.0.residue', { kind: 'modal', quantity: 'receptance', modes: [{ naturalFrequencyHz: 10, dampingRatio: 0.02, residue: { re: 0, im: 0 } }] }],
    ['a zero shape value', 'system.modes.0.shape', { kind: 'modal', quantity: 'receptance', modes: [{ naturalFrequencyHz: 10, dampingRatio: 0.02, shape: { atInput: 0, atOutput: 1, modalMassKg: 1 } }] }],
    ['a negative frequency', 'system.modes.0.naturalFrequencyHz', { kind: 'modal', quantity: 'receptance', modes: [{ ...mode, naturalFrequencyHz: -1 }] }],
    ['ζ ≥ 1', 'system.modes.0.dampingRatio', { kind: 'modal', quantity: 'receptance', modes: [{ ...mode, dampingRatio: 1.5 }] }],
    ['an unknown mode field', 'system.modes.0', { kind: 'modal', quantity: 'receptance', modes: [{ ...mode, phase: 3 }] }],
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
