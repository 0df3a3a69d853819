/**
 * Resonance scores by the half-power method on exact FRFs, against the SDOF textbook results
 * (e.g. S. S. Rao, Mechanical Vibrations): receptance peak 1/(2ζk·sqrt(1−ζ²)) at f_n·sqrt(1−2ζ²);
 * half-power points where r² = 1 − 2ζ² ± 2ζ·sqrt(1−ζ²) (r = f/f_n, from |H|² = |H|²peak / 2).
 */
import { exactModeReferences, halfPowerPoints, modeErrors, modeSearchRanges } from '@/shared/engine/scores/modes';
import { addComplex, lines, sdofModeFacts, sdofReceptance } from './scores-helpers';

const fn = 40;
const zeta = 0.01;
const sdof = { m: 2, k: 2 * (2 * Math.PI * fn) ** 2, zeta };
const mode = sdofModeFacts(sdof);
const exactFrf = (f: Float64Array) => sdofReceptance(sdof, f);

/** Closed-form half-power damping of the exact SDOF receptance: (r₂ − r₁)/(2 r_peak). */
function analyticHalfPowerZeta(z: number): number {
  const c = 1 - 2 * z * z;
  const d = 2 * z * Math.sqrt(1 - z * z);
  return (Math.sqrt(c + d) - Math.sqrt(c - d)) / (2 * Math.sqrt(c));
}

describe('exactModeReferences', () => {
  it('finds the SDOF receptance peak and value to 1e-6 and the closed-form half-power damping to 1e-5', () => {
    const [ref] = exactModeReferences([mode], exactFrf, 1, 100);
    expect(ref).not.toBeNull();
    const peakHz = fn * Math.sqrt(1 - 2 * zeta * zeta);
    const peakValue = 1 / (2 * zeta * sdof.k * Math.sqrt(1 - zeta * zeta));
    expect(Math.abs(ref!.peakHz - peakHz) / peakHz).toBeLessThan(1e-6);
    expect(Math.abs(ref!.peakMagnitude - peakValue) / peakValue).toBeLessThan(1e-6);
    const zHp = analyticHalfPowerZeta(zeta);
    expect(Math.abs(ref!.halfPowerDampingRatio! - zHp) / zHp).toBeLessThan(1e-5);
  });
});

describe('modeErrors on an exact SDOF FRF', () => {
  it('fine resolution (Δf = B_r/40): damping within 0.5 %, frequency within Δf/2, peak within 0.01 dB', () => {
    const df = mode.halfPowerBandwidthHz / 40;
    const f = lines(Math.ceil(100 / df), df);
    const references = exactModeReferences([mode], exactFrf, 1, 100);
    const [e] = modeErrors({ frequenciesHz: f, estimate: exactFrf(f), modes: [mode], references });
    expect(e.status).toBe('resolved');
    expect(Math.abs(e.dampingErrorPercent!)).toBeLessThan(0.5);
    expect(Math.abs(e.resonanceFrequencyErrorPercent!)).toBeLessThan(((df / 2) / fn) * 100 + 100 * zeta * zeta);
    expect(Math.abs(e.peakValueErrorDb!)).toBeLessThan(0.01);
    expect(e.linesAboveHalfPower).toBeGreaterThanOrEqual(39);
    expect(e.lowerHalfPowerHz!).toBeLessThan(fn);
    expect(e.upperHalfPowerHz!).toBeGreaterThan(fn);
  });

  it('a known-offset peak: with Δf = B_r/4 and a line exactly at the peak the damping is close (< 3 %)', () => {
    const df = mode.halfPowerBandwidthHz / 4;
    const peakHz = fn * Math.sqrt(1 - 2 * zeta * zeta);
    // Lines k·df + offset so that one line sits on the exact peak.
    const n = Math.ceil(100 / df);
    const f = new Float64Array(n);
    const offset = peakHz - Math.round(peakHz / df) * df;
    for (let i = 0; i < n; i++) f[i] = i * df + offset;
    const [e] = modeErrors({ frequenciesHz: f, estimate: exactFrf(f), modes: [mode], band: { start: 1, end: n } });
    expect(e.status).toBe('resolved');
    expect(e.estimatedPeakHz).toBeCloseTo(peakHz, 9);
    // Near its half-power points |H| is convex (past the inflection of 1/sqrt(1 + x²) at |x| = 1/√2,
    // x = 2(f − f_n)/B_r), so the chord between lines lies above the curve and reaches the level
    // outside the true points: the bandwidth, hence damping, comes out a little too large.
    expect(e.dampingErrorPercent!).toBeGreaterThan(0);
    expect(e.dampingErrorPercent!).toBeLessThan(3);
  });

  it('too coarse (Δf = 1.5·B_r): reported not resolvable with no damping number', () => {
    const df = 1.5 * mode.halfPowerBandwidthHz;
    const f = lines(Math.ceil(100 / df), df);
    const [e] = modeErrors({ frequenciesHz: f, estimate: exactFrf(f), modes: [mode], band: { start: 1, end: f.length } });
    expect(e.status).toBe('not-resolvable');
    expect(e.estimatedDampingRatio).toBeNull();
    expect(e.dampingErrorPercent).toBeNull();
    expect(e.resonanceFrequencyErrorPercent).toBeNull();
    expect(e.reason).toMatch(/resolution too coarse|outside the search range/);
  });

  it('the minimum line count is an option: a looser minimum gives a number where the default refuses', () => {
    const df = mode.halfPowerBandwidthHz / 1.6;
    const f = lines(Math.ceil(100 / df), df);
    const base = { frequenciesHz: f, estimate: exactFrf(f), modes: [mode], band: { start: 1, end: f.length } };
    const strict = modeErrors(base)[0];
    const loose = modeErrors({ ...base, minLinesAboveHalfPower: 1 })[0];
    expect(strict.status).toBe('not-resolvable');
    expect(loose.status).toBe('resolved');
    expect(loose.linesAboveHalfPower).toBe(strict.linesAboveHalfPower);
  });

  it('a mode outside the band is reported outside-band', () => {
    const f = lines(400, 0.25);
    const [e] = modeErrors({ frequenciesHz: f, estimate: exactFrf(f), modes: [mode], band: { start: 200, end: 400 } });
    expect(e.status).toBe('outside-band');
  });

  it('a peak at the edge of the search range is not a local peak', () => {
    const f = lines(400, 0.1); // 0..39.9 Hz: the 40 Hz mode's peak is past the last line
    const m = { ...mode, naturalFrequencyHz: 39.85 };
    const [e] = modeErrors({ frequenciesHz: f, estimate: exactFrf(f), modes: [m] });
    expect(e.status).toBe('not-resolvable');
  });
});

describe('two well separated modes', () => {
  it('each mode is found in its own search range and resolved within 1 %', () => {
    const a = { m: 1, k: (2 * Math.PI * 30) ** 2, zeta: 0.02 };
    const b = { m: 1, k: (2 * Math.PI * 90) ** 2, zeta: 0.01 };
    const modes = [sdofModeFacts(b), sdofModeFacts(a)]; // deliberately out of order
    const f = lines(20000, 0.01);
    const h = addComplex(sdofReceptance(a, f), sdofReceptance(b, f));
    const errs = modeErrors({ frequenciesHz: f, estimate: h, modes, band: { start: 100, end: 20000 } });
    expect(errs.map((e) => e.status)).toEqual(['resolved', 'resolved']);
    expect(errs[0].estimatedPeakHz!).toBeCloseTo(90, 0);
    expect(errs[1].estimatedPeakHz!).toBeCloseTo(30, 0);
    for (const e of errs) expect(Math.abs(e.dampingErrorPercent!)).toBeLessThan(1);
    const ranges = modeSearchRanges(modes, 1, 200);
    expect(ranges[1][1]).toBeCloseTo(Math.sqrt(30 * 90), 9);
    expect(ranges[0][0]).toBeCloseTo(Math.sqrt(30 * 90), 9);
  });

  it('halfPowerPoints on a hand-sized triangle: peak 4 at index 2, crossings by linear interpolation', () => {
    const f = Float64Array.of(0, 1, 2, 3, 4);
    const mag = Float64Array.of(0, 2, 4, 2, 0);
    const hp = halfPowerPoints(f, mag, 0, 4);
    const level = 4 / Math.SQRT2;
    expect(hp.peak).toBe(2);
    expect(hp.linesAbove).toBe(1);
    expect(hp.lower!).toBeCloseTo(1 + (level - 2) / 2, 14);
    expect(hp.upper!).toBeCloseTo(3 - (level - 2) / 2, 14);
  });
});
