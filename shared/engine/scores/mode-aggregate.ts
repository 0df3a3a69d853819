/**
 * Monte Carlo aggregation of resonance scores (modes.ts) over seeds: for each mode, how many seeds
 * resolved it and the mean, sample standard deviation and 95th percentile of |error| of its
 * resonance-frequency (%), damping (%) and peak-value (dB) errors over the seeds that resolved it.
 * Statistics as in statistics.ts (corrected two-pass; Hyndman & Fan definition 7).
 */
import { EngineInputError } from '../errors';
import type { ModeError } from './modes';
import { finiteSorted, meanStd, percentileOfSorted } from './statistics';

export interface ErrorSpread {
  mean: number;
  std: number;
  p95Abs: number;
}

export interface ModeAggregate {
  modeIndex: number;
  naturalFrequencyHz: number;
  dampingRatio: number;
  seeds: number;
  resolvedSeeds: number;
  notResolvableSeeds: number;
  outsideBand: boolean;
  /** The first reason given by a seed that could not resolve the mode. */
  reason: string | null;
  resonanceFrequencyErrorPercent: ErrorSpread;
  dampingErrorPercent: ErrorSpread;
  peakValueErrorDb: ErrorSpread;
}

function spread(values: number[]): ErrorSpread {
  const m = meanStd(values);
  const abs = values.map((v) => Math.abs(v));
  return { mean: m.mean, std: m.std, p95Abs: percentileOfSorted(finiteSorted(abs), 95) };
}

/** Aggregates `perSeed[s][r]` (seed s, mode r) into one figure set per mode. */
export function aggregateModes(perSeed: readonly (readonly ModeError[])[]): ModeAggregate[] {
  if (perSeed.length === 0) return [];
  const modes = perSeed[0].length;
  perSeed.forEach((row, s) => {
    if (row.length !== modes) throw new EngineInputError(`modes[${s}]`, row.length, `must list ${modes} modes`);
  });
  const out: ModeAggregate[] = [];
  for (let r = 0; r < modes; r++) {
    const first = perSeed[0][r];
    const freq: number[] = [];
    const damp: number[] = [];
    const peak: number[] = [];
    let resolved = 0;
    let notResolvable = 0;
    let reason: string | null = null;
    for (const row of perSeed) {
      const e = row[r];
      if (e.status === 'resolved') {
        resolved++;
        freq.push(e.resonanceFrequencyErrorPercent ?? NaN);
        damp.push(e.dampingErrorPercent ?? NaN);
        peak.push(e.peakValueErrorDb ?? NaN);
      } else if (e.status === 'not-resolvable') {
        notResolvable++;
        reason ??= e.reason ?? 'not resolvable';
      }
    }
    out.push({
      modeIndex: r,
      naturalFrequencyHz: first.naturalFrequencyHz,
      dampingRatio: first.dampingRatio,
      seeds: perSeed.length,
      resolvedSeeds: resolved,
      notResolvableSeeds: notResolvable,
      outsideBand: first.status === 'outside-band',
      reason: reason ?? (first.status === 'outside-band' ? (first.reason ?? 'outside the band') : null),
      resonanceFrequencyErrorPercent: spread(freq),
      dampingErrorPercent: spread(damp),
      peakValueErrorDb: spread(peak),
    });
  }
  return out;
}
