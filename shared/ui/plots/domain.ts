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

/** y-range of everything drawn inside the x-window, with a 5 % margin; null when nothing is. */
export function yExtent(
  series: readonly PlotSeries[],
  bands: readonly PlotBand[],
  rules: readonly PlotRule[],
  xDomain: readonly [number, number],
  positiveOnly = false,
): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  const take = (x: ArrayLike<number>, ys: ArrayLike<number>[]) => {
    const [start, end] = visibleRange(x, xDomain, positiveOnly);
    for (let i = start; i < end; i++) {
      if (x[i] < Math.min(xDomain[0], xDomain[1]) || x[i] > Math.max(xDomain[0], xDomain[1])) continue;
      for (const y of ys) {
        const v = y[i];
        if (!Number.isFinite(v)) continue;
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
    }
  };
  for (const s of series) take(s.x, [s.y]);
  for (const b of bands) take(b.x, [b.low, b.high]);
  for (const r of rules) {
    if (r.value < lo) lo = r.value;
    if (r.value > hi) hi = r.value;
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
