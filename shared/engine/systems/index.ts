/**
 * Known-answer linear systems. `buildSystem(spec)` gives the exact FRF of the chosen quantity
 * (receptance, mobility or accelerance), the facts of each mode and the anti-resonances.
 * Time dependence exp(jωt): a delay τ multiplies an FRF by exp(−jωτ); receptance phase is −90°
 * at an undamped natural frequency.
 */
import { FRF_UNITS, type ComplexArray, type FrfQuantity, type ModeFacts } from '../types';
import { EngineInputError } from '../errors';
import { findAntiResonances, modeFacts, modeFactsFromPole } from './facts';
import { modalReceptance, modalTerms, type ModalTerms } from './modal';
import { physicalMatrices, physicalModalTerms, physicalReceptance, type PhysicalMatrices } from './physical';
import { receptanceTo } from './quantity';
import { systemSpecSchema, type SystemSpec } from './schema';
import { sdofParameters, sdofReceptance } from './sdof';

export * from './schema';
export { modeFacts, modeFactsFromPole, poleOf, slowestDecayRate, findAntiResonances } from './facts';
export { receptanceTo, quantityFactor } from './quantity';
export { sdofParameters, sdofReceptance, type SdofParameters } from './sdof';
export { modalReceptance, modalTerms, residueOf, type ModalTerms } from './modal';
export { physicalMatrices, physicalModalTerms, physicalReceptance, type PhysicalMatrices } from './physical';

export interface LinearSystem {
  quantity: FrfQuantity;
  /** SI unit of the FRF, e.g. 'm/N'. */
  unit: string;
  /** The exact FRF at the given frequencies (Hz). */
  frf(fHz: Float64Array): ComplexArray;
  /** Modes in ascending natural frequency. */
  modes: ModeFacts[];
  /** Minima of |H| between adjacent modes, Hz, ascending. */
  antiResonancesHz: number[];
}

/** Builds the exact linear system of a spec (validated here: throws EngineInputError). */
export function buildSystem(input: SystemSpec): LinearSystem {
  const spec = parseSystemSpec(input);
  let receptance: (fHz: Float64Array) => ComplexArray;
  let modes: ModeFacts[];
  if (spec.kind === 'sdof') {
    const p = sdofParameters(spec);
    receptance = (f) => sdofReceptance(p, f);
    modes = [modeFacts(p.naturalFrequencyHz, p.dampingRatio)];
  } else if (spec.kind === 'modal') {
    const terms = modalTerms(spec);
    receptance = (f) => modalReceptance(terms, f);
    modes = spec.modes
      .map((m) => modeFacts(m.naturalFrequencyHz, m.dampingRatio))
      .sort((a, b) => a.naturalFrequencyHz - b.naturalFrequencyHz);
  } else {
    const p = physicalMatrices(spec);
    const terms = physicalModalTerms(p);
    receptance = (f) => physicalReceptance(p, f);
    modes = terms.poles.map(modeFactsFromPole);
  }
  const quantity = spec.quantity;
  const frf = (fHz: Float64Array) => receptanceTo(quantity, fHz, receptance(fHz));
  let antiResonances: number[] | undefined;
  return {
    quantity,
    unit: FRF_UNITS[quantity],
    frf,
    modes,
    // Searched on first use only: simulations of many seeds never need it.
    get antiResonancesHz(): number[] {
      antiResonances ??= findAntiResonances(
        frf,
        modes.map((m) => m.naturalFrequencyHz),
      );
      return antiResonances;
    },
  };
}

/** Poles and receptance residues of any system kind (modal form of the exact FRF). */
export function systemModalTerms(input: SystemSpec): ModalTerms {
  const spec = parseSystemSpec(input);
  if (spec.kind === 'modal') return modalTerms(spec);
  return physicalModalTerms(systemMatrices(spec) as PhysicalMatrices);
}

/** M, C, K of an 'sdof' or 'physical' spec (an SDOF is one node on ground); null for 'modal'. */
export function systemMatrices(input: SystemSpec): PhysicalMatrices | null {
  const spec = parseSystemSpec(input);
  if (spec.kind === 'modal') return null;
  if (spec.kind === 'physical') return physicalMatrices(spec);
  const p = sdofParameters(spec);
  return {
    n: 1,
    mass: Float64Array.of(p.massKg),
    stiffness: Float64Array.of(p.stiffnessNPerM),
    damping: Float64Array.of(p.dampingNsPerM),
    inputNode: 0,
    outputNode: 0,
  };
}

/** Validates a system spec; zod issues become EngineInputError naming the field path. */
export function parseSystemSpec(json: unknown, prefix = 'system'): SystemSpec {
  const result = systemSpecSchema.safeParse(json);
  if (result.success) return result.data;
  const issue = result.error.issues[0];
  const path = [prefix, ...issue.path.map(String)].join('.');
  throw new EngineInputError(path, valueAt(json, issue.path), issue.message);
}

/** The value at a zod issue path inside the raw input (undefined when absent). */
export function valueAt(json: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = json;
  for (const key of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<PropertyKey, unknown>)[key];
  }
  return v;
}
