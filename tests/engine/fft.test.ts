/** FFT wrapper: two-for-one packing against a direct DFT, round trips, validation. */
import { PairedRealFft, accumulatePairedSpectra, fft, inverseFft, isPowerOfTwo, realFft } from '@/shared/engine/fft';
import { EngineInputError } from '@/shared/engine/errors';
import { gaussianNoise } from './spectra-helpers';

/** Direct O(N²) DFT, X[k] = Σ x[n] exp(−2πi k n / N) (the definition). */
function dft(x: Float64Array): { re: Float64Array; im: Float64Array } {
  const n = x.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    for (let j = 0; j < n; j++) {
      const a = (-2 * Math.PI * ((k * j) % n)) / n;
      re[k] += x[j] * Math.cos(a);
      im[k] += x[j] * Math.sin(a);
    }
  }
  return { re, im };
}

describe('PairedRealFft (one complex FFT for two real blocks)', () => {
  it.each([4, 8, 64, 256])('matches the direct DFT of both channels, N = %d', (n) => {
    const x = gaussianNoise(`fft-x-${n}`, n);
    const y = gaussianNoise(`fft-y-${n}`, n);
    const p = new PairedRealFft(n);
    for (let i = 0; i < n; i++) {
      p.input[2 * i] = x[i];
      p.input[2 * i + 1] = y[i];
    }
    p.transform();
    const dx = dft(x);
    const dy = dft(y);
    let worst = 0;
    let scale = 0;
    for (let k = 0; k <= n / 2; k++) {
      scale = Math.max(scale, Math.hypot(dx.re[k], dx.im[k]), Math.hypot(dy.re[k], dy.im[k]));
      worst = Math.max(
        worst,
        Math.hypot(p.xRe[k] - dx.re[k], p.xIm[k] - dx.im[k]),
        Math.hypot(p.yRe[k] - dy.re[k], p.yIm[k] - dy.im[k]),
      );
    }
    expect(worst / scale).toBeLessThan(1e-13);
  });
});

describe('accumulatePairedSpectra (separation fused with accumulation)', () => {
  it('adds 4·|X|², 4·|Y|², 4·Y·conj(X) of the direct DFT, at every line including 0 and N/2', () => {
    const n = 32;
    const x = gaussianNoise('acc-x', n);
    const y = gaussianNoise('acc-y', n);
    const p = new PairedRealFft(n);
    x.forEach((v, i) => ((p.input[2 * i] = v), (p.input[2 * i + 1] = y[i])));
    const sums = [0, 1, 2, 3].map(() => new Float64Array(n / 2 + 1).fill(1)); // adds to what is there
    accumulatePairedSpectra(p, sums[0], sums[1], sums[2], sums[3]);
    const dx = dft(x);
    const dy = dft(y);
    for (let k = 0; k <= n / 2; k++) {
      const scale = 4 * (dx.re[k] ** 2 + dx.im[k] ** 2 + dy.re[k] ** 2 + dy.im[k] ** 2);
      const expected = [
        4 * (dx.re[k] ** 2 + dx.im[k] ** 2),
        4 * (dy.re[k] ** 2 + dy.im[k] ** 2),
        4 * (dy.re[k] * dx.re[k] + dy.im[k] * dx.im[k]),
        4 * (dy.im[k] * dx.re[k] - dy.re[k] * dx.im[k]),
      ];
      expected.forEach((e, i) => expect(Math.abs(sums[i][k] - 1 - e)).toBeLessThan(1e-12 * scale));
    }
  });
});

describe('fft / inverseFft / realFft', () => {
  it('inverse undoes forward (1/N on the inverse)', () => {
    const re = gaussianNoise('rt-re', 128);
    const im = gaussianNoise('rt-im', 128);
    const back = inverseFft(fft(re, im).re, fft(re, im).im);
    for (let i = 0; i < 128; i++) {
      expect(back.re[i]).toBeCloseTo(re[i], 13);
      expect(back.im[i]).toBeCloseTo(im[i], 13);
    }
  });
  it('a cosine of amplitude A on bin 5 gives X[5] = A·N/2 (analytic)', () => {
    const n = 64;
    const x = new Float64Array(n).map((_, i) => 3 * Math.cos((2 * Math.PI * 5 * i) / n));
    const s = realFft(x);
    expect(s.re.length).toBe(33);
    expect(s.re[5]).toBeCloseTo(96, 11);
    expect(Math.abs(s.im[5])).toBeLessThan(1e-12);
    expect(Math.abs(s.re[4])).toBeLessThan(1e-12);
  });
});

describe('validation', () => {
  it('isPowerOfTwo', () => {
    expect([2, 4, 1024].every(isPowerOfTwo)).toBe(true);
    expect([0, 1, 3, 6, 2.5, -4].some(isPowerOfTwo)).toBe(false);
  });
  it('rejects a non-power-of-two block length, naming blockLength', () => {
    expect(() => new PairedRealFft(100)).toThrow(EngineInputError);
    expect(() => new PairedRealFft(100)).toThrow(/^blockLength=100 /);
  });
  it('rejects unequal re/im lengths and non-power-of-two lengths', () => {
    expect(() => fft(new Float64Array(8), new Float64Array(4))).toThrow(/^im.length=4 /);
    expect(() => fft(new Float64Array(6), new Float64Array(6))).toThrow(/^n=6 /);
  });
});
