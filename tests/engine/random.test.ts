/**
 * Seeded random streams. Checks: determinism (same seed and stream → identical bytes), stream
 * independence, and the first two moments of the Box–Muller deviates (G. E. P. Box and
 * M. E. Muller, Ann. Math. Statist. 29(2), 1958) within the sampling tolerance of the count:
 * the sample mean of n standard normals has standard error 1/sqrt(n), the sample variance
 * sqrt(2/n); the mean of n uniforms has standard error 1/sqrt(12n).
 */
import { createRandom } from '@/shared/engine/random';
import { EngineInputError } from '@/shared/engine/errors';

const bytes = (a: Float64Array) => Buffer.from(a.buffer, a.byteOffset, a.byteLength);

describe('createRandom', () => {
  it('reproduces the same Float64 bytes for the same seed and stream', () => {
    const a = createRandom(42, 'excitation').fillGaussian(new Float64Array(5000), 1.5);
    const b = createRandom(42, 'excitation').fillGaussian(new Float64Array(5000), 1.5);
    expect(bytes(a).equals(bytes(b))).toBe(true);
  });

  it('differs between seeds and between streams of one seed', () => {
    const a = createRandom(42, 'excitation').fillGaussian(new Float64Array(64), 1);
    const b = createRandom(43, 'excitation').fillGaussian(new Float64Array(64), 1);
    const c = createRandom(42, 'input-noise').fillGaussian(new Float64Array(64), 1);
    expect(bytes(a).equals(bytes(b))).toBe(false);
    expect(bytes(a).equals(bytes(c))).toBe(false);
    // Streams are uncorrelated: |r| within 4 standard errors (1/sqrt(n)) of zero.
    const n = 20000;
    const x = createRandom(7, 'input-noise').fillGaussian(new Float64Array(n), 1);
    const y = createRandom(7, 'output-noise').fillGaussian(new Float64Array(n), 1);
    let sxy = 0;
    for (let i = 0; i < n; i++) sxy += x[i] * y[i];
    expect(Math.abs(sxy / n)).toBeLessThan(4 / Math.sqrt(n));
  });

  it('draws standard normal deviates (mean 0, variance 1, symmetric) within sampling tolerance', () => {
    const n = 200000;
    const x = createRandom(1, 'excitation').fillGaussian(new Float64Array(n), 1);
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    for (const v of x) {
      s1 += v;
      s2 += v * v;
      s3 += v * v * v;
    }
    const mean = s1 / n;
    const variance = s2 / n - mean * mean;
    expect(Math.abs(mean)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(variance - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
    // Third moment 0 with standard error sqrt(15/n).
    expect(Math.abs(s3 / n)).toBeLessThan(4 * Math.sqrt(15 / n));
    // Fraction beyond ±1.96 is 5 % for a normal distribution (binomial standard error).
    const beyond = x.filter((v) => Math.abs(v) > 1.959964).length / n;
    expect(Math.abs(beyond - 0.05)).toBeLessThan(4 * Math.sqrt((0.05 * 0.95) / n));
  });

  it('scales by sigma and draws uniforms in [0, 1) with mean 1/2', () => {
    const r = createRandom(3, 'excitation');
    const x = r.fillGaussian(new Float64Array(50000), 0.25);
    let s2 = 0;
    for (const v of x) s2 += v * v;
    expect(Math.abs(Math.sqrt(s2 / x.length) / 0.25 - 1)).toBeLessThan(4 * Math.sqrt(1 / (2 * x.length)));
    const n = 50000;
    let sum = 0;
    let min = 1;
    let max = 0;
    for (let i = 0; i < n; i++) {
      const u = r.uniform();
      sum += u;
      min = Math.min(min, u);
      max = Math.max(max, u);
    }
    expect(min).toBeGreaterThanOrEqual(0);
    expect(max).toBeLessThan(1);
    expect(Math.abs(sum / n - 0.5)).toBeLessThan(4 / Math.sqrt(12 * n));
  });

  it.each([
    ['a negative seed', 'seed', () => createRandom(-1, 'x')],
    ['a fractional seed', 'seed', () => createRandom(1.5, 'x')],
    ['a NaN seed', 'seed', () => createRandom(NaN, 'x')],
    ['an empty stream', 'stream', () => createRandom(1, '')],
    ['a negative sigma', 'sigma', () => createRandom(1, 'x').fillGaussian(new Float64Array(2), -1)],
  ])('rejects %s naming %s', (_name, field, make) => {
    expect(make).toThrow(EngineInputError);
    try {
      make();
    } catch (e) {
      expect((e as EngineInputError).field).toBe(field);
    }
  });
});
