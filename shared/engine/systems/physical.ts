/**
 * Lumped physical systems: diagonal mass matrix M, stiffness K and viscous damping C assembled
 * from springs and dampers between nodes or to ground. Equation of motion M·ẍ + C·ẋ + K·x = f.
 *
 * Receptance from input node i to output node o: H_oi(ω) = [(K − ω²M + jωC)⁻¹]_oi, solved by
 * Gaussian elimination at every frequency (exact up to rounding).
 *
 * Poles and residues: the eigenvalues of the 2n × 2n state matrix [[0, I], [−M⁻¹K, −M⁻¹C]]
 * give the poles; each is then polished together with its mode shape φ by inverse iteration on
 * T(λ) = λ²M + λC + K and the Rayleigh functional φᵀT(λ)φ = 0 (valid because M, C, K are
 * symmetric). The residue of the receptance at λ_r is A_r = φ_o·φ_i / (φᵀ(2λ_rM + C)φ), the
 * standard result for the quadratic eigenproblem (F. Tisseur and K. Meerbergen, "The quadratic
 * eigenvalue problem", SIAM Review 43(2), 2001), valid for proportional and non-proportional
 * damping alike.
 */
import type { ComplexArray } from '../types';
import { EngineInputError } from '../errors';
import { complexMatrix, solveComplexInPlace, csqrt, cmul, cdiv, type Complex } from './complex-linear';
import { eigenvaluesReal } from './eigen';
import type { ModalTerms } from './modal';
import type { PhysicalSpec } from './schema';

export interface PhysicalMatrices {
  n: number;
  /** Diagonal of M, kg. */
  mass: Float64Array;
  /** K, N/m, row-major n × n. */
  stiffness: Float64Array;
  /** C, N·s/m, row-major n × n. */
  damping: Float64Array;
  inputNode: number;
  outputNode: number;
}

type Ends = [number | 'ground', number | 'ground'];

function assemble(target: Float64Array, n: number, between: Ends, value: number): void {
  const [a, b] = between;
  if (a !== 'ground') target[a * n + a] += value;
  if (b !== 'ground') target[b * n + b] += value;
  if (a !== 'ground' && b !== 'ground') {
    target[a * n + b] -= value;
    target[b * n + a] -= value;
  }
}

export function physicalMatrices(spec: PhysicalSpec): PhysicalMatrices {
  const n = spec.massesKg.length;
  const stiffness = new Float64Array(n * n);
  const damping = new Float64Array(n * n);
  for (const s of spec.springs) assemble(stiffness, n, s.between, s.stiffnessNPerM);
  for (const d of spec.dampers) assemble(damping, n, d.between, d.dampingNsPerM);
  return {
    n,
    mass: Float64Array.from(spec.massesKg),
    stiffness,
    damping,
    inputNode: spec.inputNode,
    outputNode: spec.outputNode,
  };
}

/** Receptance [(K − ω²M + jωC)⁻¹]_oi at frequencies `fHz` (Hz), m/N. */
export function physicalReceptance(p: PhysicalMatrices, fHz: Float64Array): ComplexArray {
  const { n } = p;
  const re = new Float64Array(fHz.length);
  const im = new Float64Array(fHz.length);
  const a = complexMatrix(n);
  const bRe = new Float64Array(n);
  const bIm = new Float64Array(n);
  for (let f = 0; f < fHz.length; f++) {
    const w = 2 * Math.PI * fHz[f];
    for (let i = 0; i < n * n; i++) {
      a.re[i] = p.stiffness[i];
      a.im[i] = w * p.damping[i];
    }
    for (let i = 0; i < n; i++) a.re[i * n + i] -= w * w * p.mass[i];
    bRe.fill(0);
    bIm.fill(0);
    bRe[p.inputNode] = 1;
    solveComplexInPlace(a, bRe, bIm);
    re[f] = bRe[p.outputNode];
    im[f] = bIm[p.outputNode];
  }
  return { re, im };
}

/** The n × n complex matrix T(λ) = λ²M + λC + K. */
function quadraticMatrix(p: PhysicalMatrices, lambda: Complex) {
  const { n } = p;
  const t = complexMatrix(n);
  const l2 = cmul(lambda, lambda);
  for (let i = 0; i < n * n; i++) {
    t.re[i] = lambda[0] * p.damping[i] + p.stiffness[i];
    t.im[i] = lambda[1] * p.damping[i];
  }
  for (let i = 0; i < n; i++) {
    t.re[i * n + i] += l2[0] * p.mass[i];
    t.im[i * n + i] += l2[1] * p.mass[i];
  }
  return t;
}

/** xᵀ·S·x (no conjugation) for a real symmetric S (full, or diagonal when `diagonal`). */
function bilinear(s: Float64Array, n: number, xRe: Float64Array, xIm: Float64Array, diagonal = false): Complex {
  let r = 0;
  let i = 0;
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      if (diagonal && a !== b) continue;
      const v = diagonal ? s[a] : s[a * n + b];
      if (v === 0) continue;
      r += v * (xRe[a] * xRe[b] - xIm[a] * xIm[b]);
      i += v * (xRe[a] * xIm[b] + xIm[a] * xRe[b]);
    }
  }
  return [r, i];
}

/** Polishes one pole and its mode shape; returns both. */
function polishMode(p: PhysicalMatrices, start: Complex): { pole: Complex; shapeRe: Float64Array; shapeIm: Float64Array } {
  const { n } = p;
  let lambda = start;
  // A start vector without symmetry, so no mode of a symmetric structure is missed.
  let xRe = Float64Array.from({ length: n }, (_, i) => 1 + 0.37 * i);
  let xIm = Float64Array.from({ length: n }, (_, i) => 0.13 * i * i);
  for (let it = 0; it < 8; it++) {
    const t = quadraticMatrix(p, lambda);
    const bRe = Float64Array.from(xRe);
    const bIm = Float64Array.from(xIm);
    solveComplexInPlace(t, bRe, bIm);
    // Normalise so the largest component is 1.
    let k = 0;
    for (let i = 1; i < n; i++) if (Math.hypot(bRe[i], bIm[i]) > Math.hypot(bRe[k], bIm[k])) k = i;
    const pivot: Complex = [bRe[k], bIm[k]];
    for (let i = 0; i < n; i++) [bRe[i], bIm[i]] = cdiv([bRe[i], bIm[i]], pivot);
    xRe = bRe;
    xIm = bIm;
    // Rayleigh functional: a·λ² + b·λ + c = 0 with a = φᵀMφ, b = φᵀCφ, c = φᵀKφ.
    const qa = bilinear(p.mass, n, xRe, xIm, true);
    const qb = bilinear(p.damping, n, xRe, xIm);
    const qc = bilinear(p.stiffness, n, xRe, xIm);
    const disc = csqrt([
      qb[0] * qb[0] - qb[1] * qb[1] - 4 * cmul(qa, qc)[0],
      2 * qb[0] * qb[1] - 4 * cmul(qa, qc)[1],
    ]);
    const twoA: Complex = [2 * qa[0], 2 * qa[1]];
    const r1 = cdiv([-qb[0] + disc[0], -qb[1] + disc[1]], twoA);
    const r2 = cdiv([-qb[0] - disc[0], -qb[1] - disc[1]], twoA);
    const next =
      Math.hypot(r1[0] - lambda[0], r1[1] - lambda[1]) <= Math.hypot(r2[0] - lambda[0], r2[1] - lambda[1]) ? r1 : r2;
    const change = Math.hypot(next[0] - lambda[0], next[1] - lambda[1]);
    lambda = next;
    if (it >= 1 && change <= 4 * Number.EPSILON * Math.hypot(lambda[0], lambda[1])) break;
  }
  return { pole: lambda, shapeRe: xRe, shapeIm: xIm };
}

/**
 * Poles (upper half-plane, ascending |λ|) and receptance residues of a physical system.
 * Throws EngineInputError when a mode is overdamped or undamped, or modes repeat.
 */
export function physicalModalTerms(p: PhysicalMatrices): ModalTerms {
  const { n } = p;
  const m = 2 * n;
  const a = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    a[i * m + n + i] = 1;
    for (let j = 0; j < n; j++) {
      a[(n + i) * m + j] = -p.stiffness[i * n + j] / p.mass[i];
      a[(n + i) * m + n + j] = -p.damping[i * n + j] / p.mass[i];
    }
  }
  const values = eigenvaluesReal(a, m);
  const upper = values.filter((v) => v[1] > 1e-8 * Math.hypot(v[0], v[1]));
  if (upper.length !== n) {
    throw new EngineInputError(
      'system.dampers',
      `${n - upper.length} of ${n} modes`,
      'give overdamped (non-oscillating) modes; every mode must be underdamped',
    );
  }
  const poles: Complex[] = [];
  const residues: Complex[] = [];
  const modes = upper.map((v) => polishMode(p, v)).sort((x, y) => Math.hypot(...x.pole) - Math.hypot(...y.pole));
  for (const { pole, shapeRe, shapeIm } of modes) {
    const size = Math.hypot(pole[0], pole[1]);
    if (-pole[0] <= 1e-9 * size) {
      throw new EngineInputError('system.dampers', pole, 'leave a mode undamped; every mode needs damping > 0');
    }
    if (poles.some((q) => Math.hypot(q[0] - pole[0], q[1] - pole[1]) < 1e-7 * size)) {
      throw new EngineInputError('system', pole, 'has a repeated mode, which a single FRF cannot resolve');
    }
    // A_r = φ_o·φ_i / (φᵀ(2λM + C)φ)
    const twoLambda: Complex = [2 * pole[0], 2 * pole[1]];
    const mq = bilinear(p.mass, n, shapeRe, shapeIm, true);
    const cq = bilinear(p.damping, n, shapeRe, shapeIm);
    const norm: Complex = [cmul(twoLambda, mq)[0] + cq[0], cmul(twoLambda, mq)[1] + cq[1]];
    const numerator = cmul([shapeRe[p.outputNode], shapeIm[p.outputNode]], [shapeRe[p.inputNode], shapeIm[p.inputNode]]);
    poles.push(pole);
    residues.push(cdiv(numerator, norm));
  }
  return { poles, residues };
}
