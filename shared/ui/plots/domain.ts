/**
 * Axis ranges: the full x-range of a set of series, and a y-range that fits what is visible in an
 * x-window (with a 5 % margin, widened to ±1 when the data are flat). Pure functions.
 */
import type { PlotBand, PlotRule, PlotSeries } from './types';
import { visibleRange } from './decimate';

/** Smallest and largest x over the series (only x > 0 when `positiveOnly`); null when empty. */
export function xExtent(series: readonly { x: ArrayLike<number> }[], positiveOnly = false): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series) {
    for (let i = 0; i < s.x.length; i++) {
      const v = s.x[i];
      if (!Number.isFinite(v) || (positiveOnly && !(v > 0))) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  if (!(hi >= lo)) return null;
  return lo === hi ? [lo * 0.5 || -1, hi * 2 || 1] : [lo, hi];
}

/**
 * y-range of what is drawn inside the x-window, with a 5 % margin; null when nothing is. Curves and
 * rules set the range; bands may widen it by at most the curves' own span on each side, so a band
 * that reaches far down (a confidence band touching |H| = 0 is 120 dB deep in dB) cannot crush the
 * curves into a strip — the band is drawn along the frame's edge where it leaves the range.
 */
export function yExtent(
  series: readonly PlotSeries[],
  bands: readonly PlotBand[],
  rules: readonly PlotRule[],
  xDomain: readonly [number, number],
  positiveOnly = false,
): [number, number] | null {
  const range = { lo: Infinity, hi: -Infinity };
  const take = (into: { lo: number; hi: number }, x: ArrayLike<number>, ys: ArrayLike<number>[]) => {
    const [start, end] = visibleRange(x, xDomain, positiveOnly);
    for (let i = start; i < end; i++) {
      if (x[i] < Math.min(xDomain[0], xDomain[1]) || x[i] > Math.max(xDomain[0], xDomain[1])) continue;
      for (const y of ys) {
        const v = y[i];
        if (!Number.isFinite(v)) continue;
        if (v < into.lo) into.lo = v;
        if (v > into.hi) into.hi = v;
      }
    }
  };
  for (const s of series) take(range, s.x, [s.y]);
  for (const r of rules) {
    if (r.value < range.lo) range.lo = r.value;
    if (r.value > range.hi) range.hi = r.value;
  }
  const band = { lo: Infinity, hi: -Infinity };
  for (const b of bands) take(band, b.x, [b.low, b.high]);
  let { lo, hi } = range;
  if (!(hi >= lo)) ({ lo, hi } = band);
  else if (band.hi >= band.lo) {
    const reach = Math.max(hi - lo, Math.abs(hi) * 1e-9);
    lo = Math.max(Math.min(lo, band.lo), lo - reach);
    hi = Math.min(Math.max(hi, band.hi), hi + reach);
  }
  if (!(hi >= lo)) return null;
  if (hi === lo) return [lo - 1, hi + 1];
  const margin = 0.05 * (hi - lo);
  return [lo - margin, hi + margin];
}

/** Sorts a dragged range and keeps it inside `limits`; null when it is narrower than `minWidth`. */
export function clampRange(
  range: readonly [number, number],
  limits: readonly [number, number],
  minWidth = 0,
): [number, number] | null {
  const lo = Math.max(Math.min(range[0], range[1]), limits[0]);
  const hi = Math.min(Math.max(range[0], range[1]), limits[1]);
  if (!(hi - lo > minWidth)) return null;
  return [lo, hi];
}
