/**
 * Pre-flight refusals: each one refused in the positive case, not refused in the negative case,
 * and the figure it rests on checked against the rule the run itself applies (resolveRecipe,
 * Welch averaging, triggered blocks), so the check and the run cannot disagree.
 * Sources: Nyquist frequency fs/2 (sampling theorem); blocks of N samples stepped by
 * S = N − overlap·N fit floor((L − N)/S) + 1 times in L samples (P. D. Welch 1967, the segment
 * layout of his method); line spacing Δf = fs/N (DFT definition).
 */
import { preflight } from '@/shared/engine/preflight/check';
import { resolveRecipe, parseRecipe } from '@/shared/engine/recipe';
import { runScenarioSeed } from '@/shared/engine/study';
import { welchCrossSpectra } from '@/shared/engine/welch';
import { loadRecipe, loadScenario } from './built-in-helpers';
import { hannRecipe, sdofRandomScenario } from './study-helpers';

const codes = (findings: { code: string }[]) => findings.map((f) => f.code);
const base = sdofRandomScenario(); // fs 256 Hz, 128 s = 32 768 samples, force 0–120 Hz, mode at 50 Hz
const record = { sampleRateHz: 256, samples: 32768 };

describe('preflight: a sound pair', () => {
  it('has no refusal and no warning (SDOF at 50 Hz, Hann 1024-sample blocks, band 30–70 Hz inside the 0–120 Hz force)', () => {
    const p = preflight(hannRecipe(), base);
    expect(p.refusals).toEqual([]);
    expect(p.warnings).toEqual([]);
    expect(p.figures).toMatchObject({ blockLength: 1024, frequencyResolutionHz: 0.25, stepSamples: 512, blocksAvailable: 63, blocksUsed: 63 });
  });
});

describe('preflight refusals', () => {
  it('band above Nyquist: 30–900 Hz on a 512 Hz scenario is refused in plain words; a band ending at Nyquist is not', () => {
    const scenario = sdofRandomScenario({ fs: 512, durationS: 64 });
    const p = preflight(hannRecipe({ band: { lowHz: 30, highHz: 900 } }), scenario);
    const r = p.refusals.find((f) => f.code === 'band-above-nyquist')!;
    expect(r.message).toBe("The recipe's band reaches 900 Hz, above the scenario's Nyquist frequency of 256 Hz.");
    expect(r.fix).toBe("Lower the band's upper edge to 256 Hz or less, or raise the scenario's sample rate above 1800 Hz.");
    expect(r).toMatchObject({ severity: 'refusal', setting: 'band' });
    const edge = hannRecipe({ band: { lowHz: 30, highHz: 256 } });
    expect(codes(preflight(edge, scenario).refusals)).not.toContain('band-above-nyquist');
    // The run's own resolver agrees on both sides of the edge.
    expect(() => resolveRecipe(parseRecipe(edge), { sampleRateHz: 512, samples: 32768 })).not.toThrow();
    expect(() => resolveRecipe(parseRecipe(hannRecipe({ band: { lowHz: 30, highHz: 256.01 } })), { sampleRateHz: 512, samples: 32768 })).toThrow();
  });

  it('block longer than the record: 65 536 samples on a 32 768-sample record is refused; 32 768 is not', () => {
    const p = preflight(hannRecipe({ blockLength: 65536 }), base);
    expect(codes(p.refusals)).toEqual(['block-longer-than-record']);
    expect(p.refusals[0].message).toBe("The recipe's block of 65 536 samples (256 s) is longer than the scenario's record of 32 768 samples (128 s).");
    expect(p.figures).toBeNull();
    // Asked as a line spacing: 256 Hz / 0.00390625 Hz = 65 536 samples.
    const byResolution = preflight(hannRecipe({ blockLength: undefined, frequencyResolutionHz: 0.00390625 }), base);
    expect(byResolution.refusals[0].message).toMatch(/^The recipe's line spacing of 0.003906 Hz needs a block of 65 536 samples/);
    expect(codes(preflight(hannRecipe({ blockLength: 32768 }), base).refusals)).toEqual([]);
    expect(() => resolveRecipe(parseRecipe(hannRecipe({ blockLength: 65536 })), record)).toThrow();
  });

  it('more averages than the record holds: 64 blocks of 1024 at 50 % need 33 280 samples, the record holds 63', () => {
    const p = preflight(hannRecipe({ averages: 64 }), base);
    expect(codes(p.refusals)).toEqual(['too-few-blocks']);
    expect(p.refusals[0].message).toContain('which need 33 280 samples'); // 1024 + 63·512
    expect(p.refusals[0].fix).toMatch(/^Ask for at most 63 averages/);
    expect(codes(preflight(hannRecipe({ averages: 63 }), base).refusals)).toEqual([]);
    // Welch averaging on the same layout finds 63 blocks too (it averages fewer and says so).
    const x = Float64Array.from({ length: 32768 }, (_, i) => Math.sin(0.1 * i) + Math.cos(0.37 * i));
    const spectra = welchCrossSpectra(x, x, { sampleRateHz: 256, blockLength: 1024, window: 'hann', overlap: 0.5, averages: 64, detrend: 'none', scaling: 'density' });
    expect(spectra.blocks).toBe(63);
  });

  it('more triggered blocks than hits: the 8 s impact record holds 7 whole 1 s blocks after a hit (as the run finds)', () => {
    const scenario = loadScenario('arm-impact-exponential');
    const recipe = loadRecipe('arm-impact-force-exponential');
    expect(codes(preflight({ ...recipe, averages: 8 }, scenario).refusals)).toEqual(['too-few-blocks']);
    const seven = preflight({ ...recipe, averages: 7 }, scenario);
    expect(codes(seven.refusals)).toEqual([]);
    expect(runScenarioSeed(scenario, recipe, 1).blocks).toBe(seven.figures!.blocksAvailable);
  });

  it('nothing excited: a 150–250 Hz band on a 0–120 Hz force is refused; 100–250 Hz overlaps and is only warned', () => {
    const scenario = sdofRandomScenario({ fs: 512, durationS: 64 });
    const p = preflight(hannRecipe({ band: { lowHz: 150, highHz: 250 } }), scenario);
    expect(codes(p.refusals)).toEqual(['nothing-excited-in-band']);
    expect(p.refusals[0].message).toContain('lies wholly outside the band the scenario excites, 0–120 Hz');
    const partly = preflight(hannRecipe({ band: { lowHz: 100, highHz: 250 } }), scenario);
    expect(codes(partly.refusals)).toEqual([]);
    expect(codes(partly.warnings)).toContain('band-outside-excitation');
  });

  it('a band narrower than one line: 30.05–30.2 Hz holds no 0.25 Hz line; 30.05–30.25 Hz holds one', () => {
    expect(codes(preflight(hannRecipe({ band: { lowHz: 30.05, highHz: 30.2 } }), base).refusals)).toEqual(['band-without-lines']);
    expect(codes(preflight(hannRecipe({ band: { lowHz: 30.05, highHz: 30.25 } }), base).refusals)).toEqual([]);
    expect(() => resolveRecipe(parseRecipe(hannRecipe({ band: { lowHz: 30.05, highHz: 30.2 } })), record)).toThrow();
  });
});
