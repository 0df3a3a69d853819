/**
 * Warnings of the pre-flight check: the pair runs, but some figure of the result would mislead
 * unless read with the warning. Sources beside each rule.
 */
import type { Recipe } from '../recipe';
import type { Scenario, SynthesisPlan } from '../scenario';
import { effectiveAverages } from '../welch';
import { windowSamples } from '../windows';
import { plainCount, plainNumber, plainSeconds, type Finding, type PreflightFigures } from './findings';

/**
 * Fewer effective averages than this make coherence and random-error figures unreliable
 * (common practice; at one average the coherence estimate is identically 1).
 */
export const MIN_EFFECTIVE_AVERAGES = 10;

/** Most blocks the averages advice searches before giving up. */
const MAX_BLOCK_SEARCH = 100_000;

const warning = (f: Omit<Finding, 'severity'>): Finding => ({ ...f, severity: 'warning' });

/** Band lines that carry no force: their errors show leakage and noise, not the recipe. */
export function bandOutsideExcitation(recipe: Recipe, scenario: Scenario, figures: PreflightFigures | null, plan: SynthesisPlan): Finding[] {
  const e = scenario.excitation;
  const { lowHz, highHz } = recipe.band;
  if (e.kind === 'impact') {
    const edge = figures?.excitationBand.highHz ?? 1.5 / e.pulseDurationS;
    if (highHz <= edge || edge >= plan.sampleRateHz / 2) return [];
    return [
      warning({
        code: 'band-outside-excitation',
        setting: 'band',
        settingLabel: "the band's upper edge",
        message: `The recipe's band reaches ${plainNumber(highHz)} Hz, above ${plainNumber(edge)} Hz, the first spectral zero of the hammer's ${plainSeconds(e.pulseDurationS)} pulse: beyond it the lines get hardly any force, so their errors show leakage and noise, not the recipe.`,
        fix: `Keep the band below ${plainNumber(edge)} Hz, or use a shorter pulse (a harder hammer tip).`,
      }),
    ];
  }
  const below = lowHz < e.band.lowHz - 1e-9;
  const above = highHz > e.band.highHz + 1e-9;
  const overlaps = highHz > e.band.lowHz && lowHz < e.band.highHz;
  if (!overlaps || (!below && !above)) return [];
  const parts = [below ? `${plainNumber(lowHz)}–${plainNumber(e.band.lowHz)} Hz` : '', above ? `${plainNumber(e.band.highHz)}–${plainNumber(highHz)} Hz` : ''].filter(Boolean);
  return [
    warning({
      code: 'band-outside-excitation',
      setting: 'band',
      settingLabel: 'the band',
      message: `The recipe's band, ${plainNumber(lowHz)}–${plainNumber(highHz)} Hz, reaches outside the band the scenario excites, ${plainNumber(e.band.lowHz)}–${plainNumber(e.band.highHz)} Hz: the lines in ${parts.join(' and ')} carry no force, so their errors show leakage and noise, not the recipe.`,
      fix: `Keep the band within ${plainNumber(e.band.lowHz)}–${plainNumber(e.band.highHz)} Hz, or widen the scenario's excitation band.`,
    }),
  ];
}

/**
 * A repeating excitation is leakage-free only when each block holds a whole number of its periods
 * (the DFT of N samples of a P-periodic signal has all its energy on its own lines iff P divides
 * N; any signals text). Transient recipes trigger their own blocks and are left out.
 */
export function periodNotWholeInBlock(recipe: Recipe, scenario: Scenario, plan: SynthesisPlan, figures: PreflightFigures): Finding[] {
  const kind = scenario.excitation.kind;
  const period = plan.periodSamples;
  if (recipe.transient || period <= 0 || kind === 'random' || kind === 'impact') return [];
  const n = figures.blockLength;
  if (n % period === 0) return [];
  const fs = plan.sampleRateHz;
  const what = kind === 'burst-random' ? 'burst random excitation repeats its burst block' : `${kind.replace('-', ' ')} excitation repeats`;
  const holds = n < period ? 'each block holds only part of a period' : `each block holds ${plainNumber(n / period)} periods, not a whole number`;
  return [
    warning({
      code: 'period-not-whole-in-block',
      setting: 'blockLength',
      settingLabel: 'the block length',
      message: `The scenario's ${what} every ${plainCount(period)} samples (${plainSeconds(period / fs)}), but the recipe's block is ${plainCount(n)} samples: ${holds}, so the lines leak.`,
      fix: `Make the block a whole number of periods, such as ${plainCount(period)} samples (lines of ${plainNumber(fs / period)} Hz), with a rectangular window.`,
    }),
  ];
}

/** Modes no result can show (above Nyquist) or no resonance criterion judges (outside the band). */
export function modesOutOfReach(recipe: Recipe, plan: SynthesisPlan): Finding[] {
  const nyquist = plan.sampleRateHz / 2;
  const out: Finding[] = [];
  for (const m of plan.system.modes) {
    const fn = m.naturalFrequencyHz;
    if (fn >= nyquist) {
      out.push(
        warning({
          code: 'mode-above-nyquist',
          setting: 'scenario.sampleRate',
          settingLabel: "the scenario's sample rate",
          message: `The system's mode at ${plainNumber(fn)} Hz lies above the scenario's Nyquist frequency of ${plainNumber(nyquist)} Hz: no line of any result can show it, though it still shapes the response below.`,
          fix: `Raise the sample rate above ${plainNumber(2 * fn)} Hz if that mode matters; otherwise record that it is not checked.`,
        }),
      );
    } else if (fn < recipe.band.lowHz || fn > recipe.band.highHz) {
      out.push(
        warning({
          code: 'mode-outside-band',
          setting: 'band',
          settingLabel: 'the band',
          message: `The system's mode at ${plainNumber(fn)} Hz lies outside the recipe's band, ${plainNumber(recipe.band.lowHz)}–${plainNumber(recipe.band.highHz)} Hz: no resonance figure judges it.`,
          fix: `Widen the band to include ${plainNumber(fn)} Hz if that mode matters.`,
        }),
      );
    }
  }
  return out;
}

/**
 * Line spacing against the resonance-frequency tolerance: a resonance read from the lines is
 * placed on the line grid, so a spacing wider than tol·f_n can put it off by more than the
 * tolerance (common practice). Checked at the band mode where Δf/f_n is largest.
 */
export function resolutionCoarserThanTolerance(recipe: Recipe, plan: SynthesisPlan, figures: PreflightFigures): Finding[] {
  const tol = recipe.tolerances.resonanceFrequencyPercent;
  if (tol === undefined) return [];
  const df = figures.frequencyResolutionHz;
  const inBand = plan.system.modes.filter((m) => m.naturalFrequencyHz >= recipe.band.lowHz && m.naturalFrequencyHz <= recipe.band.highHz && m.naturalFrequencyHz < figures.nyquistHz);
  if (inBand.length === 0) return [];
  const lowest = inBand.reduce((a, m) => (m.naturalFrequencyHz < a.naturalFrequencyHz ? m : a));
  const fn = lowest.naturalFrequencyHz;
  const percent = (100 * df) / fn;
  if (percent <= tol) return [];
  const wanted = (tol * fn) / 100;
  const block = 2 ** Math.ceil(Math.log2(figures.sampleRateHz / wanted) - 1e-12);
  return [
    warning({
      code: 'resolution-coarser-than-tolerance',
      setting: 'blockLength',
      settingLabel: 'the line spacing',
      message: `The line spacing of ${plainNumber(df)} Hz is ${plainNumber(percent)} % of the ${plainNumber(fn)} Hz mode's frequency, coarser than the recipe's resonance-frequency tolerance of ${plainNumber(tol)} %: a resonance read from the lines can be off by more than the tolerance.`,
      fix: `Use lines of ${plainNumber(wanted)} Hz or finer (a block of ${plainCount(block)} samples or longer), or widen the tolerance.`,
    }),
  ];
}

/** Blocks needed for MIN_EFFECTIVE_AVERAGES at the recipe's window and step (Welch 1967). */
export function blocksForEffectiveAverages(recipe: Recipe, figures: PreflightFigures, target = MIN_EFFECTIVE_AVERAGES): number {
  if (recipe.transient) return target;
  const w = windowSamples(recipe.window, figures.blockLength, recipe.windowParams);
  let blocks = target;
  while (blocks > 1 && effectiveAverages(w, figures.stepSamples, blocks - 1) >= target) blocks--;
  while (effectiveAverages(w, figures.stepSamples, blocks) < target && blocks < MAX_BLOCK_SEARCH) blocks++;
  return blocks;
}

/** Fewer than about 10 effective averages: coherence and random error are unreliable. */
export function fewEffectiveAverages(recipe: Recipe, figures: PreflightFigures): Finding[] {
  const { blocksUsed: used, effectiveAverages: neff, sampleRateHz: fs } = figures;
  if (used === 0 || neff >= MIN_EFFECTIVE_AVERAGES) return [];
  const need = blocksForEffectiveAverages(recipe, figures);
  const samples = figures.blockLength + (need - 1) * figures.stepSamples;
  const message =
    used === 1
      ? 'The recipe averages a single block: the coherence is then exactly 1 at every line and the reported random error 0, whatever the noise.'
      : recipe.transient || neff === used
        ? `The recipe averages ${plainCount(used)} blocks: with fewer than about ${MIN_EFFECTIVE_AVERAGES} independent averages, the coherence reads high and the random-error figures are unreliable.`
        : `The recipe averages ${plainCount(used)} overlapping blocks, worth ${plainNumber(neff)} independent averages by Welch's overlap formula: with fewer than about ${MIN_EFFECTIVE_AVERAGES}, the coherence reads high and the random-error figures are unreliable.`;
  const record = samples > figures.recordSamples ? `, which needs a record of at least ${plainSeconds(samples / fs)}` : '';
  return [
    warning({
      code: 'few-effective-averages',
      setting: 'averages',
      settingLabel: 'the number of averages',
      message,
      fix: recipe.transient
        ? `Average at least ${need} hits${record}.`
        : `Average at least ${plainCount(need)} blocks at this overlap${record}, or use shorter blocks.`,
    }),
  ];
}

/** A recipe that states no tolerance cannot pass or fail. */
export function noCriteria(recipe: Recipe): Finding[] {
  if (Object.values(recipe.tolerances).some((v) => v !== undefined)) return [];
  return [
    warning({
      code: 'no-criteria',
      setting: 'tolerances',
      settingLabel: 'the acceptance tolerances',
      message: 'The recipe states no acceptance tolerance, so its studies can neither pass nor fail.',
      fix: 'Give at least a magnitude tolerance in dB.',
    }),
  ];
}
