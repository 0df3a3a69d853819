/**
 * The Welch workload of tests/bench/reference_welch_bench.py, on our engine: two channels of
 * 2^21 samples, block 4096, Hann, 50 % overlap (1023 blocks), Gxx, Gyy, Gyx, H1, H2, coherence.
 * Plus the floor, the same number of bare complex FFTs of 4096 points (one per block), and the
 * full estimate (adds Hv and the random errors).
 */
import { PairedRealFft } from '../../shared/engine/fft';
import { welchCrossSpectra, type WelchOptions } from '../../shared/engine/welch';
import { coherenceEstimate, estimateFrf, h1Estimate, h2Estimate } from '../../shared/engine/estimators';
import { gaussianNoise } from '../engine/spectra-helpers';
import type { Workload } from './run';

const SAMPLES = 1 << 21;
const BLOCK = 4096;
const options: WelchOptions = { sampleRateHz: 1, blockLength: BLOCK, window: 'hann', overlap: 0.5, detrend: 'none', scaling: 'density' };

let x: Float64Array = new Float64Array(0);
let y: Float64Array = new Float64Array(0);

/** x white, y = x through a 2nd-order Butterworth low-pass at 0.1·Nyquist plus 1 % noise. */
function makeSignals(): void {
  if (x.length === SAMPLES) return;
  x = gaussianNoise('bench-x', SAMPLES);
  const noise = gaussianNoise('bench-n', SAMPLES, 0.01);
  const k = Math.tan((Math.PI * 0.1) / 2); // bilinear transform, as scipy.signal.butter(2, 0.1)
  const norm = 1 / (1 + Math.SQRT2 * k + k * k);
  const b0 = k * k * norm;
  const a1 = 2 * (k * k - 1) * norm;
  const a2 = (1 - Math.SQRT2 * k + k * k) * norm;
  y = new Float64Array(SAMPLES);
  let x1 = 0;
  let x2 = 0;
  let y1 = 0;
  let y2 = 0;
  for (let i = 0; i < SAMPLES; i++) {
    const v = b0 * (x[i] + 2 * x1 + x2) - a1 * y1 - a2 * y2;
    x2 = x1;
    x1 = x[i];
    y2 = y1;
    y1 = v;
    y[i] = v + noise[i];
  }
}

const paired = new PairedRealFft(BLOCK);
const blocks = (SAMPLES - BLOCK) / (BLOCK / 2) + 1;

export const workloads: Workload[] = [
  {
    name: 'welch-2ch-2^21-4096-hann50',
    setup: makeSignals,
    run: () => {
      const s = welchCrossSpectra(x, y, options);
      h1Estimate(s);
      h2Estimate(s);
      coherenceEstimate(s);
    },
  },
  {
    name: 'welch-2ch-2^21-4096-hann50-full-estimate',
    setup: makeSignals,
    run: () => {
      estimateFrf(welchCrossSpectra(x, y, options));
    },
  },
  {
    name: 'fft-floor-4096x1023',
    setup: () => paired.input.forEach((_, i, a) => (a[i] = Math.sin(0.37 * i))),
    run: () => {
      for (let j = 0; j < blocks; j++) paired.transformRaw();
    },
  },
];
