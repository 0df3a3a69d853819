/** Detrending: hand-sized cases with known answers, and the least-squares property. */
import { detrend, fitTrend } from '@/shared/engine/detrend';
import { EngineInputError } from '@/shared/engine/errors';
import type { Detrend } from '@/shared/engine/types';

describe('detrend', () => {
  const line = new Float64Array([1, 3, 5, 7, 9]); // 2n + 1
  it('none leaves the block alone', () => {
    expect(Array.from(detrend(line, 'none'))).toEqual([1, 3, 5, 7, 9]);
  });
  it('mean subtracts the mean (5)', () => {
    expect(Array.from(detrend(line, 'mean'))).toEqual([-4, -2, 0, 2, 4]);
  });
  it('linear removes a straight line exactly', () => {
    expect(detrend(line, 'linear').every((v) => Math.abs(v) < 1e-14)).toBe(true);
  });
  it('linear: residual orthogonal to 1 and t (least-squares normal equations)', () => {
    const x = new Float64Array([0.3, -1.2, 2.5, 0.7, -0.4, 1.9, 0.0, -2.2]);
    const r = detrend(x, 'linear');
    const centre = 3.5;
    expect(Math.abs(r.reduce((a, v) => a + v, 0))).toBeLessThan(1e-14);
    expect(Math.abs(r.reduce((a, v, i) => a + v * (i - centre), 0))).toBeLessThan(1e-13);
  });
  it('fitTrend reads a block at an offset: slope 2 per sample, centre level', () => {
    const coef = new Float64Array(2);
    fitTrend('linear', new Float64Array([100, 100, 1, 3, 5, 7, 9]), 2, 5, coef);
    expect(coef[0]).toBeCloseTo(5, 14);
    expect(coef[1]).toBeCloseTo(2, 14);
  });
  it('rejects an unknown kind, naming detrend', () => {
    expect(() => detrend(line, 'cubic' as Detrend)).toThrow(EngineInputError);
    expect(() => detrend(line, 'cubic' as Detrend)).toThrow(/^detrend="cubic" /);
  });
});
