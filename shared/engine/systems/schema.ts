/**
 * The JSON description of a known-answer system (zod 4). Three kinds:
 * - 'sdof': one mass on a spring and a viscous damper to ground, given either as
 *   (massKg, stiffnessNPerM, dampingNsPerM) or as (naturalFrequencyHz, dampingRatio, stiffnessNPerM);
 * - 'modal': a sum of underdamped modes, each with fn and ζ and one of: a real modal constant,
 *   a complex residue, or mode-shape values at the input and output points with a modal mass;
 * - 'physical': lumped masses (nodes 0…n−1) joined by springs and dampers to each other or to
 *   ground, force at `inputNode`, response at `outputNode`.
 * Every kind names its FRF quantity (receptance m/N, mobility m/(N·s), accelerance m/(N·s²)).
 * Units are in each field's description; docs/scenario-schema.md lists them all.
 */
import { z } from 'zod';

const positive = (what: string) => z.number().positive().describe(what);

export const frfQuantitySchema = z
  .enum(['receptance', 'mobility', 'accelerance'])
  .describe('output quantity of the FRF: receptance m/N, mobility m/(N·s), accelerance m/(N·s²)');

const dampingRatio = z
  .number()
  .gt(0)
  .lt(1)
  .describe('viscous damping ratio ζ as a fraction of critical, 0 < ζ < 1 (0.01 = 1 %)');

export const sdofSpecSchema = z
  .object({
    kind: z.literal('sdof'),
    quantity: frfQuantitySchema,
    stiffnessNPerM: positive('spring stiffness k, N/m'),
    massKg: positive('mass m, kg (with dampingNsPerM; omit when naturalFrequencyHz is given)').optional(),
    dampingNsPerM: positive('viscous damping c, N·s/m (with massKg)').optional(),
    naturalFrequencyHz: positive('undamped natural frequency fn, Hz (with dampingRatio)').optional(),
    dampingRatio: dampingRatio.optional(),
  })
  .strict()
  .superRefine((spec, ctx) => {
    const physical = spec.massKg !== undefined || spec.dampingNsPerM !== undefined;
    const modal = spec.naturalFrequencyHz !== undefined || spec.dampingRatio !== undefined;
    const need = (field: keyof typeof spec, why: string) => {
      if (spec[field] === undefined) ctx.addIssue({ code: 'custom', path: [field], message: why });
    };
    if (physical && modal) {
      ctx.addIssue({
        code: 'custom',
        path: ['naturalFrequencyHz'],
        message: 'give either massKg + dampingNsPerM or naturalFrequencyHz + dampingRatio, not both',
      });
    } else if (modal) {
      need('naturalFrequencyHz', 'is required with dampingRatio');
      need('dampingRatio', 'is required with naturalFrequencyHz');
    } else {
      need('massKg', 'is required (or give naturalFrequencyHz + dampingRatio)');
      need('dampingNsPerM', 'is required (or give naturalFrequencyHz + dampingRatio)');
      if (spec.massKg !== undefined && spec.dampingNsPerM !== undefined) {
        const critical = 2 * Math.sqrt(spec.stiffnessNPerM * spec.massKg);
        if (spec.dampingNsPerM >= critical) {
          ctx.addIssue({
            code: 'custom',
            path: ['dampingNsPerM'],
            message: `must be below critical damping 2·sqrt(k·m) = ${critical} N·s/m (underdamped)`,
          });
        }
      }
    }
  });

export const modeSpecSchema = z
  .object({
    naturalFrequencyHz: positive('undamped natural frequency fn, Hz'),
    dampingRatio,
    modalConstant: z
      .number()
      .refine((v) => v !== 0, 'must not be zero')
      .describe('real modal constant R = φ_in·φ_out/m_r, 1/kg: term R/(ωr² − ω² + 2jζωrω)')
      .optional(),
    residue: z
      .object({ re: z.number(), im: z.number() })
      .strict()
      .refine((v) => v.re !== 0 || v.im !== 0, 'must not be zero')
      .describe('complex residue A_r, m/(N·s): term A_r/(jω − λ_r) + conj(A_r)/(jω − conj(λ_r))')
      .optional(),
    shape: z
      .object({
        atInput: z.number().describe('mode-shape value at the force point, dimensionless'),
        atOutput: z.number().describe('mode-shape value at the response point, dimensionless'),
        modalMassKg: positive('modal mass for this shape scaling, kg'),
      })
      .strict()
      .refine((v) => v.atInput !== 0 && v.atOutput !== 0, 'mode-shape values must not be zero')
      .optional(),
  })
  .strict()
  .superRefine((mode, ctx) => {
    const given = ['modalConstant', 'residue', 'shape'].filter((k) => mode[k as keyof typeof mode] !== undefined);
    if (given.length !== 1) {
      ctx.addIssue({
        code: 'custom',
        path: given.length > 1 ? [given[1]] : ['modalConstant'],
        message: 'give exactly one of modalConstant, residue or shape',
      });
    }
  });

export const modalSpecSchema = z
  .object({
    kind: z.literal('modal'),
    quantity: frfQuantitySchema,
    modes: z.array(modeSpecSchema).min(1).max(40).describe('the modes, 1 to 40'),
  })
  .strict();

const nodeRef = z
  .union([z.number().int().min(0), z.literal('ground')])
  .describe("node index (0-based, into massesKg) or 'ground'");

const between = z.tuple([nodeRef, nodeRef]).describe('the two ends of the element');

export const physicalSpecSchema = z
  .object({
    kind: z.literal('physical'),
    quantity: frfQuantitySchema,
    massesKg: z.array(positive('lumped mass, kg')).min(1).max(20).describe('one mass per node, 1 to 20 nodes'),
    springs: z
      .array(z.object({ between, stiffnessNPerM: positive('spring stiffness, N/m') }).strict())
      .min(1)
      .describe('linear springs'),
    dampers: z
      .array(z.object({ between, dampingNsPerM: positive('viscous damping, N·s/m') }).strict())
      .min(1)
      .describe('viscous dampers'),
    inputNode: z.number().int().min(0).describe('node where the force acts (0-based)'),
    outputNode: z.number().int().min(0).describe('node whose response is measured (0-based)'),
  })
  .strict()
  .superRefine((spec, ctx) => {
    const n = spec.massesKg.length;
    const checkNode = (path: (string | number)[], node: number | 'ground') => {
      if (node !== 'ground' && node >= n) {
        ctx.addIssue({ code: 'custom', path, message: `must name a node 0…${n - 1} or 'ground'` });
      }
    };
    const elements: [string, { between: [number | 'ground', number | 'ground'] }[]][] = [
      ['springs', spec.springs],
      ['dampers', spec.dampers],
    ];
    for (const [name, list] of elements) {
      list.forEach((element, i) => {
        const [a, b] = element.between;
        checkNode([name, i, 'between', 0], a);
        checkNode([name, i, 'between', 1], b);
        if (a === b) {
          ctx.addIssue({ code: 'custom', path: [name, i, 'between'], message: 'must join two different nodes' });
        }
      });
    }
    for (const field of ['inputNode', 'outputNode'] as const) {
      if (spec[field] >= n) ctx.addIssue({ code: 'custom', path: [field], message: `must be a node 0…${n - 1}` });
    }
    const floating = floatingNodes(n, spec.springs);
    if (floating.length > 0) {
      ctx.addIssue({
        code: 'custom',
        path: ['springs'],
        message: `must hold every node to ground; node(s) ${floating.join(', ')} can move as a rigid body`,
      });
    }
  });

/** Nodes not joined to ground through springs (their static stiffness matrix is singular). */
function floatingNodes(n: number, springs: { between: [number | 'ground', number | 'ground'] }[]): number[] {
  const parent = Array.from({ length: n + 1 }, (_, i) => i); // index n is ground
  const find = (i: number): number => (parent[i] === i ? i : (parent[i] = find(parent[i])));
  for (const { between } of springs) {
    const [a, b] = between.map((v) => (v === 'ground' ? n : v < n ? v : -1));
    if (a < 0 || b < 0) continue;
    parent[find(a)] = find(b);
  }
  const ground = find(n);
  return Array.from({ length: n }, (_, i) => i).filter((i) => find(i) !== ground);
}

export const systemSpecSchema = z
  .discriminatedUnion('kind', [sdofSpecSchema, modalSpecSchema, physicalSpecSchema])
  .describe('a known-answer linear system');

export type SdofSpec = z.infer<typeof sdofSpecSchema>;
export type ModeSpec = z.infer<typeof modeSpecSchema>;
export type ModalSpec = z.infer<typeof modalSpecSchema>;
export type PhysicalSpec = z.infer<typeof physicalSpecSchema>;
export type SystemSpec = z.infer<typeof systemSpecSchema>;
