/**
 * Resonance scores: the modal figures an analyst would read off an estimated FRF by peak picking
 * and the half-power method, set beside the exact modal parameters.
 *
 * Method (standard vibration textbook results, e.g. S. S. Rao, Mechanical Vibrations):
 * - peak: the line of largest |Ĥ| inside the mode's search range (no sub-line interpolation, as a
 *   plain peak pick; the resolution shows up honestly in the frequency and peak errors);
 * - half-power points: where |Ĥ| falls to peak/√2 (−3 dB) on each side, by linear interpolation of
 *   |Ĥ| between the two lines that straddle the level;
 * - damping ratio ζ ≈ (f₂ − f₁) / (2 f_peak).
 * Errors: resonance frequency (f_peak − f_n)/f_n·100 %, damping (ζ̂ − ζ)/ζ·100 %, peak value
 * 20·log10(|Ĥ|peak/|H|peak) dB with the exact peak found on a fine grid of the exact FRF.
 * A mode with fewer than `minLinesAboveHalfPower` lines at or above its half-power level, no local
 * peak, or a crossing outside its search range is reported 'not-resolvable' with no numbers.
 */
import type { ComplexArray, ModeFacts } from '../types';
import { resolveBand, type LineRange } from './line-scores';

export type ModeStatus = 'resolved' | 'not-resolvable' | 'outside-band';

/** The exact peak of a mode and what the half-power method gives on the exact FRF itself. */
export interface ExactModeReference {
  peakHz: number;
  peakMagnitude: number;
  /** Half-power damping on a fine grid of the exact FRF: the method's own bias, not processing. */
  halfPowerDampingRatio: number | null;
}

export interface ModeError {
  modeIndex: number;
  naturalFrequencyHz: number;
  dampingRatio: number;
  status: ModeStatus;
  reason?: string;
  linesAboveHalfPower: number;
  estimatedPeakHz: number | null;
  estimatedPeakMagnitude: number | null;
  lowerHalfPowerHz: number | null;
  upperHalfPowerHz: number | null;
  estimatedDampingRatio: number | null;
  exactPeakMagnitude: number | null;
  resonanceFrequencyErrorPercent: number | null;
  dampingErrorPercent: number | null;
  peakValueErrorDb: number | null;
}

export interface ModeErrorsInput {
  frequenciesHz: Float64Array;
  estimate: ComplexArray;
  modes: readonly ModeFacts[];
  /** Lines that may be used, inclusive-exclusive; all lines when omitted. */
  band?: LineRange;
  /** Exact peaks from `exactModeReferences`, same order as `modes`; peak value errors need it. */
  references?: readonly (ExactModeReference | null)[];
  /** Fewest lines at or above the half-power level for a damping figure (default 3). */
  minLinesAboveHalfPower?: number;
  /**
   * Damping ratio to subtract from each half-power figure at its peak frequency before it is
   * compared, e.g. the added damping 1/(ω·τ) of an exponential window (the lab's usual correction).
   */
  dampingCorrection?: (fHz: number) => number;
}

/**
 * Search range of each mode: from the geometric mean with the mode below to the geometric mean
 * with the mode above (band edges for the outermost modes), in Hz.
 */
export function modeSearchRanges(modes: readonly ModeFacts[], lowHz: number, highHz: number): [number, number][] {
  const order = modes.map((m, i) => ({ f: m.naturalFrequencyHz, i })).sort((a, b) => a.f - b.f);
  const ranges: [number, number][] = new Array(modes.length);
  order.forEach((o, j) => {
    const lo = j > 0 ? Math.sqrt(order[j - 1].f * o.f) : lowHz;
    const hi = j < order.length - 1 ? Math.sqrt(order[j + 1].f * o.f) : highHz;
    ranges[o.i] = [Math.max(lo, lowHz), Math.min(hi, highHz)];
  });
  return ranges;
}

/** |value| of a complex array at each index. */
function magnitudes(h: ComplexArray): Float64Array {
  const out = new Float64Array(h.re.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.hypot(h.re[i], h.im[i]);
  return out;
}

interface HalfPower {
  peak: number;
  lower: number | null;
  upper: number | null;
  linesAbove: number;
  reason?: string;
}

/**
 * Peak pick and half-power crossings on |H| sampled at `f`, using indices [lo, hi] (inclusive).
 * Linear interpolation of the magnitude between the straddling lines.
 */
export function halfPowerPoints(f: Float64Array, mag: Float64Array, lo: number, hi: number): HalfPower {
  let peak = lo;
  for (let i = lo + 1; i <= hi; i++) if (mag[i] > mag[peak]) peak = i;
  if (peak === lo || peak === hi) {
    return { peak, lower: null, upper: null, linesAbove: 0, reason: 'no local peak inside the search range' };
  }
  const level = mag[peak] / Math.SQRT2;
  let linesAbove = 1;
  let i = peak;
  while (i > lo && mag[i - 1] >= level) {
    i--;
    linesAbove++;
  }
  let j = peak;
  while (j < hi && mag[j + 1] >= level) {
    j++;
    linesAbove++;
  }
  if (i === lo || j === hi) {
    return { peak, lower: null, upper: null, linesAbove, reason: 'a half-power point lies outside the search range' };
  }
  const lower = crossing(f, mag, i - 1, i, level);
  const upper = crossing(f, mag, j, j + 1, level);
  return { peak, lower, upper, linesAbove };
}

function crossing(f: Float64Array, mag: Float64Array, a: number, b: number, level: number): number {
  const t = (level - mag[a]) / (mag[b] - mag[a]);
  return f[a] + t * (f[b] - f[a]);
}

/**
 * The exact peak and the half-power damping of the exact FRF for each mode, on a fine grid of
 * 2001 points over f_n ± 3·B_r (clipped to the mode's search range), with a parabolic refinement
 * of the peak. Computed once per system, not once per seed.
 */
export function exactModeReferences(
  modes: readonly ModeFacts[],
  exactFrf: (fHz: Float64Array) => ComplexArray,
  lowHz: number,
  highHz: number,
): (ExactModeReference | null)[] {
  const ranges = modeSearchRanges(modes, lowHz, highHz);
  return modes.map((m, r) => {
    const [rlo, rhi] = ranges[r];
    const span = 3 * Math.max(m.halfPowerBandwidthHz, 1e-9 * m.naturalFrequencyHz);
    const lo = Math.max(rlo, m.naturalFrequencyHz - span, 0);
    const hi = Math.min(rhi, m.naturalFrequencyHz + span);
    if (!(hi > lo)) return null;
    const n = 2001;
    const f = new Float64Array(n);
    for (let i = 0; i < n; i++) f[i] = lo + ((hi - lo) * i) / (n - 1);
    const mag = magnitudes(exactFrf(f));
    const hp = halfPowerPoints(f, mag, 0, n - 1);
    if (hp.reason) return null;
    const p = hp.peak;
    // Parabola through the three lines around the grid peak (vertex of the interpolating quadratic).
    const y0 = mag[p - 1], y1 = mag[p], y2 = mag[p + 1];
    const den = y0 - 2 * y1 + y2;
    const d = den !== 0 ? (0.5 * (y0 - y2)) / den : 0;
    const peakHz = f[p] + d * (f[1] - f[0]);
    const peakMagnitude = y1 - 0.25 * (y0 - y2) * d;
    const halfPowerDampingRatio =
      hp.lower !== null && hp.upper !== null ? (hp.upper - hp.lower) / (2 * peakHz) : null;
    return { peakHz, peakMagnitude, halfPowerDampingRatio };
  });
}

/**
 * Resonance-frequency, damping and peak-value errors of each mode from an estimated FRF by the
 * half-power method (see the module doc). Modes whose natural frequency lies outside the band's
 * lines are 'outside-band'.
 */
export function modeErrors(input: ModeErrorsInput): ModeError[] {
  const f = input.frequenciesHz;
  const band = resolveBand(input.band, f.length);
  const minLines = input.minLinesAboveHalfPower ?? 3;
  const mag = magnitudes(input.estimate);
  const lowHz = f[band.start];
  const highHz = f[band.end - 1];
  const ranges = modeSearchRanges(input.modes, lowHz, highHz);
  return input.modes.map((m, r) => {
    const base: ModeError = {
      modeIndex: r,
      naturalFrequencyHz: m.naturalFrequencyHz,
      dampingRatio: m.dampingRatio,
      status: 'outside-band',
      linesAboveHalfPower: 0,
      estimatedPeakHz: null,
      estimatedPeakMagnitude: null,
      lowerHalfPowerHz: null,
      upperHalfPowerHz: null,
      estimatedDampingRatio: null,
      exactPeakMagnitude: input.references?.[r]?.peakMagnitude ?? null,
      resonanceFrequencyErrorPercent: null,
      dampingErrorPercent: null,
      peakValueErrorDb: null,
    };
    if (m.naturalFrequencyHz < lowHz || m.naturalFrequencyHz > highHz) {
      return { ...base, reason: 'natural frequency outside the scored band' };
    }
    const [rlo, rhi] = ranges[r];
    let lo = band.start;
    while (lo < band.end - 1 && f[lo + 1] <= rlo) lo++;
    let hi = band.end - 1;
    while (hi > band.start && f[hi - 1] >= rhi) hi--;
    const hp = halfPowerPoints(f, mag, lo, hi);
    const peakFields = { estimatedPeakHz: f[hp.peak], estimatedPeakMagnitude: mag[hp.peak] };
    if (hp.reason || hp.lower === null || hp.upper === null) {
      const peak = hp.linesAbove > 0 ? peakFields : {};
      return { ...base, ...peak, status: 'not-resolvable', reason: hp.reason, linesAboveHalfPower: hp.linesAbove };
    }
    if (hp.linesAbove < minLines) {
      return {
        ...base,
        ...peakFields,
        status: 'not-resolvable',
        reason: `${hp.linesAbove} line(s) at or above the half-power level, fewer than ${minLines}: resolution too coarse`,
        linesAboveHalfPower: hp.linesAbove,
      };
    }
    const fPeak = f[hp.peak];
    const zeta = (hp.upper - hp.lower) / (2 * fPeak) - (input.dampingCorrection?.(fPeak) ?? 0);
    const exactPeak = base.exactPeakMagnitude;
    return {
      ...base,
      ...peakFields,
      status: 'resolved',
      linesAboveHalfPower: hp.linesAbove,
      lowerHalfPowerHz: hp.lower,
      upperHalfPowerHz: hp.upper,
      estimatedDampingRatio: zeta,
      resonanceFrequencyErrorPercent: ((fPeak - m.naturalFrequencyHz) / m.naturalFrequencyHz) * 100,
      dampingErrorPercent: ((zeta - m.dampingRatio) / m.dampingRatio) * 100,
      peakValueErrorDb: exactPeak !== null && exactPeak > 0 ? 20 * Math.log10(mag[hp.peak] / exactPeak) : null,
    };
  });
}
