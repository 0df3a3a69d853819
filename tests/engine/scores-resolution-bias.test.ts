/**
 * The window power kernel and the resolution-bias predictions (no simulation here; the Monte Carlo
 * comparison is in advice.test.ts). Analytic references:
 * - Hann kernel second moment μ₂ = Δf²/3: by Parseval ∫δ²|W(δ)|²dδ / ∫|W|²dδ = ∫|w'|²dt / (4π²∫w²dt),
 *   and for w = sin²(πt/T): ∫|w'|² = π²/(2T), ∫w² = 3T/8, so μ₂ = 1/(3T²);
 * - second-order smoothing of a resonance H ∝ 1/(1 + jx), x = 2(f − f_r)/B_r: bias/H → −4μ₂/B_r²
 *   as Δf/B_r → 0 (Taylor expansion; the rule Bendat & Piersol state as −(1/3)(B_e/B_r)² for a
 *   rectangular spectral window, Random Data ch. 8, quoted from memory);
 * - Harris 1978 Table I noise bandwidths: Hann 1.50 bins, rectangular 1.00 bins.
 */
import { EngineInputError } from '@/shared/engine/errors';
import { powerKernel, resolutionBias, smoothedFrf } from '@/shared/engine/scores/resolution-bias';
import { sdofModeFacts, sdofReceptance } from './scores-helpers';

describe('powerKernel', () => {
  it('Hann: weights sum to 1, symmetric, second moment 1/3 bin² (Parseval), ENBW 1.5 bins (Harris)', () => {
    const k = powerKernel('hann', 1024);
    let sum = 0;
    for (const v of k.weights) sum += v;
    expect(sum).toBeCloseTo(1, 12);
    const m = k.weights.length;
    for (let i = 0; i < m; i++) expect(k.weights[i]).toBeCloseTo(k.weights[m - 1 - i], 14);
    expect(k.secondMomentBins2).toBeCloseTo(1 / 3, 5);
    expect(k.enbwBins).toBeCloseTo(1.5, 12);
    // The peak weight sits at zero offset.
    expect(k.offsetsBins[(m - 1) / 2]).toBe(0);
  });

  it('untapered windows (rectangular, Hamming) report no second moment', () => {
    expect(Number.isNaN(powerKernel('rectangular', 256).secondMomentBins2)).toBe(true);
    expect(Number.isNaN(powerKernel('hamming', 256).secondMomentBins2)).toBe(true);
    expect(powerKernel('rectangular', 256).enbwBins).toBeCloseTo(1, 12);
  });

  it('rejects bad sampling options', () => {
    expect(() => powerKernel('hann', 256, { oversample: 3 })).toThrow(EngineInputError);
    expect(() => powerKernel('hann', 16, { halfWidthBins: 32 })).toThrow(/halfWidthBins/);
  });
});

describe('resolution bias predictions', () => {
  const sdof = { m: 1, k: (2 * Math.PI * 50) ** 2, zeta: 0.02 };
  const mode = sdofModeFacts(sdof);
  const frf = (f: Float64Array) => sdofReceptance(sdof, f);
  const kernel = powerKernel('hann', 1024);
  const br = mode.halfPowerBandwidthHz;
  const peakHz = 50 * Math.sqrt(1 - 2 * sdof.zeta ** 2);

  it('smoothing a constant FRF changes nothing', () => {
    const flat = (f: Float64Array) => ({ re: new Float64Array(f.length).fill(2), im: new Float64Array(f.length).fill(-1) });
    const s = smoothedFrf(flat, Float64Array.of(10, 20), kernel, 0.5);
    expect(s.re[0]).toBeCloseTo(2, 12);
    expect(s.im[1]).toBeCloseTo(-1, 12);
  });

  it('the kernel sum approaches the second-order figure −(4/3)(Δf/B_r)² for Hann as Δf/B_r → 0', () => {
    const fine = resolutionBias(frf, peakHz, br, kernel, br / 16);
    expect(fine.secondOrder).toBeCloseTo(-(4 / 3) / 256, 6);
    expect(Math.abs(fine.kernel / fine.secondOrder - 1)).toBeLessThan(0.03);
    const coarse = resolutionBias(frf, peakHz, br, kernel, br / 4);
    // At the common-practice Δf = B_r/4 the expansion overstates the bias by under 25 %.
    expect(coarse.kernel).toBeLessThan(0);
    expect(coarse.kernel / coarse.secondOrder).toBeGreaterThan(0.75);
    expect(coarse.kernel / coarse.secondOrder).toBeLessThan(1);
  });

  it('the bias falls as (Δf/B_r)²: halving Δf divides it by about 4', () => {
    const b = [8, 16, 32].map((r) => resolutionBias(frf, peakHz, br, kernel, br / r).kernel);
    expect(b[0] / b[1]).toBeGreaterThan(3.7);
    expect(b[0] / b[1]).toBeLessThan(4.1);
    expect(b[1] / b[2]).toBeGreaterThan(3.9);
    expect(b[1] / b[2]).toBeLessThan(4.05);
  });

  it('Bendat & Piersol with B_e = ENBW·Δf is −(1/3)(1.5·Δf/B_r)² for Hann: 0.5625× the second-order value', () => {
    const r = resolutionBias(frf, peakHz, br, kernel, br / 8);
    expect(r.bendatPiersol).toBeCloseTo(-(1 / 3) * (1.5 / 8) ** 2, 12);
    expect(r.bendatPiersol / r.secondOrder).toBeCloseTo(0.5625, 4);
    expect(r.effectiveBandwidthHz).toBeCloseTo(1.5 * (br / 8), 12);
  });
});
