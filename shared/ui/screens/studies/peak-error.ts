/**
 * Points for the peak error against B_r/Δf: for every mode of every scenario, its half-power
 * bandwidth B_r = 2·ζ·f_n (the usual small-damping figure) over the line spacing Δf of that
 * scenario's result lines, and the mean peak-magnitude error over seeds, dB. Sorted by x.
 */
import type { ScenarioResult } from '@/shared/api/work';

export function peakErrorPoints(scenarios: readonly ScenarioResult[]): { x: Float64Array; y: Float64Array } {
  const points: [number, number][] = [];
  for (const s of scenarios) {
    const f = s.curves.frequenciesHz;
    const f0 = f?.[0];
    const f1 = f?.[1];
    if (typeof f0 !== 'number' || typeof f1 !== 'number' || !(f1 > f0)) continue;
    const df = f1 - f0;
    for (const m of s.modes) {
      const fn = Number(m.naturalFrequencyHz);
      const zeta = Number(m.dampingRatio);
      const peak = (m.peakValueErrorDb as { mean?: number } | undefined)?.mean;
      if (!(fn > 0) || !(zeta > 0) || typeof peak !== 'number' || !Number.isFinite(peak)) continue;
      points.push([(2 * zeta * fn) / df, peak]);
    }
  }
  points.sort((a, b) => a[0] - b[0]);
  return { x: Float64Array.from(points.map((p) => p[0])), y: Float64Array.from(points.map((p) => p[1])) };
}
