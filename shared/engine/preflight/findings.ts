/**
 * What the pre-flight check of a recipe against a scenario reports: findings with a stable code,
 * the recipe or scenario setting they concern, a plain sentence and the fix. A refusal means the
 * pair cannot run (or would run only to fail on every seed); a warning means it runs but some
 * figure of the result would mislead unless read with the warning.
 */

/** Stable codes of refusals (the pair cannot run). */
export const PREFLIGHT_REFUSAL_CODES = [
  'band-above-nyquist',
  'block-longer-than-record',
  'too-few-blocks',
  'nothing-excited-in-band',
  'band-without-lines',
] as const;

/** Stable codes of warnings (the pair runs; a figure needs reading with care). */
export const PREFLIGHT_WARNING_CODES = [
  'band-outside-excitation',
  'period-not-whole-in-block',
  'mode-above-nyquist',
  'mode-outside-band',
  'resolution-coarser-than-tolerance',
  'few-effective-averages',
  'no-criteria',
] as const;

export type PreflightRefusalCode = (typeof PREFLIGHT_REFUSAL_CODES)[number];
export type PreflightWarningCode = (typeof PREFLIGHT_WARNING_CODES)[number];
export type PreflightCode = PreflightRefusalCode | PreflightWarningCode;

/**
 * The setting a finding concerns, as a stable key a form can highlight: a recipe field, or a part
 * of the scenario ('scenario.*').
 */
export type PreflightSetting =
  | 'band'
  | 'blockLength'
  | 'averages'
  | 'tolerances'
  | 'scenario.sampleRate'
  | 'scenario.record'
  | 'scenario.excitation'
  | 'scenario.system';

export interface Finding {
  code: PreflightCode;
  severity: 'refusal' | 'warning';
  setting: PreflightSetting;
  /** The setting in plain words ("the band's upper edge"). */
  settingLabel: string;
  /** What is wrong, in plain words with the figures. */
  message: string;
  /** What to change. */
  fix: string;
}

/** Figures the check derived, for the form and the advice to show beside the findings. */
export interface PreflightFigures {
  sampleRateHz: number;
  nyquistHz: number;
  recordSamples: number;
  blockLength: number;
  /** Line spacing fs/N, Hz. */
  frequencyResolutionHz: number;
  /** Samples between block starts (transient recipes: whole impact periods). */
  stepSamples: number;
  /** Blocks the record holds at this block length and overlap (triggered blocks for impacts). */
  blocksAvailable: number;
  /** Blocks that would be averaged: the recipe's count, or all the record holds. */
  blocksUsed: number;
  /** Welch's equivalent number of independent averages of those blocks. */
  effectiveAverages: number;
  /** The band the excitation puts force into, Hz (impact: up to its first spectral zero). */
  excitationBand: { lowHz: number; highHz: number };
}

export interface Preflight {
  scenarioName: string;
  refusals: Finding[];
  warnings: Finding[];
  /** Null when the block does not fit the record (nothing further could be derived). */
  figures: PreflightFigures | null;
}

/** A number for a sentence: 4 significant digits, no exponent below 1e9. */
export function plainNumber(x: number): string {
  return Number(x.toPrecision(4)).toString();
}

/** A whole count with thousands grouped by spaces: 65536 → "65 536". */
export function plainCount(n: number): string {
  return String(Math.round(n)).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
}

/** "0.25 s", "1.5 ms" */
export function plainSeconds(s: number): string {
  return s < 0.1 ? `${plainNumber(s * 1000)} ms` : `${plainNumber(s)} s`;
}
