/**
 * F quantiles against published tables and the exact closed form for two numerator degrees of
 * freedom. Table values: the upper 5 % and 1 % points of F as printed in standard statistical tables
 * (e.g. NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.6.7.3, "Upper critical values of the
 * F distribution"; quoted from memory, to the three significant figures the tables print).
 */
import { EngineInputError } from '@/shared/engine/errors';
import { fCdf, fQuantile, fQuantileTwoNumerator, logGamma, regularizedBeta } from '@/shared/engine/f-distribution';

describe('F distribution', () => {
  it.each([
    // [d1, d2, probability, table value]
    [2, 20, 0.95, 3.49],
    [2, 60, 0.95, 3.15],
    [1, 10, 0.95, 4.96],
    [5, 10, 0.95, 3.33],
    [4, 20, 0.99, 4.43],
    [10, 30, 0.95, 2.16],
  ])('F(%d, %d; %f) = %f as in the published table', (d1, d2, p, table) => {
    expect(fQuantile(d1, d2, p)).toBeCloseTo(table, 2);
  });

  it('the closed form F(2, m; 1 − α) = (m/2)(α^(−2/m) − 1) agrees with the incomplete-beta quantile', () => {
    for (const m of [3, 8, 20, 60, 63.4]) {
      const closed = fQuantileTwoNumerator(m, 0.95);
      expect(fCdf(closed, 2, m)).toBeCloseTo(0.95, 12);
      expect(closed).toBeCloseTo((m / 2) * (Math.pow(0.05, -2 / m) - 1), 12);
    }
  });

  it('inverts its own distribution function for other numerators', () => {
    for (const [d1, d2] of [[1, 5], [3, 7.5], [6, 40]]) {
      expect(fCdf(fQuantile(d1, d2, 0.9), d1, d2)).toBeCloseTo(0.9, 10);
    }
  });

  it('ln Γ and I_x match analytic values: Γ(5) = 24, Γ(1/2) = √π, I_x(1, 1) = x, I_x(a, 1) = x^a', () => {
    expect(logGamma(5)).toBeCloseTo(Math.log(24), 13);
    expect(logGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 13);
    expect(regularizedBeta(0.3, 1, 1)).toBeCloseTo(0.3, 13);
    expect(regularizedBeta(0.7, 2.5, 1)).toBeCloseTo(Math.pow(0.7, 2.5), 13);
  });

  it('refuses degrees of freedom and probabilities outside their range, naming the field', () => {
    expect(() => fQuantile(0, 10, 0.95)).toThrow(EngineInputError);
    expect(() => fQuantile(2, -1, 0.95)).toThrow(/d2/);
    expect(() => fQuantile(3, 10, 1)).toThrow(/probability/);
    expect(() => regularizedBeta(1.5, 1, 1)).toThrow(/x/);
  });
});
