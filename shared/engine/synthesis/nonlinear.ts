/**
 * Time integration for nonlinear known-answer systems: the lumped model M·ẍ + C·ẋ + K·x + f_nl = f
 * with a cubic spring f_nl = k₃·δ³ on one element (δ = x_a − x_b, ground = 0), i.e. a Duffing
 * element (G. Duffing, Erzwungene Schwingungen bei veränderlicher Eigenfrequenz, 1918).
 *
 * Integrator: classical fourth-order Runge–Kutta at R sub-steps per sample (h = 1/(R·fs)).
 * The force it needs at t, t + h/2 and t + h is the band-limited input itself, evaluated exactly
 * on the 2R-times finer grid: each of the 2R sub-sample phases δ is the exact fractional shift
 * IFFT(X[k]·exp(2πi·k·δ/L)) of the synthesis record's spectrum (two phases per complex FFT).
 * A delay τ of the output channel is applied here as a shift of the force (the system is time
 * invariant). The output is then decimated exactly by taking the state at the sample instants.
 * Steady-state records are preceded by a pre-roll over the periodic input that lets the start-up
 * transient decay; records from rest start at rest.
 */
import type { ComplexArray, FrfQuantity } from '../types';
import type { PhysicalMatrices } from '../systems/physical';
import { transformsFor, type RealTransforms } from './spectrum';

export interface CubicElement {
  /** Cubic stiffness k₃, N/m³. */
  k3NPerM3: number;
  between: [number | 'ground', number | 'ground'];
}

export interface TimeIntegrationOptions {
  matrices: PhysicalMatrices;
  cubic?: CubicElement;
  quantity: FrfQuantity;
  sampleRateHz: number;
  /** Runge–Kutta sub-steps per sample, R. */
  oversampling: number;
  /** One-sided input spectrum of the synthesis record (length L/2 + 1, Nyquist zero), N. */
  spectrum: ComplexArray;
  /** Output channel delay, s. */
  delayS?: number;
  /** Samples integrated before the record starts (over the periodic input). */
  preRollSamples: number;
  /** Samples of the record. */
  recordSamples: number;
  /** Transforms of the synthesis length to reuse (optional). */
  transforms?: RealTransforms;
}

/**
 * Force at the 2R sub-sample phases of every sample: phase j of sample n at time
 * (n + j/(2R))/fs − τ, as `phases[j][n]` (one array per phase).
 */
export function oversampledForce(
  spectrum: ComplexArray,
  count: number,
  shiftSamples: number,
  transforms?: RealTransforms,
): Float64Array[] {
  const half = spectrum.re.length - 1;
  const length = 2 * half;
  const t = transforms ?? transformsFor(length);
  const a = { re: new Float64Array(half + 1), im: new Float64Array(half + 1) };
  const b = { re: new Float64Array(half + 1), im: new Float64Array(half + 1) };
  const shift = (target: ComplexArray, delta: number) => {
    // X[k]·exp(2πi·k·δ/L), the rotation by recurrence, re-seeded every 64 lines for accuracy.
    const step = (2 * Math.PI * delta) / length;
    const cs = Math.cos(step);
    const sn = Math.sin(step);
    let c = 1;
    let s = 0;
    for (let k = 0; k < half; k++) {
      if ((k & 63) === 0) {
        c = Math.cos(step * k);
        s = Math.sin(step * k);
      }
      target.re[k] = spectrum.re[k] * c - spectrum.im[k] * s;
      target.im[k] = spectrum.re[k] * s + spectrum.im[k] * c;
      const next = c * cs - s * sn;
      s = c * sn + s * cs;
      c = next;
    }
    target.im[0] = 0;
  };
  const phases: Float64Array[] = [];
  for (let j = 0; j < count; j += 2) {
    shift(a, j / count - shiftSamples);
    shift(b, (j + 1) / count - shiftSamples);
    const xa = new Float64Array(length);
    const xb = new Float64Array(length);
    t.inversePair(a, b, xa, xb);
    phases.push(xa, xb);
  }
  return phases;
}

/** Integrates the record (module doc); returns the output-node response in the quantity's unit. */
export function integrateResponse(o: TimeIntegrationOptions): Float64Array {
  const { matrices: p, quantity } = o;
  const n = p.n;
  const r = o.oversampling;
  const phases = 2 * r;
  const length = 2 * (o.spectrum.re.length - 1);
  const force = oversampledForce(o.spectrum, phases, (o.delayS ?? 0) * o.sampleRateHz, o.transforms);
  const h = 1 / (r * o.sampleRateHz);
  const inverseMass = Float64Array.from(p.mass, (m) => 1 / m);
  const cubicA = o.cubic && o.cubic.between[0] !== 'ground' ? o.cubic.between[0] : -1;
  const cubicB = o.cubic && o.cubic.between[1] !== 'ground' ? o.cubic.between[1] : -1;
  const k3 = o.cubic?.k3NPerM3 ?? 0;
  const { inputNode, outputNode, stiffness, damping } = p;

  const acceleration = (x: Float64Array, v: Float64Array, f: number, a: Float64Array) => {
    for (let i = 0; i < n; i++) {
      let s = i === inputNode ? f : 0;
      for (let j = 0; j < n; j++) s -= damping[i * n + j] * v[j] + stiffness[i * n + j] * x[j];
      a[i] = s;
    }
    if (k3 !== 0) {
      const delta = (cubicA >= 0 ? x[cubicA] : 0) - (cubicB >= 0 ? x[cubicB] : 0);
      const fc = k3 * delta * delta * delta;
      if (cubicA >= 0) a[cubicA] -= fc;
      if (cubicB >= 0) a[cubicB] += fc;
    }
    for (let i = 0; i < n; i++) a[i] *= inverseMass[i];
  };

  const x = new Float64Array(n);
  const v = new Float64Array(n);
  const xt = new Float64Array(n);
  const vt = new Float64Array(n);
  const k1 = new Float64Array(n);
  const k2 = new Float64Array(n);
  const k3v = new Float64Array(n);
  const k4 = new Float64Array(n);
  const v2 = new Float64Array(n);
  const v3 = new Float64Array(n);
  const v4 = new Float64Array(n);
  const a0 = new Float64Array(n);
  const out = new Float64Array(o.recordSamples);

  for (let s = -o.preRollSamples; s < o.recordSamples; s++) {
    const idx = ((s % length) + length) % length;
    const nextIdx = idx + 1 < length ? idx + 1 : 0;
    if (s >= 0) {
      if (quantity === 'receptance') out[s] = x[outputNode];
      else if (quantity === 'mobility') out[s] = v[outputNode];
      else {
        acceleration(x, v, force[0][idx], a0);
        out[s] = a0[outputNode];
      }
    }
    for (let sub = 0; sub < r; sub++) {
      const fa = force[2 * sub][idx];
      const fm = force[2 * sub + 1][idx];
      const fb = sub + 1 < r ? force[2 * sub + 2][idx] : force[0][nextIdx];
      acceleration(x, v, fa, k1);
      for (let i = 0; i < n; i++) {
        v2[i] = v[i] + 0.5 * h * k1[i];
        xt[i] = x[i] + 0.5 * h * v[i];
      }
      acceleration(xt, v2, fm, k2);
      for (let i = 0; i < n; i++) {
        v3[i] = v[i] + 0.5 * h * k2[i];
        xt[i] = x[i] + 0.5 * h * v2[i];
      }
      acceleration(xt, v3, fm, k3v);
      for (let i = 0; i < n; i++) {
        v4[i] = v[i] + h * k3v[i];
        xt[i] = x[i] + h * v3[i];
      }
      acceleration(xt, v4, fb, k4);
      for (let i = 0; i < n; i++) {
        x[i] += (h / 6) * (v[i] + 2 * v2[i] + 2 * v3[i] + v4[i]);
        vt[i] = v[i] + (h / 6) * (k1[i] + 2 * k2[i] + 2 * k3v[i] + k4[i]);
      }
      v.set(vt);
    }
  }
  return out;
}
