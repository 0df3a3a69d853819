/**
 * Line scores against analytic truths: a known complex gain g applied to the exact FRF gives a
 * magnitude error of 20·log10|g| dB, a phase error of arg g and a complex relative error of |g − 1|
 * at every line (definitions in docs/engine.md); a pure delay τ gives −360·f·τ degrees, wrapped.
 */
import { EngineInputError } from '@/shared/engine/errors';
import { bandFigure, scoreFrf, scoresAtFrequencies, wrapDegrees } from '@/shared/engine/scores/line-scores';
import { lines, scaleComplex, sdofReceptance } from './scores-helpers';

const sdof = { m: 1, k: (2 * Math.PI * 50) ** 2, zeta: 0.02 };
const f = lines(401, 0.25); // 0..100 Hz
const exact = sdofReceptance(sdof, f);

describe('scoreFrf: analytic gain and phase errors', () => {
  it('a gain of +1 dB gives +1 dB at every line, 0° phase and |g−1| relative error', () => {
    const g = 10 ** (1 / 20);
    const s = scoreFrf({ frequenciesHz: f, exact, estimate: scaleComplex(exact, g, 0), band: { start: 1, end: 401 } });
    for (let i = 0; i < s.magnitudeErrorDb.length; i++) {
      expect(s.magnitudeErrorDb[i]).toBeCloseTo(1, 12);
      expect(Math.abs(s.phaseErrorDeg[i])).toBeLessThan(1e-9);
      expect(s.complexRelativeError[i]).toBeCloseTo(g - 1, 12);
    }
    expect(s.summary.maxAbsMagnitudeDb).toBeCloseTo(1, 12);
    expect(s.summary.meanMagnitudeDb).toBeCloseTo(1, 12);
    expect(s.summary.rmsMagnitudeDb).toBeCloseTo(1, 12);
    expect(s.summary.lines).toBe(400);
    expect(s.summary.bandLowHz).toBe(0.25);
    expect(s.summary.bandHighHz).toBe(100);
  });

  it('a −1 dB gain gives −1 dB (sign convention: positive = estimate too large)', () => {
    const s = scoreFrf({ frequenciesHz: f, exact, estimate: scaleComplex(exact, 10 ** (-1 / 20), 0) });
    expect(s.summary.meanMagnitudeDb).toBeCloseTo(-1, 12);
  });

  it('a phase offset of +30° gives +30° and a relative error of 2·sin(15°)', () => {
    const th = (30 * Math.PI) / 180;
    const s = scoreFrf({ frequenciesHz: f, exact, estimate: scaleComplex(exact, Math.cos(th), Math.sin(th)) });
    for (let i = 0; i < f.length; i++) {
      expect(s.phaseErrorDeg[i]).toBeCloseTo(30, 10);
      expect(Math.abs(s.magnitudeErrorDb[i])).toBeLessThan(1e-10);
      // |e^{jθ} − 1| = 2 sin(θ/2)
      expect(s.complexRelativeError[i]).toBeCloseTo(2 * Math.sin(th / 2), 12);
    }
    expect(s.summary.maxAbsPhaseDeg).toBeCloseTo(30, 10);
  });

  it('an offset of 190° wraps to −170°; a sign flip (180°) reports +180°, never −180°', () => {
    for (const [deg, want] of [[190, -170], [-190, 170], [180, 180], [-180, 180], [540, 180]] as const) {
      const th = (deg * Math.PI) / 180;
      const s = scoreFrf({ frequenciesHz: f, exact, estimate: scaleComplex(exact, Math.cos(th), Math.sin(th)), band: { start: 10, end: 20 } });
      for (const v of s.phaseErrorDeg) expect(v).toBeCloseTo(want, 8);
    }
    // A plain sign flip: exactly −H.
    const flip = scoreFrf({ frequenciesHz: f, exact, estimate: scaleComplex(exact, -1, 0) });
    for (const v of flip.phaseErrorDeg) expect(v).toBe(180);
    expect(flip.summary.maxComplexRelative).toBeCloseTo(2, 12);
  });

  it('a delay τ gives a phase error of −360·f·τ degrees, wrapped to (−180, 180]', () => {
    const tau = 0.004; // s: one full turn every 250 Hz
    const re = new Float64Array(f.length);
    const im = new Float64Array(f.length);
    for (let i = 0; i < f.length; i++) {
      const a = -2 * Math.PI * f[i] * tau;
      re[i] = exact.re[i] * Math.cos(a) - exact.im[i] * Math.sin(a);
      im[i] = exact.re[i] * Math.sin(a) + exact.im[i] * Math.cos(a);
    }
    const s = scoreFrf({ frequenciesHz: f, exact, estimate: { re, im } });
    for (let i = 0; i < f.length; i++) expect(s.phaseErrorDeg[i]).toBeCloseTo(wrapDegrees(-360 * f[i] * tau), 8);
    expect(s.summary.worstPhaseHz).toBe(100); // |−144°| at 100 Hz is the largest in 0..100 Hz
  });

  it('names the worst line: a 3 dB error at one line only', () => {
    const est = scaleComplex(exact, 1, 0);
    const g = 10 ** (3 / 20);
    est.re[120] *= g;
    est.im[120] *= g;
    const s = scoreFrf({ frequenciesHz: f, exact, estimate: est });
    expect(s.summary.maxAbsMagnitudeDb).toBeCloseTo(3, 12);
    expect(s.summary.worstLineHz).toBe(30);
    expect(s.summary.worstComplexHz).toBe(30);
    expect(s.summary.meanMagnitudeDb).toBeCloseTo(3 / 401, 12);
  });

  it('a line whose exact value is zero is undefined (NaN) and left out of the band figures', () => {
    const ex = { re: Float64Array.of(0, 1, 2), im: Float64Array.of(0, 0, 0) };
    const es = { re: Float64Array.of(1, 2, 2), im: Float64Array.of(0, 0, 0) };
    const s = scoreFrf({ frequenciesHz: Float64Array.of(0, 1, 2), exact: ex, estimate: es });
    expect(Number.isNaN(s.magnitudeErrorDb[0])).toBe(true);
    expect(s.summary.undefinedLines).toBe(1);
    expect(s.summary.maxAbsMagnitudeDb).toBeCloseTo(20 * Math.log10(2), 12);
    expect(s.summary.worstLineHz).toBe(1);
  });

  it('rejects mismatched lengths and bad bands, naming the field', () => {
    const short = { re: new Float64Array(3), im: new Float64Array(3) };
    expect(() => scoreFrf({ frequenciesHz: f, exact, estimate: short })).toThrow(EngineInputError);
    expect(() => scoreFrf({ frequenciesHz: f, exact, estimate: short })).toThrow(/estimate\.re/);
    expect(() => scoreFrf({ frequenciesHz: f, exact, estimate: exact, band: { start: 5, end: 5 } })).toThrow(/band/);
    expect(() => scoreFrf({ frequenciesHz: f, exact, estimate: exact, band: { start: 0, end: 402 } })).toThrow(/band/);
    expect(() => scoreFrf({ frequenciesHz: f, exact, estimate: exact, band: { start: 1.5, end: 9 } })).toThrow(/band/);
  });
});

describe('band figures and point scores', () => {
  it('bandFigure on a hand-sized array: max |v| −4 at 3 Hz, mean −0.5, RMS sqrt(6.5)', () => {
    const b = bandFigure(Float64Array.of(1, 2, 3, 4), Float64Array.of(1, 2, -4, -1));
    expect(b.maxAbs).toBe(4);
    expect(b.worstLineHz).toBe(3);
    expect(b.mean).toBe(-0.5);
    expect(b.rms).toBeCloseTo(Math.sqrt((1 + 4 + 16 + 1) / 4), 14);
    expect(Number.isNaN(bandFigure(Float64Array.of(1), Float64Array.of(NaN)).maxAbs)).toBe(true);
  });

  it('scoresAtFrequencies picks the nearest scored line and skips frequencies outside the band', () => {
    const est = scaleComplex(exact, 10 ** (2 / 20), 0);
    const s = scoreFrf({ frequenciesHz: f, exact, estimate: est, band: { start: 40, end: 240 } }); // 10..59.75 Hz
    const p = scoresAtFrequencies(s, [50.1, 5, 80]);
    expect(p).toHaveLength(1);
    expect(p[0].lineHz).toBe(50);
    expect(p[0].magnitudeErrorDb).toBeCloseTo(2, 12);
  });
});
