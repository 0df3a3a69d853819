/**
 * The decision figure of each criterion (criteria.ts) recomputed from a subset of the seeds: the
 * basis of its Monte Carlo uncertainty and false-accept probability (bootstrap resamples of the
 * seeds, decision-rules.ts) and of the adaptive stopping rule (batches of seeds,
 * adaptive-stopping.ts). On every seed and every line it gives exactly judgeCriteria's figure.
 *
 * A bootstrap resample re-evaluates a band figure (a maximum or minimum over lines) only on the
 * `FOCUS_LINES` lines where the pooled per-line figure is most extreme: the lines far from the
 * extreme cannot become it within the Monte Carlo error, and this keeps B resamples affordable on
 * long bands. Coverage and modal figures are always evaluated whole.
 */
import type { ModeError } from './modes';
import type { MonteCarloAggregate, SeedLineScores } from './monte-carlo';
import { aggregateModes, type ModeAggregate } from './mode-aggregate';
import { finiteSorted, meanStd, percentileOfSorted } from './statistics';

/** Lines kept for a resampled band extreme (module doc). */
export const FOCUS_LINES = 12;

export interface SeedEvidence {
  lines: SeedLineScores;
  modes: ModeError[];
}

type LineStat = (values: Float64Array) => number;
const p95Abs: LineStat = (v) => {
  for (let i = 0; i < v.length; i++) v[i] = Math.abs(v[i]);
  return percentileOfSorted(finiteSorted(v), 95);
};
const absMean: LineStat = (v) => Math.abs(meanStd(v).mean);
const p95: LineStat = (v) => percentileOfSorted(finiteSorted(v), 95);
const p5: LineStat = (v) => percentileOfSorted(finiteSorted(v), 5);

interface LineFigure {
  field: 'magnitudeErrorDb' | 'phaseErrorDeg' | 'complexRelativeError' | 'coherence';
  stat: LineStat;
  kind: 'max' | 'min';
  /** The pooled per-line figure, to choose the focus lines. */
  pooled: (a: MonteCarloAggregate) => Float64Array;
}

const LINE_FIGURES: Record<string, LineFigure> = {
  'magnitude-bias': { field: 'magnitudeErrorDb', stat: absMean, kind: 'max', pooled: (a) => a.meanMagnitudeDb.map(Math.abs) },
  'magnitude-p95': { field: 'magnitudeErrorDb', stat: p95Abs, kind: 'max', pooled: (a) => a.p95AbsMagnitudeDb },
  'phase-p95': { field: 'phaseErrorDeg', stat: p95Abs, kind: 'max', pooled: (a) => a.p95AbsPhaseDeg },
  'complex-relative-p95': { field: 'complexRelativeError', stat: p95, kind: 'max', pooled: (a) => a.p95ComplexRelative },
  'min-coherence': { field: 'coherence', stat: p5, kind: 'min', pooled: (a) => a.p5Coherence },
};

/** Indices of the `count` lines with the most extreme finite pooled figure. */
export function focusLines(pooled: Float64Array, kind: 'max' | 'min', count = FOCUS_LINES): number[] {
  const idx: number[] = [];
  for (let i = 0; i < pooled.length; i++) if (Number.isFinite(pooled[i])) idx.push(i);
  idx.sort((a, b) => (kind === 'max' ? pooled[b] - pooled[a] : pooled[a] - pooled[b]) || a - b);
  return idx.slice(0, count);
}

function lineFigure(fig: LineFigure, seeds: readonly SeedEvidence[], pick: ArrayLike<number>, lines: ArrayLike<number>): number {
  const col = new Float64Array(pick.length);
  let best = NaN;
  for (let j = 0; j < lines.length; j++) {
    const l = lines[j];
    for (let k = 0; k < pick.length; k++) col[k] = seeds[pick[k]].lines[fig.field][l];
    const v = fig.stat(col);
    if (!Number.isFinite(v)) continue;
    if (Number.isNaN(best) || (fig.kind === 'max' ? v > best : v < best)) best = v;
  }
  return best;
}

function modalFigure(modes: readonly ModeAggregate[], pick: (m: ModeAggregate) => number): number {
  const judged = modes.filter((m) => !m.outsideBand);
  if (judged.length === 0 || judged.some((m) => m.notResolvableSeeds > 0 || m.resolvedSeeds === 0)) return NaN;
  return Math.max(...judged.map(pick));
}

/**
 * A function giving criterion `id`'s decision figure for the seeds `pick` (indices into `seeds`,
 * repeats allowed), on `lines` (all lines when null). NaN where judgeCriteria gives no figure.
 */
export function decisionFigureOf(id: string, seeds: readonly SeedEvidence[]): (pick: ArrayLike<number>, lines: ArrayLike<number> | null) => number {
  const all = seeds.length ? Array.from({ length: seeds[0].lines.coherence.length }, (_, i) => i) : [];
  const fig = LINE_FIGURES[id];
  if (fig) return (pick, lines) => lineFigure(fig, seeds, pick, lines ?? all);
  if (id === 'coverage') {
    return (pick) => {
      let inside = 0;
      for (let k = 0; k < pick.length; k++) {
        const a = seeds[pick[k]].lines.insideMagnitudeBand;
        for (let i = 0; i < a.length; i++) inside += a[i] ? 1 : 0;
      }
      return (inside / (pick.length * all.length)) * 100;
    };
  }
  const modal = id === 'resonance-frequency' ? (m: ModeAggregate) => m.resonanceFrequencyErrorPercent.p95Abs : (m: ModeAggregate) => m.dampingErrorPercent.p95Abs;
  return (pick) => modalFigure(aggregateModes(Array.from(pick, (k) => seeds[k].modes)), modal);
}

/** The focus lines of criterion `id` from the pooled aggregate (null: evaluate whole). */
export function focusOf(id: string, aggregate: MonteCarloAggregate): number[] | null {
  const fig = LINE_FIGURES[id];
  return fig ? focusLines(fig.pooled(aggregate), fig.kind) : null;
}
