/**
 * Modal superposition of complex pole pairs. Residue convention (receptance, m/N):
 *   H(jω) = Σ_r A_r/(jω − λ_r) + conj(A_r)/(jω − conj(λ_r)),
 *   λ_r = −ζ_r ω_r + jω_r·sqrt(1 − ζ_r²)   (rad/s, upper half-plane),
 * with A_r in m/(N·s). A real modal constant R_r = φ_in·φ_out/m_r (1/kg) of a proportionally
 * damped mode gives the familiar term R_r/(ω_r² − ω² + 2jζ_rω_rω), which is the pair above with
 * A_r = R_r/(2j·ω_dr), ω_dr = ω_r·sqrt(1 − ζ_r²). (Partial fractions; see e.g. D. J. Ewins,
 * Modal Testing: Theory, Practice and Application, 2nd ed., 2000.)
 */
import type { ComplexArray } from '../types';
import type { Complex } from './complex-linear';
import { poleOf } from './facts';
import type { ModalSpec, ModeSpec } from './schema';

export interface ModalTerms {
  poles: Complex[];
  residues: Complex[];
}

/** The residue A_r of one mode spec in the convention above. */
export function residueOf(mode: ModeSpec): Complex {
  if (mode.residue) return [mode.residue.re, mode.residue.im];
  const constant =
    mode.modalConstant ?? (mode.shape ? (mode.shape.atInput * mode.shape.atOutput) / mode.shape.modalMassKg : 0);
  const omegaD = poleOf(mode.naturalFrequencyHz, mode.dampingRatio)[1];
  // R/(2jω_d) = −j·R/(2ω_d)
  return [0, -constant / (2 * omegaD)];
}

export function modalTerms(spec: ModalSpec): ModalTerms {
  return {
    poles: spec.modes.map((m) => poleOf(m.naturalFrequencyHz, m.dampingRatio)),
    residues: spec.modes.map(residueOf),
  };
}

/** Receptance from poles and residues at frequencies `fHz` (Hz), m/N. */
export function modalReceptance(terms: ModalTerms, fHz: Float64Array): ComplexArray {
  const re = new Float64Array(fHz.length);
  const im = new Float64Array(fHz.length);
  for (let r = 0; r < terms.poles.length; r++) {
    const [lr, li] = terms.poles[r];
    const [ar, ai] = terms.residues[r];
    for (let i = 0; i < fHz.length; i++) {
      const w = 2 * Math.PI * fHz[i];
      // A/(jω − λ): denominator (−lr) + j(ω − li)
      const d1r = -lr;
      const d1i = w - li;
      const d1 = d1r * d1r + d1i * d1i;
      // conj(A)/(jω − conj λ): denominator (−lr) + j(ω + li)
      const d2i = w + li;
      const d2 = d1r * d1r + d2i * d2i;
      re[i] += (ar * d1r + ai * d1i) / d1 + (ar * d1r - ai * d2i) / d2;
      im[i] += (ai * d1r - ar * d1i) / d1 + (-ai * d1r - ar * d2i) / d2;
    }
  }
  return { re, im };
}
