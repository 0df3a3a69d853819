/**
 * What the FRF plot draws from a complex FRF: magnitude (linear, or in dB re 1 unit:
 * 20·log10|H|), phase in degrees (atan2 of the parts, wrapped to (−180°, 180°]) or unwrapped
 * (each step between neighbouring lines larger than 180° taken as a 360° wrap, the rule of
 * NumPy's `unwrap`), and the 95 % magnitude band in the same units. Pure functions on arrays.
 */

export interface ComplexLike {
  re: ArrayLike<number>;
  im: ArrayLike<number>;
}

export type MagnitudeScale = 'db' | 'linear';
export type PhaseMode = 'wrapped' | 'unwrapped';

/** |H| per line. */
export function magnitudeOf(h: ComplexLike): Float64Array {
  const out = new Float64Array(h.re.length);
  for (let i = 0; i < out.length; i++) out[i] = Math.hypot(h.re[i], h.im[i]);
  return out;
}

/** 20·log10(v) per value; 0 or a negative value gives NaN (drawn as a gap, not as −∞). */
export function toDb(values: ArrayLike<number>): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < out.length; i++) out[i] = values[i] > 0 ? 20 * Math.log10(values[i]) : NaN;
  return out;
}

/** Magnitude in the chosen scale. */
export function magnitudeIn(h: ComplexLike, scale: MagnitudeScale): Float64Array {
  const m = magnitudeOf(h);
  return scale === 'db' ? toDb(m) : m;
}

/** Phase in degrees, wrapped to (−180°, 180°]. */
export function phaseDeg(h: ComplexLike): Float64Array {
  const out = new Float64Array(h.re.length);
  for (let i = 0; i < out.length; i++) {
    const deg = (Math.atan2(h.im[i], h.re[i]) * 180) / Math.PI;
    out[i] = deg === -180 ? 180 : deg;
  }
  return out;
}

/** Unwraps a phase in degrees: jumps above 180° between neighbours become continuous. */
export function unwrapDeg(wrapped: ArrayLike<number>): Float64Array {
  const out = new Float64Array(wrapped.length);
  let offset = 0;
  let previous = Number.NaN;
  for (let i = 0; i < out.length; i++) {
    const v = wrapped[i];
    if (!Number.isFinite(v)) {
      out[i] = NaN;
      continue;
    }
    if (Number.isFinite(previous)) {
      const step = v - previous;
      if (step > 180) offset -= 360 * Math.ceil((step - 180) / 360);
      else if (step < -180) offset += 360 * Math.ceil((-step - 180) / 360);
    }
    previous = v;
    out[i] = v + offset;
  }
  return out;
}

/** Phase in the chosen mode, degrees. */
export function phaseIn(h: ComplexLike, mode: PhaseMode): Float64Array {
  const wrapped = phaseDeg(h);
  return mode === 'wrapped' ? wrapped : unwrapDeg(wrapped);
}

/**
 * A magnitude band (linear |H| limits) in the chosen scale. A lower limit of 0 (the band reaches
 * zero) becomes high·1e-6 (120 dB down) in dB, so the fill runs to the bottom of the plot instead
 * of leaving a hole.
 */
export function bandIn(low: ArrayLike<number>, high: ArrayLike<number>, scale: MagnitudeScale) {
  if (scale === 'linear') return { low: Float64Array.from(low), high: Float64Array.from(high) };
  const floor = Float64Array.from(low, (v, i) => (v > 0 ? v : high[i] * 1e-6));
  return { low: toDb(floor), high: toDb(high) };
}

/**
 * Phase band: the curve's phase ± a half width given in radians, degrees. With `breakAbove`
 * (a wrapped phase: 180) the band has a gap where the phase jumps by more than that between
 * neighbouring lines, as the curve itself does.
 */
export function phaseBand(phase: ArrayLike<number>, halfWidthRad: ArrayLike<number>, breakAbove?: number) {
  const low = new Float64Array(phase.length);
  const high = new Float64Array(phase.length);
  for (let i = 0; i < phase.length; i++) {
    const w = (halfWidthRad[i] * 180) / Math.PI;
    const jump = breakAbove !== undefined && i > 0 && Math.abs(phase[i] - phase[i - 1]) > breakAbove;
    low[i] = jump ? NaN : phase[i] - w;
    high[i] = jump ? NaN : phase[i] + w;
  }
  return { low, high };
}

/** The axis label of a magnitude in `scale` for an FRF unit, e.g. "dB re 1 m/N". */
export function magnitudeUnit(scale: MagnitudeScale, unit: string): string {
  return scale === 'db' ? `dB re 1 ${unit}` : unit;
}
