/**
 * Seeded random numbers for the engine. Nothing in shared/engine may call Math.random: every
 * random sequence comes from here, so a (seed, stream) pair reproduces a record bit for bit.
 *
 * Generator: seedrandom's Alea (53-bit multiply-with-carry), seeded with the text
 * `plumbline:<seed>:<stream>`. Different stream names give independent sequences from one study
 * seed, e.g. 'excitation', 'input-noise', 'output-noise'.
 *
 * Gaussian deviates: the Box–Muller transform (G. E. P. Box and M. E. Muller, "A note on the
 * generation of random normal deviates", Ann. Math. Statist. 29(2), 1958), using both deviates of
 * each pair in turn, so the sequence depends only on the seed and the number of draws.
 */
import seedrandom from 'seedrandom';
import { EngineInputError } from './errors';

/** Standard stream names used by the synthesis. */
export const RANDOM_STREAMS = {
  excitation: 'excitation',
  inputNoise: 'input-noise',
  outputNoise: 'output-noise',
} as const;

export interface RandomSource {
  /** Uniform deviate in [0, 1) with 53-bit resolution. */
  uniform(): number;
  /** Standard normal deviate (mean 0, variance 1). */
  gaussian(): number;
  /** Fills `target` with independent normal deviates of standard deviation `sigma`; returns it. */
  fillGaussian(target: Float64Array, sigma: number): Float64Array;
}

/**
 * A seeded generator for one named stream. `seed` must be a non-negative safe integer and
 * `stream` a non-empty name; the same pair always gives the same sequence.
 */
export function createRandom(seed: number, stream: string): RandomSource {
  if (typeof seed !== 'number' || !Number.isSafeInteger(seed) || seed < 0) {
    throw new EngineInputError('seed', seed, 'must be a non-negative whole number');
  }
  if (typeof stream !== 'string' || stream.length === 0) {
    throw new EngineInputError('stream', stream, 'must be a non-empty name');
  }
  const prng = seedrandom.alea(`plumbline:${seed}:${stream}`);
  let spare = 0;
  let hasSpare = false;

  const uniform = (): number => prng.double();

  const gaussian = (): number => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    // 1 − u lies in (0, 1], so the logarithm is finite.
    const u1 = 1 - prng.double();
    const u2 = prng.double();
    const radius = Math.sqrt(-2 * Math.log(u1));
    const angle = 2 * Math.PI * u2;
    spare = radius * Math.sin(angle);
    hasSpare = true;
    return radius * Math.cos(angle);
  };

  const fillGaussian = (target: Float64Array, sigma: number): Float64Array => {
    if (typeof sigma !== 'number' || !Number.isFinite(sigma) || sigma < 0) {
      throw new EngineInputError('sigma', sigma, 'must be a finite number ≥ 0');
    }
    for (let i = 0; i < target.length; i++) target[i] = sigma * gaussian();
    return target;
  };

  return { uniform, gaussian, fillGaussian };
}
