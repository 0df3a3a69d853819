/**
 * Adaptive number of seeds, after JCGM 101:2008 (GUM Supplement 1) §7.9, "adaptive Monte Carlo
 * procedure": seeds are run in batches of h; after each batch, every criterion's decision figure is
 * computed on each batch alone (y⁽¹⁾ … y⁽ᵇ⁾), and the standard deviation of their average,
 * s_y = sqrt(Σ(y⁽ʳ⁾ − ȳ)² / (b(b − 1))) (§7.9.4 f), is compared with the numerical tolerance δ
 * (§7.9.2): write the reference value as c × 10^ℓ with c an integer of n_dig digits; δ = ½ × 10^ℓ.
 * The scenario has stabilised when 2·s_y < δ for every criterion (§7.9.4 j), with at least two
 * batches; otherwise another batch runs, up to the stated maximum number of seeds.
 *
 * One difference, stated: JCGM 101 takes the digits of u(y), the standard uncertainty of the output
 * quantity; here the figure is compared with a limit, so the reference value is the criterion's
 * limit (its figure when the limit is 0): the decision figure is then stable to n_dig significant
 * digits of the limit. The final figures use all seeds together (§7.9.4 g), not the batch average.
 * Seeds follow the study's seed rule, so a stopped study is the prefix of the same seed sequence
 * and reproduces bit for bit.
 */
import { z } from 'zod';
import { meanStd } from './scores/statistics';
import type { Criterion } from './scores/criteria';
import { decisionFigureOf, type SeedEvidence } from './scores/decision-figures';

export const adaptiveSchema = z.strictObject({
  /** Seeds per batch (h). */
  batchSize: z.number().int().min(2, { error: 'must be a whole number in [2, 500]' }).max(500, { error: 'must be a whole number in [2, 500]' }),
  /** Significant decimal digits n_dig regarded as meaningful. */
  significantDigits: z.number().int().min(1, { error: 'must be 1, 2, 3 or 4' }).max(4, { error: 'must be 1, 2, 3 or 4' }),
});
export type AdaptiveOptions = z.infer<typeof adaptiveSchema>;

/** δ = ½·10^ℓ for `value` written with n_dig significant digits (JCGM 101 §7.9.2). */
export function numericalTolerance(value: number, significantDigits: number): number {
  const v = Math.abs(value);
  if (!(v > 0) || !Number.isFinite(v)) return NaN;
  const l = Math.floor(Math.log10(v)) - significantDigits + 1;
  return 0.5 * Math.pow(10, l);
}

export interface CriterionStability {
  id: string;
  batches: number;
  /** Average ȳ of the batch figures. */
  batchMean: number | null;
  /** s_y: standard deviation of that average. */
  batchMeanSd: number | null;
  tolerance: number | null;
  stable: boolean;
}

export type StopReason = 'stable' | 'max-seeds';

export interface AdaptiveState {
  seeds: number;
  batches: number;
  criteria: CriterionStability[];
  /** Why to stop now, or null to run another batch. */
  stop: StopReason | null;
}

const orNull = (v: number) => (Number.isFinite(v) ? v : null);

/**
 * The stability of each criterion over the complete batches of `evidence` (seeds in seed order),
 * and whether to stop (module doc). `maxSeeds` is the most seeds the study may use.
 */
export function adaptiveState(criteria: readonly Criterion[], evidence: readonly SeedEvidence[], options: AdaptiveOptions, maxSeeds: number): AdaptiveState {
  const h = options.batchSize;
  const batches = Math.floor(evidence.length / h);
  const list = criteria.map((c): CriterionStability => {
    const figure = decisionFigureOf(c.id, evidence);
    const ys: number[] = [];
    for (let b = 0; b < batches; b++) ys.push(figure(Array.from({ length: h }, (_, k) => b * h + k), null));
    const m = meanStd(ys);
    const sd = batches > 1 && ys.every(Number.isFinite) ? m.std / Math.sqrt(batches) : NaN;
    const delta = numericalTolerance(c.limit !== 0 ? c.limit : (c.observed ?? 0), options.significantDigits);
    return { id: c.id, batches, batchMean: orNull(m.mean), batchMeanSd: orNull(sd), tolerance: orNull(delta), stable: Number.isFinite(sd) && 2 * sd < delta };
  });
  const stop: StopReason | null = batches >= 2 && list.every((c) => c.stable) ? 'stable' : evidence.length >= maxSeeds ? 'max-seeds' : null;
  return { seeds: evidence.length, batches, criteria: list, stop };
}
