/**
 * Scenarios: parse one, and simulate the force and response records it describes.
 *
 * The chain, in order (each stage optional except the first two):
 *   1. excitation samples over the synthesis record (stream 'excitation'), Nyquist line removed,
 *      scaled to the level over the record;
 *   2. response: exact synthesis Y = H·G·X (linear), or Runge–Kutta time integration with the
 *      cubic spring (synthesis/nonlinear.ts); G = output channel gain, phase and delay;
 *   3. clipping of the conditioned signals (errors.clipping);
 *   4. white noise on each channel (streams 'input-noise', 'output-noise'), sized by SNR over a
 *      band or by a PSD level against the clean channel;
 *   5. ADC quantisation and overload on each channel.
 * The reference to score against is always the underlying linear FRF; `referenceNote` says so
 * when a nonlinearity (cubic stiffness ≠ 0, clipping) is on. Same scenario and seed → the same
 * Float64 samples, bit for bit.
 */
import type { FrfQuantity } from './types';
import { EngineInputError } from './errors';
import { createRandom, RANDOM_STREAMS } from './random';
import { systemMatrices, type LinearSystem } from './systems';
import { clipInPlace, peakAbs, quantise } from './synthesis/adc';
import { excitationSamples, levelFactor } from './synthesis/excitation';
import { exactResponse, excitationSpectrum } from './synthesis/exact';
import { integrateResponse } from './synthesis/nonlinear';
import { addWhiteNoise, noiseSigma } from './synthesis/noise';
import { resolveScenario, type SynthesisPlan } from './synthesis/plan';
import type { Scenario, ScenarioInput } from './synthesis/scenario-schema';
import { nextPowerOfTwo, oneSidedSpectrum, realFromSpectrum, transformsFor, type RealTransforms } from './synthesis/spectrum';

export { scenarioSchema, type Scenario, type ScenarioInput, type ScenarioErrors } from './synthesis/scenario-schema';
export { resolveScenario, type SynthesisPlan } from './synthesis/plan';

/** SI unit of the response signal for each FRF quantity (the FRF unit times N). */
export const OUTPUT_UNITS: Record<FrfQuantity, string> = {
  receptance: 'm',
  mobility: 'm/s',
  accelerance: 'm/s²',
};

export interface SimulatedRecord {
  sampleRateHz: number;
  /** Force record, N. */
  input: Float64Array;
  /** Response record, in `outputUnit`. */
  output: Float64Array;
  inputUnit: 'N';
  outputUnit: string;
  /** The exact FRF to score against: the underlying linear system. */
  reference: LinearSystem;
  referenceNote?: string;
  report: { inputClippedSamples: number; outputClippedSamples: number; nonlinear: boolean; warnings: string[] };
}

/** Validates a scenario (EngineInputError names the field path) and fills in its defaults. */
export function parseScenario(json: unknown): Scenario {
  return resolveScenario(json).scenario;
}

/** Simulates the scenario's records for one seed (module doc). */
export function simulateScenario(input: Scenario | ScenarioInput, seed: number): SimulatedRecord {
  const { scenario: s, plan } = resolveScenario(input);
  createRandom(seed, RANDOM_STREAMS.excitation); // validates the seed before any work
  const warnings = [...plan.warnings];
  const fs = plan.sampleRateHz;
  const n = plan.recordSamples;
  const length = plan.synthesisSamples;
  const errors = s.errors;
  const system = plan.system;

  // 1. Excitation over the synthesis record.
  const random = createRandom(seed, RANDOM_STREAMS.excitation);
  let raw: Float64Array;
  if (plan.start === 'steady-state') {
    raw = excitationSamples(s.excitation, length, fs, random);
  } else {
    raw = new Float64Array(length);
    raw.set(excitationSamples(s.excitation, n, fs, random));
  }
  const transforms = transformsFor(length);
  const spectrum = excitationSpectrum(raw, transforms);
  const nyquistLine = Math.abs(oneSidedNyquist(raw)) / length;
  const force = realFromSpectrum(spectrum, length, transforms);
  const factor = levelFactor(s.excitation.level, force, n);
  for (let k = 0; k < spectrum.re.length; k++) {
    spectrum.re[k] *= factor;
    spectrum.im[k] *= factor;
  }
  const forceRecord = force.slice(0, n);
  for (let i = 0; i < n; i++) forceRecord[i] *= factor;
  const level = 'rmsN' in s.excitation.level ? s.excitation.level.rmsN : s.excitation.level.peakN;
  if (nyquistLine * factor > 1e-4 * level) {
    warnings.push(
      `the excitation had content at fs/2; removing that line leaves a ±${Number((nyquistLine * factor).toPrecision(3))} N alternating component on the force record`,
    );
  }

  // 2. Response.
  const channel = { delayS: errors.delayS, gain: errors.gainMismatch, phaseDeg: errors.phaseMismatchDeg };
  const cubic = errors.cubicStiffness;
  const responseRecord = cubic
    ? integratedResponse(s, plan, spectrum, transforms, warnings)
    : exactResponse(spectrum, { sampleRateHz: fs, frf: system.frf, channel, transforms }).slice(0, n);

  // 3. Clipping.
  const inputMask = new Uint8Array(n);
  const outputMask = new Uint8Array(n);
  if (errors.clipping?.inputLimitN !== undefined) clipInPlace(forceRecord, errors.clipping.inputLimitN, inputMask);
  if (errors.clipping?.outputLimit !== undefined) clipInPlace(responseRecord, errors.clipping.outputLimit, outputMask);

  // 4. Noise, sized against the clean (clipped) channels.
  if (errors.inputNoise) {
    const sigma = noiseSigma(errors.inputNoise, forceRecord, fs, plan.defaultNoiseBand);
    addWhiteNoise(forceRecord, sigma, createRandom(seed, RANDOM_STREAMS.inputNoise));
  }
  if (errors.outputNoise) {
    const sigma = noiseSigma(errors.outputNoise, responseRecord, fs, plan.defaultNoiseBand);
    addWhiteNoise(responseRecord, sigma, createRandom(seed, RANDOM_STREAMS.outputNoise));
  }

  // 5. ADC.
  let inputRecord: Float64Array = forceRecord;
  let outputRecord: Float64Array = responseRecord;
  if (errors.quantisation) {
    const q = errors.quantisation;
    const adc = (x: Float64Array, range: number | 'auto', mask: Uint8Array, name: string) => {
      const fullScale = range === 'auto' ? 1.25 * peakAbs(x) : range;
      if (!(fullScale > 0)) return x;
      const result = quantise(x, { bits: q.bits, fullScale }, mask);
      if (result.clipped > 0) warnings.push(`${name} ADC overloaded on ${result.clipped} samples (range ±${fullScale})`);
      return result.values;
    };
    inputRecord = adc(forceRecord, q.inputFullScale, inputMask, 'input');
    outputRecord = adc(responseRecord, q.outputFullScale, outputMask, 'output');
  }

  const nonlinear = (cubic !== undefined && cubic.k3NPerM3 !== 0) || errors.clipping !== undefined;
  const record: SimulatedRecord = {
    sampleRateHz: fs,
    input: inputRecord,
    output: outputRecord,
    inputUnit: 'N',
    outputUnit: OUTPUT_UNITS[system.quantity],
    reference: system,
    report: {
      inputClippedSamples: count(inputMask),
      outputClippedSamples: count(outputMask),
      nonlinear,
      warnings,
    },
  };
  if (nonlinear) record.referenceNote = referenceNote(s);
  return record;
}

/** Σ x[n]·(−1)^n, the Nyquist line of x. */
function oneSidedNyquist(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += i % 2 === 0 ? x[i] : -x[i];
  return s;
}

function count(mask: Uint8Array): number {
  let c = 0;
  for (let i = 0; i < mask.length; i++) c += mask[i];
  return c;
}

function referenceNote(s: Scenario): string {
  const parts: string[] = [];
  const cubic = s.errors.cubicStiffness;
  if (cubic && cubic.k3NPerM3 !== 0) parts.push(`a cubic spring k3 = ${cubic.k3NPerM3} N/m³ on spring ${cubic.springIndex}`);
  const clip = s.errors.clipping;
  if (clip?.inputLimitN !== undefined) parts.push(`force clipping at ±${clip.inputLimitN} N`);
  if (clip?.outputLimit !== undefined) parts.push(`response clipping at ±${clip.outputLimit}`);
  return `The reference is the underlying linear FRF; the simulated records include ${parts.join(' and ')}, so no estimate is expected to match it exactly.`;
}

/** Time-integrated response with the cubic spring, gain and phase applied afterwards. */
function integratedResponse(
  s: Scenario,
  plan: SynthesisPlan,
  spectrum: { re: Float64Array; im: Float64Array },
  transforms: RealTransforms,
  warnings: string[],
): Float64Array {
  const cubic = s.errors.cubicStiffness!;
  const matrices = systemMatrices(s.system)!;
  const between =
    s.system.kind === 'physical' ? s.system.springs[cubic.springIndex].between : (['ground', 0] as [number | 'ground', number | 'ground']);
  const y = integrateResponse({
    matrices,
    cubic: { k3NPerM3: cubic.k3NPerM3, between },
    quantity: plan.system.quantity,
    sampleRateHz: plan.sampleRateHz,
    oversampling: plan.oversampling,
    spectrum,
    delayS: s.errors.delayS,
    preRollSamples: plan.preRollSamples,
    recordSamples: plan.recordSamples,
    transforms,
  });
  for (let i = 0; i < y.length; i++) {
    if (!Number.isFinite(y[i])) {
      throw new EngineInputError('errors.cubicStiffness.k3NPerM3', cubic.k3NPerM3, 'makes the response diverge at this level');
    }
  }
  const gain = s.errors.gainMismatch ?? 1;
  const phaseDeg = s.errors.phaseMismatchDeg ?? 0;
  if (phaseDeg !== 0) {
    warnings.push('phase mismatch on a time-integrated record is applied over the record as one block (circular at its ends)');
    return shiftPhase(y, gain, phaseDeg);
  }
  if (gain !== 1) for (let i = 0; i < y.length; i++) y[i] *= gain;
  return y;
}

/** g·exp(jφ) on every line above DC of the record zero-padded to a power of two. */
function shiftPhase(y: Float64Array, gain: number, phaseDeg: number): Float64Array {
  const length = nextPowerOfTwo(y.length);
  const padded = new Float64Array(length);
  padded.set(y);
  const spectrum = oneSidedSpectrum(padded);
  const c = Math.cos((phaseDeg * Math.PI) / 180);
  const sn = Math.sin((phaseDeg * Math.PI) / 180);
  spectrum.re[0] *= gain;
  spectrum.im[0] = 0;
  for (let k = 1; k < spectrum.re.length; k++) {
    const re = spectrum.re[k];
    const im = spectrum.im[k];
    spectrum.re[k] = gain * (re * c - im * sn);
    spectrum.im[k] = gain * (re * sn + im * c);
  }
  return realFromSpectrum(spectrum, length).slice(0, y.length);
}
