/**
 * Refusals of the pre-flight check: pairs of recipe and scenario that cannot run, or would run
 * only to fail the same way on every seed. The rules are those the run applies (recipe.ts
 * resolveRecipe, welch.ts, transient.ts), checked before anything is simulated.
 */
import type { Recipe } from '../recipe';
import type { Scenario, SynthesisPlan } from '../scenario';
import { plainCount, plainNumber, plainSeconds, type Finding, type PreflightFigures } from './findings';

const refusal = (f: Omit<Finding, 'severity'>): Finding => ({ ...f, severity: 'refusal' });

/** Band above Nyquist: the run throws on the band's upper edge. */
export function bandAboveNyquist(recipe: Recipe, plan: SynthesisPlan): Finding[] {
  const nyquist = plan.sampleRateHz / 2;
  const high = recipe.band.highHz;
  if (high <= nyquist) return [];
  return [
    refusal({
      code: 'band-above-nyquist',
      setting: 'band',
      settingLabel: "the band's upper edge",
      message: `The recipe's band reaches ${plainNumber(high)} Hz, above the scenario's Nyquist frequency of ${plainNumber(nyquist)} Hz.`,
      fix: `Lower the band's upper edge to ${plainNumber(nyquist)} Hz or less, or raise the scenario's sample rate above ${plainNumber(2 * high)} Hz.`,
    }),
  ];
}

/** A block longer than the record: no block fits (figures are null then). */
export function blockLongerThanRecord(recipe: Recipe, plan: SynthesisPlan, blockLength: number): Finding[] {
  const fs = plan.sampleRateHz;
  const record = plan.recordSamples;
  if (blockLength <= record) return [];
  const fitting = 2 ** Math.floor(Math.log2(record));
  const asked =
    recipe.frequencyResolutionHz !== undefined
      ? `The recipe's line spacing of ${plainNumber(recipe.frequencyResolutionHz)} Hz needs a block of ${plainCount(blockLength)} samples (${plainSeconds(blockLength / fs)})`
      : `The recipe's block of ${plainCount(blockLength)} samples (${plainSeconds(blockLength / fs)})`;
  return [
    refusal({
      code: 'block-longer-than-record',
      setting: 'blockLength',
      settingLabel: 'the block length',
      message: `${asked} is longer than the scenario's record of ${plainCount(record)} samples (${plainSeconds(record / fs)}).`,
      fix: `Shorten the block to ${plainCount(fitting)} samples or fewer (lines of ${plainNumber(fs / fitting)} Hz), or lengthen the record to at least ${plainSeconds(blockLength / fs)}.`,
    }),
  ];
}

/** More blocks asked than the record holds (or, for a transient recipe, no triggered block). */
export function tooFewBlocks(recipe: Recipe, plan: SynthesisPlan, figures: PreflightFigures): Finding[] {
  const fs = plan.sampleRateHz;
  const { blockLength: n, stepSamples: step, blocksAvailable: available, recordSamples: record } = figures;
  const asked = typeof recipe.averages === 'number' ? recipe.averages : undefined;
  if (recipe.transient) {
    if (available > 0 && (asked === undefined || asked <= available)) return [];
    const wanted = asked === undefined ? 'at least one triggered block' : `${plainCount(asked)} triggered blocks`;
    return [
      refusal({
        code: 'too-few-blocks',
        setting: 'averages',
        settingLabel: 'the number of averages',
        message: `The recipe asks for ${wanted} of ${plainCount(n)} samples; the scenario's record of ${plainSeconds(record / fs)} holds ${plainCount(available)} hits with a whole block after them.`,
        fix: available > 0
          ? `Ask for at most ${plainCount(available)} averages, or lengthen the record.`
          : 'Shorten the block or lengthen the record so a whole block follows a hit.',
      }),
    ];
  }
  if (asked === undefined || asked <= available) return [];
  const needed = n + (asked - 1) * step;
  return [
    refusal({
      code: 'too-few-blocks',
      setting: 'averages',
      settingLabel: 'the number of averages',
      message: `The recipe asks for ${plainCount(asked)} averages of ${plainCount(n)}-sample blocks at ${plainNumber(100 * recipe.overlap)} % overlap, which need ${plainCount(needed)} samples (${plainSeconds(needed / fs)}); the scenario's record holds ${plainCount(record)} samples (${plainSeconds(record / fs)}), enough for ${plainCount(available)}.`,
      fix: `Ask for at most ${plainCount(available)} averages, or lengthen the record to at least ${plainSeconds(needed / fs)}.`,
    }),
  ];
}

/** A band that holds no excited line: every figure would be leakage and noise. */
export function nothingExcitedInBand(recipe: Recipe, scenario: Scenario): Finding[] {
  const e = scenario.excitation;
  if (e.kind === 'impact') return []; // a pulse excites from DC up; its upper edge is a warning
  const { lowHz, highHz } = recipe.band;
  if (highHz > e.band.lowHz && lowHz < e.band.highHz) return [];
  return [
    refusal({
      code: 'nothing-excited-in-band',
      setting: 'band',
      settingLabel: 'the band',
      message: `The recipe's band, ${plainNumber(lowHz)}–${plainNumber(highHz)} Hz, lies wholly outside the band the scenario excites, ${plainNumber(e.band.lowHz)}–${plainNumber(e.band.highHz)} Hz: every line would show only leakage and noise.`,
      fix: `Move the band inside ${plainNumber(e.band.lowHz)}–${plainNumber(e.band.highHz)} Hz, or widen the scenario's excitation band.`,
    }),
  ];
}

/** A band narrower than one line spacing (the run throws on it). */
export function bandWithoutLines(recipe: Recipe, figures: PreflightFigures): Finding[] {
  const df = figures.frequencyResolutionHz;
  const start = Math.ceil(recipe.band.lowHz / df - 1e-9);
  const end = Math.min(figures.blockLength / 2, Math.floor(recipe.band.highHz / df + 1e-9));
  if (end >= start) return [];
  return [
    refusal({
      code: 'band-without-lines',
      setting: 'band',
      settingLabel: 'the band',
      message: `The recipe's band, ${plainNumber(recipe.band.lowHz)}–${plainNumber(recipe.band.highHz)} Hz, holds no frequency line at a line spacing of ${plainNumber(df)} Hz.`,
      fix: `Widen the band to more than ${plainNumber(df)} Hz or use finer lines (a longer block).`,
    }),
  ];
}
