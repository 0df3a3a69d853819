/**
 * The Monte Carlo bench's inputs: one recipe and six invented Harbor Ridge Test Lab scenarios
 * (rooftop fan frame, drone motor arm, bench SDOF, two-mass chain), all at 1024 Hz for 16 s.
 */
import type { Recipe } from '../../shared/engine/recipe';
import type { ScenarioInput } from '../../shared/engine/scenario';

const acquisition = { sampleRateHz: 1024, durationS: 16 };
const random = { kind: 'random', band: { lowHz: 0, highHz: 450 }, level: { rmsN: 20 } };
const fanFrame = {
  kind: 'modal',
  quantity: 'accelerance',
  modes: [
    { naturalFrequencyHz: 24, dampingRatio: 0.02, modalConstant: 0.8 },
    { naturalFrequencyHz: 61, dampingRatio: 0.01, modalConstant: -0.5 },
    { naturalFrequencyHz: 97, dampingRatio: 0.005, modalConstant: 0.6 },
  ],
};

export const benchRecipe = {
  name: 'Harbor Ridge bench recipe: Hann 2048, 50 % overlap, H1',
  blockLength: 2048,
  window: 'hann',
  overlap: 0.5,
  detrend: 'none',
  estimator: 'H1',
  band: { lowHz: 10, highHz: 400 },
  scaling: 'density',
  tolerances: { magnitudeDb: 1, phaseDeg: 5, coveragePercent: 90, resonanceFrequencyPercent: 1, dampingPercent: 20, minCoherence: 0.8 },
} as Recipe;

export const benchScenarios = [
  { name: 'Fan frame, 30 dB output SNR', system: fanFrame, acquisition, excitation: random, errors: { outputNoise: { snrDb: 30 } } },
  { name: 'Fan frame, 20 dB input SNR', system: fanFrame, acquisition, excitation: random, errors: { inputNoise: { snrDb: 20 } } },
  { name: 'Fan frame, 1 ms cable delay', system: fanFrame, acquisition, excitation: random, errors: { delayS: 0.001, outputNoise: { snrDb: 40 } } },
  {
    name: 'Drone arm, first mode',
    system: { kind: 'modal', quantity: 'accelerance', modes: [{ naturalFrequencyHz: 340, dampingRatio: 0.01, modalConstant: 2 }] },
    acquisition,
    excitation: random,
    errors: { outputNoise: { snrDb: 25 } },
  },
  {
    name: 'Bench SDOF, 2 % gain mismatch',
    system: { kind: 'sdof', quantity: 'receptance', naturalFrequencyHz: 50, dampingRatio: 0.02, stiffnessNPerM: 1e5 },
    acquisition,
    excitation: random,
    errors: { gainMismatch: 1.02, outputNoise: { snrDb: 30 } },
  },
  {
    name: 'Two-mass chain, 12-bit converters',
    system: {
      kind: 'physical',
      quantity: 'mobility',
      massesKg: [2, 2],
      springs: [
        { between: ['ground', 0], stiffnessNPerM: 4e5 },
        { between: [0, 1], stiffnessNPerM: 4e5 },
      ],
      dampers: [
        { between: ['ground', 0], dampingNsPerM: 20 },
        { between: [0, 1], dampingNsPerM: 20 },
      ],
      inputNode: 1,
      outputNode: 1,
    },
    acquisition,
    excitation: random,
    errors: { quantisation: { bits: 12 } },
  },
] as ScenarioInput[];

export const SEEDS_PER_SCENARIO = 100;
