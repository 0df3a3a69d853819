/**
 * Single-degree-of-freedom system: mass m on a spring k and a viscous damper c to ground.
 * Receptance H(ω) = 1/(k − mω² + jcω) (m/N), time dependence exp(jωt).
 * From (f_n, ζ, k): ω_n = 2πf_n, m = k/ω_n², c = 2ζ·sqrt(k·m) = 2ζk/ω_n.
 * Standard vibration textbook results (e.g. S. S. Rao, Mechanical Vibrations).
 */
import type { ComplexArray } from '../types';
import type { SdofSpec } from './schema';

export interface SdofParameters {
  massKg: number;
  stiffnessNPerM: number;
  dampingNsPerM: number;
  naturalFrequencyHz: number;
  dampingRatio: number;
}

/** Resolves either form of an SDOF spec to all five parameters. */
export function sdofParameters(spec: SdofSpec): SdofParameters {
  const k = spec.stiffnessNPerM;
  if (spec.naturalFrequencyHz !== undefined && spec.dampingRatio !== undefined) {
    const omegaN = 2 * Math.PI * spec.naturalFrequencyHz;
    return {
      massKg: k / (omegaN * omegaN),
      stiffnessNPerM: k,
      dampingNsPerM: (2 * spec.dampingRatio * k) / omegaN,
      naturalFrequencyHz: spec.naturalFrequencyHz,
      dampingRatio: spec.dampingRatio,
    };
  }
  const m = spec.massKg as number;
  const c = spec.dampingNsPerM as number;
  return {
    massKg: m,
    stiffnessNPerM: k,
    dampingNsPerM: c,
    naturalFrequencyHz: Math.sqrt(k / m) / (2 * Math.PI),
    dampingRatio: c / (2 * Math.sqrt(k * m)),
  };
}

/** Receptance 1/(k − mω² + jcω) at frequencies `fHz` (Hz), m/N. */
export function sdofReceptance(p: SdofParameters, fHz: Float64Array): ComplexArray {
  const re = new Float64Array(fHz.length);
  const im = new Float64Array(fHz.length);
  for (let i = 0; i < fHz.length; i++) {
    const w = 2 * Math.PI * fHz[i];
    const a = p.stiffnessNPerM - p.massKg * w * w;
    const b = p.dampingNsPerM * w;
    const d = a * a + b * b;
    re[i] = a / d;
    im[i] = -b / d;
  }
  return { re, im };
}
