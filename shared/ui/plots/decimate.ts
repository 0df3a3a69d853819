/**
 * Display decimation: keeps a curve of many thousand points smooth to draw without changing what
 * the eye sees. The visible x-range is cut into one bucket per pixel column; each bucket keeps its
 * first, lowest, highest and last point, in their original order, so peaks and notches survive
 * (the "min/max per pixel column" rule of plotting large series). Only for drawing: every number a
 * read-out, a score or an export shows comes from the full data.
 *
 * Non-finite y values break the line: a NaN point is kept where one or more of them sit, so a
 * path built with d3-shape's `defined()` shows the gap.
 */

export interface XY {
  x: number[];
  y: number[];
}

export interface XBand {
  x: number[];
  low: number[];
  high: number[];
}

export interface DecimateOptions {
  /** Visible x-range; points outside it are dropped except one neighbour on each side. */
  domain: readonly [number, number];
  /** Maps an x value to a pixel column (e.g. a d3 scale). */
  toPixel: (x: number) => number;
  /** Width of the drawing in pixels (one bucket per column). */
  pixelWidth: number;
  /** Drop x ≤ 0 (a log axis cannot place them). */
  positiveOnly?: boolean;
}

/** Index range [start, end) of the sorted `x` that covers `domain`, with one neighbour each side. */
export function visibleRange(x: ArrayLike<number>, domain: readonly [number, number], positiveOnly = false): [number, number] {
  const [lo, hi] = domain[0] <= domain[1] ? domain : [domain[1], domain[0]];
  let start = lowerBound(x, lo) - 1;
  let end = lowerBound(x, hi);
  if (end < x.length && x[end] === hi) end++;
  end = Math.min(x.length, end + 1);
  start = Math.max(0, start);
  if (positiveOnly) while (start < end && !(x[start] > 0)) start++;
  return [start, end];
}

/** First index i with x[i] ≥ value in an ascending array (x.length when none). */
export function lowerBound(x: ArrayLike<number>, value: number): number {
  let a = 0;
  let b = x.length;
  while (a < b) {
    const m = (a + b) >>> 1;
    if (x[m] < value) a = m + 1;
    else b = m;
  }
  return a;
}

/** Index of the point of the ascending `x` nearest to `value` (−1 for an empty array). */
export function nearestIndex(x: ArrayLike<number>, value: number): number {
  if (x.length === 0) return -1;
  const i = lowerBound(x, value);
  if (i <= 0) return 0;
  if (i >= x.length) return x.length - 1;
  return value - x[i - 1] <= x[i] - value ? i - 1 : i;
}

/** Min/max-per-column decimation of a line (module doc). `x` must be ascending. */
export function decimateLine(x: ArrayLike<number>, y: ArrayLike<number>, o: DecimateOptions): XY {
  const [start, end] = visibleRange(x, o.domain, o.positiveOnly);
  const out: XY = { x: [], y: [] };
  const columns = Math.max(1, Math.round(o.pixelWidth));
  if (end - start <= 4 * columns) {
    for (let i = start; i < end; i++) push(out, x[i], Number.isFinite(y[i]) ? y[i] : NaN);
    return out;
  }
  let bucket = Number.NaN;
  let first = -1;
  let last = -1;
  let min = -1;
  let max = -1;
  let gap = false;
  const flush = () => {
    if (first < 0) return;
    const keep = [first, min, max, last].filter((v, i, all) => v >= 0 && all.indexOf(v) === i).sort((a, b) => a - b);
    for (const i of keep) push(out, x[i], y[i]);
    first = last = min = max = -1;
  };
  for (let i = start; i < end; i++) {
    const column = Math.floor(o.toPixel(x[i]));
    if (column !== bucket) {
      flush();
      bucket = column;
    }
    const v = y[i];
    if (!Number.isFinite(v)) {
      flush();
      if (!gap) push(out, x[i], NaN);
      gap = true;
      continue;
    }
    gap = false;
    if (first < 0) {
      first = last = min = max = i;
      continue;
    }
    last = i;
    if (v < y[min]) min = i;
    if (v > y[max]) max = i;
  }
  flush();
  return out;
}

/**
 * Decimation of a band (e.g. a 95 % confidence band or a percentile spread): one point per pixel
 * column with the lowest `low` and the highest `high` in it, so the drawn band never looks
 * narrower than the data.
 */
export function decimateBand(x: ArrayLike<number>, low: ArrayLike<number>, high: ArrayLike<number>, o: DecimateOptions): XBand {
  const [start, end] = visibleRange(x, o.domain, o.positiveOnly);
  const out: XBand = { x: [], low: [], high: [] };
  const columns = Math.max(1, Math.round(o.pixelWidth));
  const dense = end - start > 2 * columns;
  let bucket = Number.NaN;
  for (let i = start; i < end; i++) {
    const lo = low[i];
    const hi = high[i];
    const ok = Number.isFinite(lo) && Number.isFinite(hi);
    const column = dense ? Math.floor(o.toPixel(x[i])) : i;
    const n = out.x.length;
    if (column === bucket && n > 0 && ok && Number.isFinite(out.low[n - 1])) {
      out.low[n - 1] = Math.min(out.low[n - 1], lo);
      out.high[n - 1] = Math.max(out.high[n - 1], hi);
      continue;
    }
    bucket = column;
    out.x.push(x[i]);
    out.low.push(ok ? lo : NaN);
    out.high.push(ok ? hi : NaN);
  }
  return out;
}

function push(out: XY, x: number, y: number) {
  out.x.push(x);
  out.y.push(y);
}

/**
 * Inserts a gap wherever neighbouring finite values differ by more than `limit`, so a wrapped
 * phase crossing ±180° is not drawn as a vertical line across the plot. Returns a new series.
 */
export function breakJumps(line: XY, limit: number): XY {
  const out: XY = { x: [], y: [] };
  for (let i = 0; i < line.x.length; i++) {
    const previous = out.y[out.y.length - 1];
    if (i > 0 && Number.isFinite(previous) && Number.isFinite(line.y[i]) && Math.abs(line.y[i] - previous) > limit) push(out, line.x[i], NaN);
    push(out, line.x[i], line.y[i]);
  }
  return out;
}
