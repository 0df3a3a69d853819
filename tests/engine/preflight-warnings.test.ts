/**
 * Pre-flight warnings: each one given in the positive case and not in the negative case.
 * Sources of the figures checked:
 * - Welch's equivalent number of averages n_eff = K / [1 + 2 Σ_j (1 − j/K)·c(j·S)²]
 *   (P. D. Welch, IEEE Trans. Audio Electroacoust. AU-15(2), 1967) with the Hann window's overlap
 *   correlation at 50 %, 16.7 % (F. J. Harris, Proc. IEEE 66(1), 1978, Table I, quoted from
 *   memory; exactly 1/6 for the DFT-even window);
 * - a one-block coherence |Gyx|²/(Gxx·Gyy) = |Y·X*|²/(|X|²|Y|²) = 1 at every line (its definition);
 * - the DFT of N samples of a P-periodic signal puts all energy on its own lines iff P divides N
 *   (any signals text); 0.5 Hz / 85 Hz = 0.588 % (arithmetic).
 */
import { preflight } from '@/shared/engine/preflight/check';
import { blocksForEffectiveAverages } from '@/shared/engine/preflight/warnings';
import { processRecord } from '@/shared/engine/process';
import { simulateScenario, type ScenarioInput } from '@/shared/engine/scenario';
import { loadRecipe, loadScenario } from './built-in-helpers';
import { hannRecipe, sdofRandomScenario } from './study-helpers';

const codes = (findings: { code: string }[]) => findings.map((f) => f.code);
const base = sdofRandomScenario(); // fs 256 Hz, 32 768 samples, force 0–120 Hz, mode at 50 Hz
const C50 = 0.167; // Harris 1978, Table I: Hann overlap correlation at 50 % (quoted from memory)

function modalScenario(fs: number, band: { lowHz: number; highHz: number }): ScenarioInput {
  return {
    name: 'Harbor Ridge arm, two modes',
    system: {
      kind: 'modal',
      quantity: 'accelerance',
      modes: [
        { naturalFrequencyHz: 340, dampingRatio: 0.005, modalConstant: 12.5 },
        { naturalFrequencyHz: 910, dampingRatio: 0.012, modalConstant: 8 },
      ],
    },
    acquisition: { sampleRateHz: fs, durationS: 16 },
    excitation: { kind: 'random', band, level: { rmsN: 2 } },
  } as ScenarioInput;
}

describe('preflight warnings', () => {
  it('band partly outside the excitation: lines above the 120 Hz force edge are named; a band inside is quiet', () => {
    const scenario = sdofRandomScenario({ fs: 512, durationS: 64 });
    const w = preflight(hannRecipe({ band: { lowHz: 30, highHz: 200 } }), scenario).warnings;
    expect(codes(w)).toEqual(['band-outside-excitation']);
    expect(w[0].message).toContain('the lines in 120–200 Hz carry no force');
    expect(codes(preflight(hannRecipe({ band: { lowHz: 30, highHz: 120 } }), scenario).warnings)).toEqual([]);
  });

  it('impact: a band past the half-sine pulse’s first spectral zero 3/(2T) is warned; one below it is not', () => {
    const scenario = loadScenario('arm-impact-exponential'); // T = 1/1024 s: first zero at 1536 Hz
    const recipe = loadRecipe('arm-impact-force-exponential');
    const past = preflight({ ...recipe, band: { lowHz: 200, highHz: 2000 } }, scenario).warnings;
    expect(past.find((f) => f.code === 'band-outside-excitation')?.message).toContain('above 1536 Hz');
    expect(codes(preflight(recipe, scenario).warnings)).not.toContain('band-outside-excitation');
  });

  it('a periodic excitation whose period is not whole in the block is warned, and the leakage is real', () => {
    const scenario = loadScenario('arm-periodic-excitation'); // pseudo-random, 1024-sample period, no noise
    const rect = (blockLength: number) => ({ ...loadRecipe('arm-burst-random-rectangular'), blockLength, band: { lowHz: 200, highHz: 1200 } });
    const half = preflight(rect(512), scenario).warnings;
    expect(codes(half)).toContain('period-not-whole-in-block');
    expect(half.find((f) => f.code === 'period-not-whole-in-block')!.message).toContain('each block holds only part of a period');
    expect(codes(preflight(rect(1024), scenario).warnings)).not.toContain('period-not-whole-in-block');
    expect(codes(preflight(rect(2048), scenario).warnings)).not.toContain('period-not-whole-in-block');
    // The physics behind it: the whole-period block matches the exact FRF to rounding, the half one does not.
    const record = simulateScenario(scenario, 1);
    const worstDb = (blockLength: number) => {
      const p = processRecord(record, rect(blockLength));
      const exact = record.reference.frf(p.frequenciesHz);
      let worst = 0;
      for (let k = p.bandIndices.start; k < p.bandIndices.end; k++) {
        const ratio = Math.hypot(p.chosen.re[k], p.chosen.im[k]) / Math.hypot(exact.re[k], exact.im[k]);
        worst = Math.max(worst, Math.abs(20 * Math.log10(ratio)));
      }
      return worst;
    };
    expect(worstDb(1024)).toBeLessThan(1e-6);
    expect(worstDb(512)).toBeGreaterThan(1);
  });

  it('modes: 910 Hz above the 512 Hz Nyquist frequency of a 1024 Hz scenario; 910 Hz outside a 100–500 Hz band', () => {
    const low = preflight(hannRecipe({ band: { lowHz: 100, highHz: 500 } }), modalScenario(1024, { lowHz: 50, highHz: 500 })).warnings;
    expect(codes(low)).toEqual(['mode-above-nyquist']);
    expect(low[0].message).toContain('mode at 910 Hz lies above the scenario\'s Nyquist frequency of 512 Hz');
    const high = modalScenario(4096, { lowHz: 50, highHz: 1500 });
    expect(codes(preflight(hannRecipe({ band: { lowHz: 100, highHz: 500 } }), high).warnings)).toEqual(['mode-outside-band']);
    expect(codes(preflight(hannRecipe({ band: { lowHz: 100, highHz: 1500 } }), high).warnings)).toEqual([]);
  });

  it('0.5 Hz lines against a 0.5 % resonance tolerance at 85 Hz are 0.588 % per line: warned; 0.25 Hz lines are not', () => {
    const scenario = sdofRandomScenario({ fn: 85, fs: 512, durationS: 64 });
    const tolerances = { magnitudeDb: 1, resonanceFrequencyPercent: 0.5 };
    const coarse = preflight(hannRecipe({ blockLength: 1024, band: { lowHz: 60, highHz: 110 }, tolerances }), scenario).warnings;
    expect(codes(coarse)).toEqual(['resolution-coarser-than-tolerance']);
    expect(coarse[0].message).toContain('0.5 Hz is 0.5882 % of the 85 Hz mode');
    expect(coarse[0].fix).toContain('lines of 0.425 Hz or finer (a block of 2 048 samples');
    expect(codes(preflight(hannRecipe({ blockLength: 2048, band: { lowHz: 60, highHz: 110 }, tolerances }), scenario).warnings)).toEqual([]);
  });

  it("effective averages follow Welch's formula: 5 Hann blocks at 50 % are worth 4.79; 11 blocks are the fewest worth 10", () => {
    const five = preflight(hannRecipe({ averages: 5 }), base);
    const welch = (k: number) => k / (1 + 2 * (1 - 1 / k) * C50 * C50); // only the neighbour overlaps at 50 %
    expect(five.figures!.effectiveAverages).toBeCloseTo(welch(5), 2);
    expect(codes(five.warnings)).toEqual(['few-effective-averages']);
    expect(welch(10)).toBeLessThan(10);
    expect(welch(11)).toBeGreaterThanOrEqual(10);
    expect(blocksForEffectiveAverages(hannRecipe({ averages: 5 }), five.figures!)).toBe(11);
    expect(five.warnings[0].fix).toContain('at least 11 blocks');
    expect(codes(preflight(hannRecipe({ averages: 11 }), base).warnings)).toEqual([]);
    expect(codes(preflight(hannRecipe({ averages: 10 }), base).warnings)).toEqual(['few-effective-averages']);
  });

  it('one block: warned that coherence is 1 whatever the noise — and a noisy one-block estimate shows exactly that', () => {
    const noisy = sdofRandomScenario({ snrDb: 0, durationS: 4 }); // 1024 samples, 0 dB SNR on the response
    const recipe = hannRecipe({ blockLength: 1024 });
    const w = preflight(recipe, noisy).warnings;
    expect(codes(w)).toEqual(['few-effective-averages']);
    expect(w[0].message).toContain('coherence is then exactly 1 at every line');
    const p = processRecord(simulateScenario(noisy, 3), recipe);
    for (let k = p.bandIndices.start; k < p.bandIndices.end; k++) expect(p.estimate.coherence[k]).toBeCloseTo(1, 9);
  });

  it('a recipe with no tolerance is warned; one tolerance is enough', () => {
    expect(codes(preflight(hannRecipe({ tolerances: {} }), base).warnings)).toEqual(['no-criteria']);
    expect(codes(preflight(hannRecipe({ tolerances: { phaseDeg: 5 } }), base).warnings)).toEqual([]);
  });
});
