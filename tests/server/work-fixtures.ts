/**
 * Small definitions for the work-side server tests: an SDOF scenario and a recipe sized so that
 * one run takes milliseconds. The SDOF figures (fn = 50 Hz, ζ = 2 %, k = 1e4 N/m) are the
 * textbook single-degree-of-freedom receptance 1/(k − mω² + jcω) (e.g. S. S. Rao, Mechanical
 * Vibrations); the tests use them only as known-answer inputs.
 */
export const sdofSystem = { kind: 'sdof', quantity: 'receptance', stiffnessNPerM: 1e4, naturalFrequencyHz: 50, dampingRatio: 0.02 } as const;

export function smallScenario(name = 'SDOF 50 Hz, output noise', snrDb = 30) {
  return {
    name,
    system: sdofSystem,
    acquisition: { sampleRateHz: 512, durationS: 8 },
    excitation: { kind: 'random', band: { lowHz: 0, highHz: 200 }, level: { rmsN: 1 } },
    errors: { outputNoise: { snrDb } },
  };
}

export function smallRecipe(name = 'Hann 256, H1') {
  return {
    name,
    blockLength: 256,
    window: 'hann',
    overlap: 0.5,
    detrend: 'none',
    estimator: 'H1',
    band: { lowHz: 10, highHz: 150 },
    scaling: 'density',
    tolerances: { magnitudeDb: 3, phaseDeg: 20, minCoherence: 0.5 },
  };
}
