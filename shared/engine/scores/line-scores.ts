/**
 * Line-by-line scores of an estimated FRF against the exact one.
 *
 * Conventions (docs/engine.md, "Errors a result reports"):
 * - magnitude error, dB: 20·log10(|Ĥ| / |H|) (positive = estimate too large);
 * - phase error, degrees: arg(Ĥ · conj(H)), wrapped to (−180, 180] (positive = estimate leads);
 * - complex relative error, fraction: |Ĥ − H| / |H|.
 * A line whose exact value is zero has no defined relative error: its scores are NaN, it is counted
 * in `summary.undefinedLines` and left out of every band figure.
 */
import type { ComplexArray } from '../types';
import { EngineInputError } from '../errors';

/** An inclusive-exclusive range of line indices. */
export interface LineRange {
  start: number;
  end: number;
}

export interface ScoreFrfInput {
  /** Line frequencies, Hz (all lines of the estimate). */
  frequenciesHz: Float64Array;
  exact: ComplexArray;
  estimate: ComplexArray;
  /** Lines to score, inclusive-exclusive; the whole array when omitted. */
  band?: LineRange;
}

/** Summary of one score over the band: worst absolute value, where it is, mean and RMS. */
export interface BandFigure {
  maxAbs: number;
  worstLineHz: number;
  mean: number;
  rms: number;
}

export interface FrfScoreSummary {
  /** Largest |magnitude error| in the band, dB, and the frequency of that line. */
  maxAbsMagnitudeDb: number;
  meanMagnitudeDb: number;
  rmsMagnitudeDb: number;
  maxAbsPhaseDeg: number;
  meanPhaseDeg: number;
  rmsPhaseDeg: number;
  maxComplexRelative: number;
  rmsComplexRelative: number;
  /** Line with the largest |magnitude error|, Hz. */
  worstLineHz: number;
  worstMagnitudeHz: number;
  worstPhaseHz: number;
  worstComplexHz: number;
  bandLowHz: number;
  bandHighHz: number;
  lines: number;
  undefinedLines: number;
}

export interface FrfScore {
  /** Frequencies of the scored lines (the band), Hz. The arrays below are aligned with it. */
  frequenciesHz: Float64Array;
  magnitudeErrorDb: Float64Array;
  phaseErrorDeg: Float64Array;
  complexRelativeError: Float64Array;
  band: LineRange;
  summary: FrfScoreSummary;
}

const RAD_TO_DEG = 180 / Math.PI;

/** Wraps an angle in degrees to (−180, 180]. */
export function wrapDegrees(deg: number): number {
  let d = deg % 360; // in (−360, 360)
  if (d > 180) d -= 360;
  else if (d <= -180) d += 360;
  return d;
}

/** Checks a line range against an array length; returns the resolved range. */
export function resolveBand(band: LineRange | undefined, length: number, field = 'band'): LineRange {
  const r = band ?? { start: 0, end: length };
  if (!Number.isInteger(r.start) || !Number.isInteger(r.end) || r.start < 0 || r.end > length || r.start >= r.end) {
    throw new EngineInputError(field, r, `must be a non-empty integer range inside [0, ${length}]`);
  }
  return { start: r.start, end: r.end };
}

function checkLengths(input: ScoreFrfInput): number {
  const n = input.frequenciesHz.length;
  const arrays: [string, Float64Array][] = [
    ['exact.re', input.exact.re],
    ['exact.im', input.exact.im],
    ['estimate.re', input.estimate.re],
    ['estimate.im', input.estimate.im],
  ];
  for (const [name, a] of arrays) {
    if (a.length !== n) throw new EngineInputError(name, a.length, `length must equal frequenciesHz length ${n}`);
  }
  return n;
}

/**
 * Scores an estimated FRF against the exact FRF on the band's lines (docs/engine.md conventions above).
 * Returns per-line arrays over the band and a band summary naming the worst line of each score.
 */
export function scoreFrf(input: ScoreFrfInput): FrfScore {
  const n = checkLengths(input);
  const band = resolveBand(input.band, n);
  const m = band.end - band.start;
  const f = input.frequenciesHz.slice(band.start, band.end);
  const mag = new Float64Array(m);
  const ph = new Float64Array(m);
  const rel = new Float64Array(m);
  const { exact, estimate } = input;
  for (let i = 0; i < m; i++) {
    const k = band.start + i;
    const hr = exact.re[k];
    const hi = exact.im[k];
    const er = estimate.re[k];
    const ei = estimate.im[k];
    const h2 = hr * hr + hi * hi;
    if (!(h2 > 0) || !Number.isFinite(h2)) {
      mag[i] = NaN;
      ph[i] = NaN;
      rel[i] = NaN;
      continue;
    }
    const habs = Math.sqrt(h2);
    // Ĥ·conj(H): its modulus is |Ĥ||H|, its angle the phase error, computed in one step.
    const pr = er * hr + ei * hi;
    const pi = ei * hr - er * hi;
    mag[i] = 20 * Math.log10(Math.hypot(er, ei) / habs);
    ph[i] = wrapDegrees(Math.atan2(pi, pr) * RAD_TO_DEG);
    rel[i] = Math.hypot(er - hr, ei - hi) / habs;
  }
  const magFig = bandFigure(f, mag);
  const phFig = bandFigure(f, ph);
  const relFig = bandFigure(f, rel);
  let undefinedLines = 0;
  for (let i = 0; i < m; i++) if (Number.isNaN(mag[i])) undefinedLines++;
  return {
    frequenciesHz: f,
    magnitudeErrorDb: mag,
    phaseErrorDeg: ph,
    complexRelativeError: rel,
    band,
    summary: {
      maxAbsMagnitudeDb: magFig.maxAbs,
      meanMagnitudeDb: magFig.mean,
      rmsMagnitudeDb: magFig.rms,
      maxAbsPhaseDeg: phFig.maxAbs,
      meanPhaseDeg: phFig.mean,
      rmsPhaseDeg: phFig.rms,
      maxComplexRelative: relFig.maxAbs,
      rmsComplexRelative: relFig.rms,
      worstLineHz: magFig.worstLineHz,
      worstMagnitudeHz: magFig.worstLineHz,
      worstPhaseHz: phFig.worstLineHz,
      worstComplexHz: relFig.worstLineHz,
      bandLowHz: f[0],
      bandHighHz: f[m - 1],
      lines: m,
      undefinedLines,
    },
  };
}

/**
 * Worst |value| (first line on ties) with its frequency, mean and RMS of the finite values.
 * All NaN → maxAbs NaN, worstLineHz NaN.
 */
export function bandFigure(frequenciesHz: Float64Array, values: Float64Array): BandFigure {
  let maxAbs = -1;
  let worst = -1;
  let sum = 0;
  let sumSq = 0;
  let count = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    const a = Math.abs(v);
    if (a > maxAbs) {
      maxAbs = a;
      worst = i;
    }
    sum += v;
    sumSq += v * v;
    count++;
  }
  if (count === 0) return { maxAbs: NaN, worstLineHz: NaN, mean: NaN, rms: NaN };
  return { maxAbs, worstLineHz: frequenciesHz[worst], mean: sum / count, rms: Math.sqrt(sumSq / count) };
}

/** The scores of the line nearest to a frequency (e.g. a resonance or an anti-resonance). */
export interface PointScore {
  requestedHz: number;
  lineHz: number;
  magnitudeErrorDb: number;
  phaseErrorDeg: number;
  complexRelativeError: number;
}

/**
 * Picks, for each requested frequency inside the scored band, the nearest scored line and its
 * scores. Frequencies outside the band are skipped.
 */
export function scoresAtFrequencies(score: FrfScore, frequenciesHz: readonly number[]): PointScore[] {
  const f = score.frequenciesHz;
  const out: PointScore[] = [];
  if (f.length === 0) return out;
  const step = f.length > 1 ? f[1] - f[0] : 0;
  for (const req of frequenciesHz) {
    if (req < f[0] - step / 2 || req > f[f.length - 1] + step / 2) continue;
    let best = 0;
    for (let i = 1; i < f.length; i++) if (Math.abs(f[i] - req) < Math.abs(f[best] - req)) best = i;
    out.push({
      requestedHz: req,
      lineHz: f[best],
      magnitudeErrorDb: score.magnitudeErrorDb[best],
      phaseErrorDeg: score.phaseErrorDeg[best],
      complexRelativeError: score.complexRelativeError[best],
    });
  }
  return out;
}
