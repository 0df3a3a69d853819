/**
 * Magnitude and phase of an FRF as the plots draw them (shared/ui/plots/frf-values.ts), checked
 * against analytic results: a pure delay τ has |H| = 1 and phase −360°·f·τ (unwrapped); an SDOF
 * receptance 1/(k − mω² + jcω) has phase −90° and |H| = 1/(2ζk) at ω_n (standard vibration
 * textbook results, e.g. S. S. Rao, Mechanical Vibrations).
 */
import { bandIn, magnitudeIn, magnitudeUnit, phaseBand, phaseDeg, phaseIn, toDb, unwrapDeg } from '@/shared/ui/plots/frf-values';

function delayFrf(f: number[], tauS: number) {
  return {
    re: f.map((v) => Math.cos(-2 * Math.PI * v * tauS)),
    im: f.map((v) => Math.sin(-2 * Math.PI * v * tauS)),
  };
}

function sdofReceptance(f: number[], m: number, k: number, c: number) {
  const re: number[] = [];
  const im: number[] = [];
  for (const v of f) {
    const w = 2 * Math.PI * v;
    const a = k - m * w * w;
    const b = c * w;
    const d = a * a + b * b;
    re.push(a / d);
    im.push(-b / d);
  }
  return { re, im };
}

describe('phase', () => {
  test('a 10 ms delay unwraps to the straight line −360°·f·τ', () => {
    const f = Array.from({ length: 501 }, (_, i) => i); // 0…500 Hz, 1 Hz lines: 3.6° per line
    const h = delayFrf(f, 0.01);
    const wrapped = phaseDeg(h);
    expect(Math.max(...wrapped)).toBeLessThanOrEqual(180);
    expect(Math.min(...wrapped)).toBeGreaterThan(-180);
    const unwrapped = phaseIn(h, 'unwrapped');
    f.forEach((v, i) => expect(unwrapped[i]).toBeCloseTo(-360 * v * 0.01, 9));
    expect(unwrapped[500]).toBeCloseTo(-1800, 9);
  });

  test('unwrap keeps a gap and resumes after it', () => {
    const out = unwrapDeg([170, 179, NaN, -175, -160]);
    expect(Array.from(out.slice(0, 2))).toEqual([170, 179]);
    expect(Number.isNaN(out[2])).toBe(true);
    expect(out[3]).toBeCloseTo(185, 12);
    expect(out[4]).toBeCloseTo(200, 12);
  });

  test('SDOF receptance: −90° and |H| = 1/(2ζk) at the natural frequency', () => {
    const m = 2;
    const k = 8e5;
    const zeta = 0.02;
    const c = 2 * zeta * Math.sqrt(k * m);
    const fn = Math.sqrt(k / m) / (2 * Math.PI);
    const h = sdofReceptance([fn / 10, fn, fn * 10], m, k, c);
    const phase = phaseIn(h, 'wrapped');
    expect(phase[1]).toBeCloseTo(-90, 9);
    expect(phase[0]).toBeGreaterThan(-5); // stiffness line: near 0°
    expect(phase[2]).toBeLessThan(-175); // mass line: near −180°
    const db = magnitudeIn(h, 'db');
    expect(db[1]).toBeCloseTo(20 * Math.log10(1 / (2 * zeta * k)), 9);
    expect(magnitudeIn(h, 'linear')[1]).toBeCloseTo(1 / (2 * zeta * k), 15);
  });
});

describe('magnitude and bands', () => {
  test('20·log10: 1 → 0 dB, 10 → 20 dB, 0 → gap', () => {
    const db = toDb([1, 10, 0.001, 0]);
    expect(Array.from(db.slice(0, 3))).toEqual([0, 20, -60]);
    expect(Number.isNaN(db[3])).toBe(true);
  });

  test('a linear magnitude band becomes dB limits; a phase band is ± its half width in degrees', () => {
    const b = bandIn([0.5, 1], [2, 10], 'db');
    expect(b.low[0]).toBeCloseTo(-6.0206, 4);
    expect(b.high[1]).toBeCloseTo(20, 12);
    // A band reaching zero runs 120 dB below its upper limit (to the bottom of any plot).
    expect(bandIn([0], [10], 'db').low[0]).toBeCloseTo(20 - 120, 9);
    const p = phaseBand([-90], [Math.PI / 36]);
    expect(p.low[0]).toBeCloseTo(-95, 12);
    expect(p.high[0]).toBeCloseTo(-85, 12);
    // Across a wrap (179° → −179°) the band has a gap, as the curve does.
    const wrapped = phaseBand([178, 179, -179, -178], [0.01, 0.01, 0.01, 0.01], 180);
    expect(Number.isNaN(wrapped.low[2]) && Number.isNaN(wrapped.high[2])).toBe(true);
    expect(Number.isFinite(wrapped.low[3])).toBe(true);
  });

  test('magnitude unit names its reference in dB', () => {
    expect(magnitudeUnit('db', 'm/N')).toBe('dB re 1 m/N');
    expect(magnitudeUnit('linear', 'm/(N·s)')).toBe('m/(N·s)');
  });
});
