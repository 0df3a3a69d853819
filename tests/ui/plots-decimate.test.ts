/**
 * Display decimation (shared/ui/plots/decimate.ts). Hand-sized cases with known answers, and an
 * analytic truth: a sampled sine keeps its extremes ±1 after min/max-per-column decimation.
 */
import { breakJumps, decimateBand, decimateLine, lowerBound, nearestIndex, visibleRange } from '@/shared/ui/plots/decimate';

const identity = (v: number) => v;

describe('search helpers', () => {
  test('lowerBound and nearestIndex on a hand-sized array', () => {
    const x = [1, 2, 4, 8];
    expect(lowerBound(x, 0)).toBe(0);
    expect(lowerBound(x, 4)).toBe(2);
    expect(lowerBound(x, 5)).toBe(3);
    expect(lowerBound(x, 9)).toBe(4);
    expect(nearestIndex(x, 2.9)).toBe(1); // 2.9 is 0.9 from 2, 1.1 from 4
    expect(nearestIndex(x, 3.1)).toBe(2);
    expect(nearestIndex(x, -5)).toBe(0);
    expect(nearestIndex(x, 100)).toBe(3);
    expect(nearestIndex([], 1)).toBe(-1);
  });

  test('visibleRange keeps one neighbour on each side and can drop x ≤ 0', () => {
    const x = [0, 1, 2, 3, 4, 5, 6];
    expect(visibleRange(x, [2, 4])).toEqual([1, 6]);
    expect(visibleRange(x, [0, 6])).toEqual([0, 7]);
    expect(visibleRange(x, [0, 2], true)).toEqual([1, 4]);
  });
});

describe('decimateLine', () => {
  test('a short series passes through unchanged (fewer points than 4 per column)', () => {
    const x = [0, 1, 2, 3];
    const y = [5, -1, 7, 2];
    const out = decimateLine(x, y, { domain: [0, 3], toPixel: identity, pixelWidth: 100 });
    expect(out).toEqual({ x, y });
  });

  test('each column keeps first, lowest, highest and last point in their order', () => {
    // 10 points per column (pixel = floor(x / 10)), 3 columns.
    const x = Array.from({ length: 30 }, (_, i) => i);
    const y = x.map((i) => (i === 3 ? 100 : i === 6 ? -100 : i === 15 ? -50 : i === 17 ? 50 : 0));
    const out = decimateLine(x, y, { domain: [0, 29], toPixel: (v) => v / 10, pixelWidth: 3 });
    // Column 0: first 0, max at 3, min at 6, last 9; column 1: first 10, min 15, max 17, last 19;
    // column 2 is flat: first 20 is also its min and max, then last 29.
    expect(out.x).toEqual([0, 3, 6, 9, 10, 15, 17, 19, 20, 29]);
    expect(out.y).toEqual([0, 100, -100, 0, 0, -50, 50, 0, 0, 0]);
  });

  test('non-finite values leave one gap marker, and the line resumes after it', () => {
    const x = Array.from({ length: 40 }, (_, i) => i);
    const y = x.map((i) => (i >= 12 && i <= 14 ? NaN : i === 20 ? Infinity : 1));
    const out = decimateLine(x, y, { domain: [0, 39], toPixel: (v) => v / 10, pixelWidth: 4 });
    const gaps = out.y.filter((v) => Number.isNaN(v)).length;
    expect(gaps).toBe(2);
    expect(out.x[out.y.findIndex((v) => Number.isNaN(v))]).toBe(12);
    expect(out.y.filter(Number.isFinite).every((v) => v === 1)).toBe(true);
  });

  test('a sampled sine keeps its extremes ±1 and is cut to a few points per column', () => {
    // 100 000 samples of sin over 50 periods, peaks on samples (period 2000 samples).
    const n = 100_000;
    const x = Array.from({ length: n }, (_, i) => i);
    const y = x.map((i) => Math.sin((2 * Math.PI * i) / 2000));
    const width = 300;
    const out = decimateLine(x, y, { domain: [0, n - 1], toPixel: (v) => (v / (n - 1)) * width, pixelWidth: width });
    expect(out.x.length).toBeLessThanOrEqual(4 * (width + 1));
    expect(Math.max(...out.y)).toBe(1); // sin(π/2) at i = 500 + 2000k, kept as a column maximum
    expect(Math.min(...out.y)).toBe(-1);
    // Every point kept is a point of the data, in order.
    for (let i = 1; i < out.x.length; i++) expect(out.x[i]).toBeGreaterThan(out.x[i - 1]);
    expect(out.y[10]).toBe(y[out.x[10]]);
  });

  test('points outside the zoomed domain are dropped except one neighbour each side', () => {
    const x = Array.from({ length: 100 }, (_, i) => i);
    const out = decimateLine(x, x, { domain: [40, 50], toPixel: identity, pixelWidth: 500 });
    expect(out.x[0]).toBe(39);
    expect(out.x[out.x.length - 1]).toBe(51);
  });

  test('a log axis drops x ≤ 0 (the DC line)', () => {
    const out = decimateLine([0, 1, 10], [3, 2, 1], { domain: [1, 10], toPixel: Math.log10, pixelWidth: 100, positiveOnly: true });
    expect(out.x).toEqual([1, 10]);
  });
});

describe('decimateBand', () => {
  test('one point per column with the lowest low and the highest high', () => {
    const x = Array.from({ length: 20 }, (_, i) => i);
    const low = x.map((i) => -i);
    const high = x.map((i) => (i === 4 ? 99 : i));
    const out = decimateBand(x, low, high, { domain: [0, 19], toPixel: (v) => v / 10, pixelWidth: 2 });
    expect(out.x).toEqual([0, 10]);
    expect(out.low).toEqual([-9, -19]);
    expect(out.high).toEqual([99, 19]);
  });

  test('a sparse band keeps every point', () => {
    const out = decimateBand([1, 2, 3], [0, 0, 0], [1, 2, 3], { domain: [1, 3], toPixel: identity, pixelWidth: 100 });
    expect(out.x).toEqual([1, 2, 3]);
    expect(out.high).toEqual([1, 2, 3]);
  });
});

describe('breakJumps', () => {
  test('a wrapped phase crossing ±180° gets a gap instead of a vertical line', () => {
    const out = breakJumps({ x: [1, 2, 3, 4], y: [170, 179, -178, -170] }, 180);
    expect(out.x).toEqual([1, 2, 3, 3, 4]);
    expect(out.y.slice(0, 2)).toEqual([170, 179]);
    expect(Number.isNaN(out.y[2])).toBe(true);
    expect(out.y.slice(3)).toEqual([-178, -170]);
  });
});
