/**
 * Facts of modes and FRFs that the UI and the scores show.
 *
 * For a viscously damped mode with undamped natural frequency ω_n and damping ratio ζ (pole
 * λ = −ζω_n + jω_n·sqrt(1 − ζ²)):
 * - damped natural frequency ω_d = ω_n·sqrt(1 − ζ²);
 * - half-power bandwidth ≈ 2ζ·f_n (small-damping approximation);
 * - the impulse-response envelope decays as exp(−ζω_n t), so it falls to a fraction ε after
 *   t = ln(1/ε)/(ζω_n): 1 % after 4.61/(ζω_n), 0.1 % after 6.91/(ζω_n), 1e-6 after 13.8/(ζω_n).
 * Standard vibration textbook results (e.g. S. S. Rao, Mechanical Vibrations).
 */
import type { ComplexArray, ModeFacts } from '../types';
import type { Complex } from './complex-linear';

/** Facts of one mode from its undamped natural frequency (Hz) and damping ratio. */
export function modeFacts(naturalFrequencyHz: number, dampingRatio: number): ModeFacts {
  const omegaN = 2 * Math.PI * naturalFrequencyHz;
  const rate = dampingRatio * omegaN; // envelope decay rate, 1/s
  return {
    naturalFrequencyHz,
    dampedFrequencyHz: naturalFrequencyHz * Math.sqrt(1 - dampingRatio * dampingRatio),
    dampingRatio,
    halfPowerBandwidthHz: 2 * dampingRatio * naturalFrequencyHz,
    decayTimeS: {
      to1Percent: Math.log(1e2) / rate,
      to01Percent: Math.log(1e3) / rate,
      to1e6: Math.log(1e6) / rate,
    },
  };
}

/** Facts of a mode from its pole λ (rad/s, upper half-plane): ω_n = |λ|, ζ = −Re λ / |λ|. */
export function modeFactsFromPole(pole: Complex): ModeFacts {
  const omegaN = Math.hypot(pole[0], pole[1]);
  const facts = modeFacts(omegaN / (2 * Math.PI), -pole[0] / omegaN);
  // The damped frequency is the pole's imaginary part exactly.
  facts.dampedFrequencyHz = pole[1] / (2 * Math.PI);
  return facts;
}

/** The pole λ = −ζω_n + jω_n·sqrt(1 − ζ²) of a mode, rad/s. */
export function poleOf(naturalFrequencyHz: number, dampingRatio: number): Complex {
  const omegaN = 2 * Math.PI * naturalFrequencyHz;
  return [-dampingRatio * omegaN, omegaN * Math.sqrt(1 - dampingRatio * dampingRatio)];
}

/** Slowest envelope decay rate min ζω_n over the modes, 1/s. */
export function slowestDecayRate(modes: ModeFacts[]): number {
  let rate = Infinity;
  for (const m of modes) rate = Math.min(rate, m.dampingRatio * 2 * Math.PI * m.naturalFrequencyHz);
  return rate;
}

/**
 * Anti-resonances: the minimum of |H| between each pair of adjacent natural frequencies, found
 * on a geometric grid of 2000 points and refined by golden-section search (J. Kiefer, "Sequential
 * minimax search for a maximum", Proc. AMS 4(3), 1953). A minimum that sits at either end of the
 * interval (the two peaks have merged) is not reported. Result in Hz, ascending.
 */
export function findAntiResonances(frf: (fHz: Float64Array) => ComplexArray, naturalFrequenciesHz: number[]): number[] {
  const sorted = [...naturalFrequenciesHz].sort((a, b) => a - b);
  const found: number[] = [];
  const magnitude = (f: number): number => {
    const h = frf(Float64Array.of(f));
    return Math.hypot(h.re[0], h.im[0]);
  };
  const points = 2000;
  for (let r = 0; r + 1 < sorted.length; r++) {
    const fa = sorted[r];
    const fb = sorted[r + 1];
    if (!(fb > fa * (1 + 1e-9))) continue;
    const grid = new Float64Array(points);
    const ratio = Math.pow(fb / fa, 1 / (points - 1));
    for (let i = 0; i < points; i++) grid[i] = fa * Math.pow(ratio, i);
    const h = frf(grid);
    let best = 0;
    let bestValue = Infinity;
    for (let i = 0; i < points; i++) {
      const m = Math.hypot(h.re[i], h.im[i]);
      if (m < bestValue) {
        bestValue = m;
        best = i;
      }
    }
    if (best === 0 || best === points - 1) continue;
    found.push(goldenMinimum(magnitude, grid[best - 1], grid[best + 1]));
  }
  return found;
}

/** Golden-section search for the minimum of a unimodal function on [a, b]. */
function goldenMinimum(f: (x: number) => number, a: number, b: number): number {
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let i = 0; i < 200 && b - a > 1e-13 * Math.abs(b); i++) {
    if (f1 <= f2) {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      f1 = f(x1);
    } else {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      f2 = f(x2);
    }
  }
  return (a + b) / 2;
}
