/**
 * Physical (lumped) systems against known answers and against their own modal form.
 * Sources: the 2-DOF chain ground–m–m with equal springs has ω = sqrt(k/m)·sqrt((3 ∓ √5)/2)
 * = 0.618 and 1.618·sqrt(k/m) and mode-shape ratios x2/x1 = 2 − ω²m/k (standard textbook result,
 * e.g. S. S. Rao, Mechanical Vibrations); proportional (Rayleigh) damping C = αM + βK keeps the
 * undamped mode shapes with ζ_r = α/(2ω_r) + βω_r/2 (Lord Rayleigh, The Theory of Sound, 1877);
 * the state-space eigenvalues are cross-checked with mathjs `eigs`, an independent library.
 */
import { eigs } from 'mathjs';
import {
  buildSystem,
  modalReceptance,
  physicalMatrices,
  systemModalTerms,
  type PhysicalSpec,
  type SystemSpec,
} from '@/shared/engine/systems';
import { EngineInputError } from '@/shared/engine/errors';

const k = 1.0e4;
const m = 1.5;
const root = Math.sqrt(k / m);

function maxRelativeDifference(a: { re: Float64Array; im: Float64Array }, b: { re: Float64Array; im: Float64Array }) {
  let worst = 0;
  for (let i = 0; i < a.re.length; i++) {
    const rel = Math.hypot(a.re[i] - b.re[i], a.im[i] - b.im[i]) / Math.hypot(a.re[i], a.im[i]);
    worst = Math.max(worst, rel);
  }
  return worst;
}

/** ground–m–m chain with Rayleigh damping C = αM + βK realised as dampers. */
function rayleighChain(alpha: number, beta: number, inputNode: number, outputNode: number): PhysicalSpec {
  return {
    kind: 'physical',
    quantity: 'receptance',
    massesKg: [m, m],
    springs: [
      { between: ['ground', 0], stiffnessNPerM: k },
      { between: [0, 1], stiffnessNPerM: k },
    ],
    dampers: (
      [
        { between: ['ground', 0], dampingNsPerM: beta * k + alpha * m },
        { between: [0, 1], dampingNsPerM: beta * k },
        { between: [1, 'ground'], dampingNsPerM: alpha * m },
      ] as PhysicalSpec['dampers']
    ).filter((d) => d.dampingNsPerM > 0),
    inputNode,
    outputNode,
  };
}

const grid = Float64Array.from({ length: 400 }, (_, i) => (i * 3 * root) / (2 * Math.PI) / 399);

describe('2-DOF chain, equal masses and springs (standard textbook result)', () => {
  it('has natural frequencies 0.618 and 1.618 · sqrt(k/m)', () => {
    const system = buildSystem(rayleighChain(0, 2e-5, 0, 1));
    const ratios = system.modes.map((mode) => (2 * Math.PI * mode.naturalFrequencyHz) / root);
    // With C ∝ K the poles satisfy |λ_r| = ω_r exactly, so the undamped values are recovered.
    expect(Math.abs(ratios[0] / Math.sqrt((3 - Math.sqrt(5)) / 2) - 1)).toBeLessThan(1e-12);
    expect(Math.abs(ratios[1] / Math.sqrt((3 + Math.sqrt(5)) / 2) - 1)).toBeLessThan(1e-12);
    expect(ratios[0]).toBeCloseTo(0.618, 3);
    expect(ratios[1]).toBeCloseTo(1.618, 3);
  });

  it('has Rayleigh damping ratios ζ_r = α/(2ω_r) + βω_r/2', () => {
    const alpha = 0.8;
    const beta = 3e-5;
    const system = buildSystem(rayleighChain(alpha, beta, 0, 0));
    for (const mode of system.modes) {
      const w = 2 * Math.PI * mode.naturalFrequencyHz;
      expect(Math.abs(mode.dampingRatio / (alpha / (2 * w) + (beta * w) / 2) - 1)).toBeLessThan(1e-11);
    }
  });

  it.each([
    [0, 0],
    [0, 1],
    [1, 0],
    [1, 1],
  ])('agrees with the modal form from the analytic mode shapes (input %i, output %i)', (input, output) => {
    const alpha = 0.5;
    const beta = 4e-5;
    const exact = buildSystem(rayleighChain(alpha, beta, input, output)).frf(grid);
    const modes = [(3 - Math.sqrt(5)) / 2, (3 + Math.sqrt(5)) / 2].map((lambda) => {
      const w = root * Math.sqrt(lambda);
      const shape = [1, 2 - lambda];
      return {
        naturalFrequencyHz: w / (2 * Math.PI),
        dampingRatio: alpha / (2 * w) + (beta * w) / 2,
        shape: { atInput: shape[input], atOutput: shape[output], modalMassKg: m * (shape[0] ** 2 + shape[1] ** 2) },
      };
    });
    const modal = buildSystem({ kind: 'modal', quantity: 'receptance', modes }).frf(grid);
    expect(maxRelativeDifference(exact, modal)).toBeLessThan(1e-10);
  });

  it('puts the driving-point anti-resonances at sqrt(k/m) (node 0) and sqrt(2k/m) (node 1)', () => {
    // Undamped: H_00 ∝ (k − ω²m), H_11 ∝ (2k − ω²m); light damping moves the minimum by O(ζ²).
    const at0 = buildSystem(rayleighChain(0, 1e-6, 0, 0)).antiResonancesHz;
    const at1 = buildSystem(rayleighChain(0, 1e-6, 1, 1)).antiResonancesHz;
    expect(at0).toHaveLength(1);
    expect(at1).toHaveLength(1);
    expect(Math.abs((2 * Math.PI * at0[0]) / root - 1)).toBeLessThan(1e-6);
    expect(Math.abs((2 * Math.PI * at1[0]) / (Math.SQRT2 * root) - 1)).toBeLessThan(1e-6);
  });
});

describe('modal form of a physical system (poles and residues from the state-space eigenproblem)', () => {
  const nonProportional: PhysicalSpec = {
    kind: 'physical',
    quantity: 'receptance',
    massesKg: [2, 1, 1.5, 0.7],
    springs: [
      { between: ['ground', 0], stiffnessNPerM: 4e4 },
      { between: [0, 1], stiffnessNPerM: 2.5e4 },
      { between: [1, 2], stiffnessNPerM: 3e4 },
      { between: [2, 3], stiffnessNPerM: 1e4 },
      { between: [1, 'ground'], stiffnessNPerM: 5e3 },
    ],
    dampers: [
      { between: [3, 'ground'], dampingNsPerM: 6 },
      { between: [0, 2], dampingNsPerM: 9 },
    ],
    inputNode: 3,
    outputNode: 0,
  };

  it('sums to the direct (K − ω²M + jωC)⁻¹ solution within 1e-10 (non-proportional damping)', () => {
    const terms = systemModalTerms(nonProportional);
    expect(terms.poles).toHaveLength(4);
    const top = Math.hypot(...terms.poles[3]) / (2 * Math.PI);
    const f = Float64Array.from({ length: 600 }, (_, i) => (i * 1.5 * top) / 599);
    const direct = buildSystem(nonProportional).frf(f);
    expect(maxRelativeDifference(direct, modalReceptance(terms, f))).toBeLessThan(1e-10);
    // And as a 'modal' spec with complex residues, in every quantity.
    for (const quantity of ['receptance', 'mobility', 'accelerance'] as const) {
      const modal: SystemSpec = {
        kind: 'modal',
        quantity,
        modes: terms.poles.map((pole, r) => {
          const w = Math.hypot(...pole);
          return {
            naturalFrequencyHz: w / (2 * Math.PI),
            dampingRatio: -pole[0] / w,
            residue: { re: terms.residues[r][0], im: terms.residues[r][1] },
          };
        }),
      };
      const g = f.subarray(1);
      expect(maxRelativeDifference(buildSystem({ ...nonProportional, quantity }).frf(g), buildSystem(modal).frf(g))).toBeLessThan(
        1e-10,
      );
    }
  });

  it('finds the same eigenvalues as mathjs eigs on the state matrix (independent library)', () => {
    const p = physicalMatrices(nonProportional);
    const n = p.n;
    const a: number[][] = Array.from({ length: 2 * n }, () => new Array(2 * n).fill(0));
    for (let i = 0; i < n; i++) {
      a[i][n + i] = 1;
      for (let j = 0; j < n; j++) {
        a[n + i][j] = -p.stiffness[i * n + j] / p.mass[i];
        a[n + i][n + j] = -p.damping[i * n + j] / p.mass[i];
      }
    }
    const reference = eigs(a, { eigenvectors: false }).values as unknown as unknown[];
    const upper = reference
      .map((v) => (typeof v === 'number' ? [v, 0] : [(v as { re: number }).re, (v as { im: number }).im]))
      .filter(([, im]) => im > 0)
      .sort((x, y) => Math.hypot(x[0], x[1]) - Math.hypot(y[0], y[1]));
    const ours = systemModalTerms(nonProportional).poles;
    expect(upper).toHaveLength(ours.length);
    ours.forEach((pole, r) => {
      const size = Math.hypot(pole[0], pole[1]);
      expect(Math.hypot(pole[0] - upper[r][0], pole[1] - upper[r][1]) / size).toBeLessThan(1e-9);
    });
  });

  it('reports a minimum of |H| between each pair of adjacent modes', () => {
    const driving = buildSystem({ ...nonProportional, outputNode: 3 });
    expect(driving.antiResonancesHz).toHaveLength(3);
    const f = driving.modes.map((mode) => mode.naturalFrequencyHz);
    driving.antiResonancesHz.forEach((fa, r) => {
      expect(fa).toBeGreaterThan(f[r]);
      expect(fa).toBeLessThan(f[r + 1]);
      // A local minimum: |H| rises on both sides.
      const h = driving.frf(Float64Array.of(fa * (1 - 1e-4), fa, fa * (1 + 1e-4)));
      const mag = [0, 1, 2].map((i) => Math.hypot(h.re[i], h.im[i]));
      expect(mag[1]).toBeLessThan(mag[0]);
      expect(mag[1]).toBeLessThan(mag[2]);
    });
  });
});

describe('physical spec validation', () => {
  const base = rayleighChain(0.5, 1e-5, 0, 1);
  const error = (spec: unknown) => {
    try {
      buildSystem(spec as SystemSpec);
    } catch (e) {
      return e;
    }
    return undefined;
  };
  const cases: [string, string, unknown][] = [
    ['a node out of range', 'system.springs.1.between.1', { ...base, springs: [base.springs[0], { between: [0, 5], stiffnessNPerM: k }] }],
    ['an element on one node', 'system.dampers.0.between', { ...base, dampers: [{ between: [1, 1], dampingNsPerM: 1 }] }],
    ['a floating node', 'system.springs', { ...base, springs: [base.springs[0]] }],
    ['an input node out of range', 'system.inputNode', { ...base, inputNode: 2 }],
    ['an output node out of range', 'system.outputNode', { ...base, outputNode: 9 }],
    ['no dampers', 'system.dampers', { ...base, dampers: [] }],
    ['no masses', 'system.massesKg', { ...base, massesKg: [] }],
    ['a zero mass', 'system.massesKg.1', { ...base, massesKg: [1, 0] }],
    ['a fractional node', 'system.inputNode', { ...base, inputNode: 0.5 }],
    ['an unknown field', 'system', { ...base, extra: 1 }],
    ['an overdamped mode', 'system.dampers', { ...base, dampers: [{ between: [0, 'ground'], dampingNsPerM: 1e5 }] }],
    [
      'an undamped mode',
      'system.dampers',
      {
        ...base,
        springs: [
          { between: ['ground', 0], stiffnessNPerM: k },
          { between: ['ground', 1], stiffnessNPerM: k },
          { between: [0, 1], stiffnessNPerM: k / 3 },
        ],
        // Symmetric structure, damper between the masses: the in-phase mode is undamped.
        dampers: [{ between: [0, 1], dampingNsPerM: 2 }],
      },
    ],
    [
      'a repeated mode',
      'system',
      {
        ...base,
        springs: [
          { between: ['ground', 0], stiffnessNPerM: k },
          { between: ['ground', 1], stiffnessNPerM: k },
        ],
        dampers: [
          { between: ['ground', 0], dampingNsPerM: 2 },
          { between: ['ground', 1], dampingNsPerM: 2 },
        ],
      },
    ],
  ];
  it.each(cases)('rejects %s naming %s', (_name, field, spec) => {
    const e = error(spec);
    expect(e).toBeInstanceOf(EngineInputError);
    expect((e as EngineInputError).field).toBe(field);
  });
});
