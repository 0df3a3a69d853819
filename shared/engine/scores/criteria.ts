/**
 * Judges a recipe's acceptance tolerances against Monte Carlo aggregates. One criterion per
 * tolerance given; a tolerance left out is not judged. What each tolerance is checked on:
 * - magnitudeDb → two criteria, both must pass:
 *   'magnitude-bias': max over band lines of |mean magnitude error| (the systematic part);
 *   'magnitude-p95': max over band lines of the 95th percentile of |magnitude error| over seeds
 *   (so that at every line 95 % of measurements stay inside the tolerance);
 * - phaseDeg → 'phase-p95': max over lines of the 95th percentile of |phase error|;
 * - complexRelative → 'complex-relative-p95': max over lines of the 95th percentile of |Ĥ−H|/|H|;
 * - resonanceFrequencyPercent / dampingPercent → max over the modes inside the band of the 95th
 *   percentile of |error| over seeds; a mode that any seed could not resolve fails the criterion;
 * - coveragePercent → overall coverage of the 95 % magnitude band (all line-seed pairs), as a
 *   percentage, must be at least the limit; the worst line is the one with the lowest coverage;
 * - minCoherence → min over lines of the 5th percentile of coherence over seeds must be at least
 *   the limit.
 * With a single seed the percentiles are that seed's values.
 */
import type { ModeAggregate } from './mode-aggregate';
import type { MonteCarloAggregate } from './monte-carlo';

/** The recipe's acceptance tolerances (the same fields as the recipe schema's `tolerances`). */
export interface Tolerances {
  magnitudeDb?: number;
  phaseDeg?: number;
  complexRelative?: number;
  resonanceFrequencyPercent?: number;
  dampingPercent?: number;
  coveragePercent?: number;
  minCoherence?: number;
}

export interface Criterion {
  id: string;
  label: string;
  limit: number;
  /** The judged figure; null when it could not be computed (see `note`). */
  observed: number | null;
  unit: string;
  pass: boolean;
  /** The line (or, for modal criteria, the natural frequency of the mode) that decided it, Hz. */
  worstLineHz: number | null;
  note?: string;
}

interface Extreme {
  value: number;
  hz: number | null;
}

/** Largest (or smallest) finite value with its frequency; NaN when none is finite. */
function extreme(values: Float64Array, f: Float64Array, kind: 'max' | 'min', abs = false): Extreme {
  let best = NaN;
  let hz: number | null = null;
  for (let i = 0; i < values.length; i++) {
    const v = abs ? Math.abs(values[i]) : values[i];
    if (!Number.isFinite(v)) continue;
    if (Number.isNaN(best) || (kind === 'max' ? v > best : v < best)) {
      best = v;
      hz = f[i];
    }
  }
  return { value: best, hz };
}

function atMost(id: string, label: string, limit: number, unit: string, e: Extreme): Criterion {
  const ok = Number.isFinite(e.value);
  return {
    id,
    label,
    limit,
    observed: ok ? e.value : null,
    unit,
    pass: ok && e.value <= limit,
    worstLineHz: e.hz,
    ...(ok ? {} : { note: 'no finite value in the band' }),
  };
}

function atLeast(id: string, label: string, limit: number, unit: string, e: Extreme): Criterion {
  const ok = Number.isFinite(e.value);
  return {
    id,
    label,
    limit,
    observed: ok ? e.value : null,
    unit,
    pass: ok && e.value >= limit,
    worstLineHz: e.hz,
    ...(ok ? {} : { note: 'no finite value in the band' }),
  };
}

function modal(
  id: string,
  label: string,
  limit: number,
  modes: readonly ModeAggregate[],
  pick: (m: ModeAggregate) => number,
): Criterion {
  const judged = modes.filter((m) => !m.outsideBand);
  if (judged.length === 0) {
    return { id, label, limit, observed: null, unit: '%', pass: false, worstLineHz: null, note: 'no mode inside the band' };
  }
  const unresolved = judged.find((m) => m.notResolvableSeeds > 0 || m.resolvedSeeds === 0);
  if (unresolved) {
    return {
      id,
      label,
      limit,
      observed: null,
      unit: '%',
      pass: false,
      worstLineHz: unresolved.naturalFrequencyHz,
      note: `mode at ${unresolved.naturalFrequencyHz.toPrecision(5)} Hz not resolvable in ${unresolved.notResolvableSeeds} of ${unresolved.seeds} seeds: ${unresolved.reason ?? ''}`.trim(),
    };
  }
  let worst = judged[0];
  for (const m of judged) if (pick(m) > pick(worst)) worst = m;
  return atMost(id, label, limit, '%', { value: pick(worst), hz: worst.naturalFrequencyHz });
}

/** Judges each given tolerance (see the module doc for the figure each one is checked on). */
export function judgeCriteria(
  tolerances: Tolerances,
  aggregate: MonteCarloAggregate,
  modes: readonly ModeAggregate[] = [],
): Criterion[] {
  const f = aggregate.frequenciesHz;
  const out: Criterion[] = [];
  const t = tolerances;
  if (t.magnitudeDb !== undefined) {
    out.push(atMost('magnitude-bias', 'Magnitude bias |mean error|', t.magnitudeDb, 'dB', extreme(aggregate.meanMagnitudeDb, f, 'max', true)));
    out.push(atMost('magnitude-p95', 'Magnitude error, 95th percentile of |error|', t.magnitudeDb, 'dB', extreme(aggregate.p95AbsMagnitudeDb, f, 'max')));
  }
  if (t.phaseDeg !== undefined) {
    out.push(atMost('phase-p95', 'Phase error, 95th percentile of |error|', t.phaseDeg, '°', extreme(aggregate.p95AbsPhaseDeg, f, 'max')));
  }
  if (t.complexRelative !== undefined) {
    out.push(atMost('complex-relative-p95', 'Complex relative error, 95th percentile', t.complexRelative, '', extreme(aggregate.p95ComplexRelative, f, 'max')));
  }
  if (t.resonanceFrequencyPercent !== undefined) {
    out.push(modal('resonance-frequency', 'Resonance frequency error, 95th percentile of |error|', t.resonanceFrequencyPercent, modes, (m) => m.resonanceFrequencyErrorPercent.p95Abs));
  }
  if (t.dampingPercent !== undefined) {
    out.push(modal('damping', 'Damping error (half-power), 95th percentile of |error|', t.dampingPercent, modes, (m) => m.dampingErrorPercent.p95Abs));
  }
  if (t.coveragePercent !== undefined) {
    const worst = extreme(aggregate.coverage, f, 'min');
    const overall = aggregate.overallCoverage * 100;
    out.push(atLeast('coverage', 'Coverage of the 95 % magnitude band', t.coveragePercent, '%', { value: overall, hz: worst.hz }));
  }
  if (t.minCoherence !== undefined) {
    out.push(atLeast('min-coherence', 'Coherence, 5th percentile, lowest line', t.minCoherence, '', extreme(aggregate.p5Coherence, f, 'min')));
  }
  return out;
}

/** True when every judged criterion passes (and at least one was judged). */
export function allPass(criteria: readonly Criterion[]): boolean {
  return criteria.length > 0 && criteria.every((c) => c.pass);
}
