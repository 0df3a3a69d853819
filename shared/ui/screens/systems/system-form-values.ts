/**
 * The system editor's form: the create body of the API (name, description, note, definition),
 * with the name required as the server requires it for systems, and a starting definition of each
 * kind taken from the Harbor Ridge demo structures.
 */
import { z } from 'zod';
import { systemCreateSchema } from '@/shared/api/work';
import type { SystemSpec } from '@/shared/engine/systems/schema';

/** The server names a system from the body's name (nameOf); a system definition has none of its own. */
export const systemFormSchema = systemCreateSchema.extend({ name: z.string().trim().min(1, 'Give a name').max(200) });
export type SystemFormValues = z.input<typeof systemFormSchema>;
export type SystemKind = SystemSpec['kind'];

export const kindOptions = [
  { value: 'sdof', label: 'Single mass (SDOF)' },
  { value: 'modal', label: 'Modes (modal)' },
  { value: 'physical', label: 'Masses, springs, dampers' },
] as const;

export const quantityOptions = [
  { value: 'receptance', label: 'Receptance m/N' },
  { value: 'mobility', label: 'Mobility m/(N·s)' },
  { value: 'accelerance', label: 'Accelerance m/(N·s²)' },
] as const;

/** A starting definition of each kind (drone arm mode, fan frame modes, a two-mass chain). */
export function startingDefinition(kind: SystemKind, quantity: SystemSpec['quantity'] = 'receptance'): SystemSpec {
  if (kind === 'sdof') return { kind, quantity, naturalFrequencyHz: 340, dampingRatio: 0.008, stiffnessNPerM: 2.5e5 };
  if (kind === 'modal') {
    return {
      kind,
      quantity,
      modes: [
        { naturalFrequencyHz: 36, dampingRatio: 0.012, modalConstant: 0.03 },
        { naturalFrequencyHz: 46, dampingRatio: 0.0055, modalConstant: 0.02 },
        { naturalFrequencyHz: 53, dampingRatio: 0.009, modalConstant: 0.015 },
      ],
    };
  }
  return {
    kind,
    quantity,
    massesKg: [12, 8],
    springs: [
      { between: ['ground', 0], stiffnessNPerM: 6e5 },
      { between: [0, 1], stiffnessNPerM: 4e5 },
    ],
    dampers: [
      { between: ['ground', 0], dampingNsPerM: 60 },
      { between: [0, 1], dampingNsPerM: 40 },
    ],
    inputNode: 1,
    outputNode: 1,
  };
}

/**
 * SDOF: mass/stiffness/damping ↔ natural frequency/damping ratio/stiffness, exactly:
 * f_n = sqrt(k/m)/(2π), ζ = c/(2·sqrt(k·m)); m = k/(2π f_n)², c = 2ζ·sqrt(k·m)
 * (standard vibration textbook relations, e.g. S. S. Rao, Mechanical Vibrations).
 */
export function sdofAs(spec: Extract<SystemSpec, { kind: 'sdof' }>, form: 'physical' | 'modal'): Extract<SystemSpec, { kind: 'sdof' }> {
  const k = spec.stiffnessNPerM;
  if (form === 'modal') {
    const m = spec.massKg;
    const c = spec.dampingNsPerM;
    const ok = k > 0 && m !== undefined && m > 0 && c !== undefined;
    return {
      kind: 'sdof',
      quantity: spec.quantity,
      stiffnessNPerM: k,
      naturalFrequencyHz: ok ? Math.sqrt(k / m) / (2 * Math.PI) : spec.naturalFrequencyHz,
      dampingRatio: ok ? c / (2 * Math.sqrt(k * m)) : spec.dampingRatio,
    };
  }
  const fn = spec.naturalFrequencyHz;
  const zeta = spec.dampingRatio;
  const ok = k > 0 && fn !== undefined && fn > 0 && zeta !== undefined;
  const m = ok ? k / (2 * Math.PI * fn) ** 2 : spec.massKg;
  return {
    kind: 'sdof',
    quantity: spec.quantity,
    stiffnessNPerM: k,
    massKg: m,
    dampingNsPerM: ok && m !== undefined ? 2 * zeta * Math.sqrt(k * m) : spec.dampingNsPerM,
  };
}
