/**
 * Decision rules: how a criterion's observed figure, its Monte Carlo uncertainty and its limit
 * become a statement of conformity (ILAC G8:09/2019, "Guidelines on decision rules and statements
 * of conformity"; JCGM 106:2012, "The role of measurement uncertainty in conformity assessment";
 * ISO/IEC 17025:2017 §7.8.6).
 *
 * - u: the standard uncertainty of the decision figure, the sample deviation of its bootstrap
 *   replicates (bootstrap.ts: seeds resampled with replacement, fixed seed); U = 2·u (k = 2).
 * - Rules, per criterion, part of the recipe version:
 *   'simple'        simple acceptance (ILAC G8 §4.2.1): guard band w = 0, pass when the figure is
 *                   inside the limit, else fail. The default, and the judgement before rules existed.
 *   'guard-band'    binary rule with guard band w = r·U (ILAC G8 §4.2.2; r = 1 gives w = U): the
 *                   acceptance limit is the tolerance limit moved inwards by w; pass inside it,
 *                   else fail.
 *   'guard-band-conditional' non-binary rule (ILAC G8 §4.2.3): pass inside limit ∓ w, fail beyond
 *                   limit ± w (outwards), conditional in between (within w of the limit either side).
 * - Probability of a false accept (JCGM 106 §9, specific risk, here from the Monte Carlo
 *   distribution itself, with no normal assumption): for a pass or conditional decision, the
 *   fraction of bootstrap replicates of the decision figure outside the tolerance limit (a replicate
 *   with no figure counts as outside). For a fail, the probability of a false reject: the fraction
 *   inside.
 * A figure limited from above ('≤ limit') moves its acceptance limit down; one limited from below
 * (coverage, minimum coherence) moves it up.
 */
import { z } from 'zod';
import type { Criterion } from './criteria';
import { meanStd } from './statistics';

export const DECISION_RULE_KINDS = ['simple', 'guard-band', 'guard-band-conditional'] as const;
export type DecisionRuleKind = (typeof DECISION_RULE_KINDS)[number];

/** The criteria a recipe can give a rule to (criteria.ts ids). */
export const CRITERION_IDS = [
  'magnitude-bias',
  'magnitude-p95',
  'phase-p95',
  'complex-relative-p95',
  'resonance-frequency',
  'damping',
  'coverage',
  'min-coherence',
] as const;
export type CriterionId = (typeof CRITERION_IDS)[number];

/** Criteria whose figure must be at least the limit. */
const AT_LEAST = new Set<string>(['coverage', 'min-coherence']);

export const decisionRuleSchema = z.strictObject({
  kind: z.enum(DECISION_RULE_KINDS, { error: `must be one of ${DECISION_RULE_KINDS.join(', ')}` }),
  /** r in w = r·U; 1 when not given. Only guard-band rules use it. */
  factor: z.number().gt(0, { error: 'must be in (0, 10]' }).lte(10, { error: 'must be in (0, 10]' }).optional(),
});
export type DecisionRule = z.infer<typeof decisionRuleSchema>;

export const decisionRulesSchema = z.strictObject(
  Object.fromEntries(CRITERION_IDS.map((id) => [id, decisionRuleSchema.optional()])) as Record<CriterionId, z.ZodOptional<typeof decisionRuleSchema>>,
);
export type DecisionRules = z.infer<typeof decisionRulesSchema>;

export const SIMPLE_ACCEPTANCE: DecisionRule = { kind: 'simple' };

export type Decision = 'pass' | 'fail' | 'conditional';

/** A criterion with its uncertainty, rule and decision. `pass` is `decision === 'pass'`. */
export interface DecidedCriterion extends Criterion {
  rule: DecisionRule;
  /** Standard uncertainty u of the figure (bootstrap); null when it cannot be computed. */
  uncertainty: number | null;
  /** U = 2·u. */
  expandedUncertainty: number | null;
  /** w (0 for simple acceptance); null when the rule needs U and U is unknown. */
  guardBand: number | null;
  /** The limit the figure is compared with: limit ∓ w. */
  acceptanceLimit: number | null;
  decision: Decision;
  falseAcceptProbability: number | null;
  falseRejectProbability: number | null;
  /** Bootstrap resamples behind u and the probabilities. */
  resamples: number;
}

const orNull = (v: number) => (Number.isFinite(v) ? v : null);

/** Applies `rule` to `criterion` given the bootstrap replicates of its decision figure (module doc). */
export function decide(criterion: Criterion, replicates: ArrayLike<number>, rule: DecisionRule = SIMPLE_ACCEPTANCE): DecidedCriterion {
  const atLeast = AT_LEAST.has(criterion.id);
  const inward = atLeast ? 1 : -1;
  const u = replicates.length > 1 ? meanStd(replicates).std : NaN;
  const U = 2 * u;
  const w = rule.kind === 'simple' ? 0 : (rule.factor ?? 1) * U;
  const x = criterion.observed;
  const inside = (v: number, limit: number) => (atLeast ? v >= limit : v <= limit);
  let decision: Decision;
  let note = criterion.note;
  if (x === null) decision = 'fail';
  else if (!Number.isFinite(w)) {
    decision = 'fail';
    note = [note, 'the guard band needs the Monte Carlo uncertainty, which one seed cannot give'].filter(Boolean).join('; ');
  } else if (inside(x, criterion.limit + inward * w)) decision = 'pass';
  else if (rule.kind === 'guard-band-conditional' && inside(x, criterion.limit - inward * w)) decision = 'conditional';
  else decision = 'fail';
  // Specific risk from the replicates themselves.
  let outside = 0;
  for (let i = 0; i < replicates.length; i++) if (!(Number.isFinite(replicates[i]) && inside(replicates[i], criterion.limit))) outside++;
  const n = replicates.length;
  const pOutside = n > 0 ? outside / n : NaN;
  return {
    ...criterion,
    ...(note ? { note } : {}),
    pass: decision === 'pass',
    rule,
    uncertainty: orNull(u),
    expandedUncertainty: orNull(U),
    guardBand: orNull(w),
    acceptanceLimit: Number.isFinite(w) ? criterion.limit + inward * w : null,
    decision,
    falseAcceptProbability: decision !== 'fail' ? orNull(pOutside) : null,
    falseRejectProbability: decision === 'fail' && x !== null ? orNull(1 - pOutside) : null,
    resamples: n,
  };
}

/** The rule in words, as reports and screens state it. */
export function decisionRuleWords(rule: DecisionRule | undefined): string {
  const r = rule ?? SIMPLE_ACCEPTANCE;
  if (r.kind === 'simple') return 'simple acceptance (w = 0; ILAC G8 §4.2.1)';
  const w = (r.factor ?? 1) === 1 ? 'w = U' : `w = ${r.factor}·U`;
  return r.kind === 'guard-band'
    ? `guard band ${w}, U = 2u (k = 2), pass or fail (ILAC G8 §4.2.2)`
    : `guard band ${w}, U = 2u (k = 2), with a conditional zone ±w about the limit (ILAC G8 §4.2.3)`;
}
