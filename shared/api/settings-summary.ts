/**
 * The processing settings of one recipe version as labelled rows with units, so the review page,
 * the standard page, the printable report and the PDF show the same words and figures for what is
 * signed. The line spacing Δf = fs / N depends on the sample rate, so it is stated at each sample
 * rate of the evidence's scenarios when they are known.
 */
import { z } from 'zod';
import { resolveRecipe, type Recipe } from '@/shared/engine/recipe';

export const settingsRowSchema = z.object({
  /** Stable key of the row (for tests and lists). */
  id: z.string(),
  group: z.enum(['processing', 'criteria']),
  label: z.string(),
  /** The figure or choice, without its unit. */
  value: z.string(),
  unit: z.string(),
  /** A short remark beside the value (how it was derived, when it does not apply). */
  note: z.string().nullable(),
});
export type SettingsRow = z.infer<typeof settingsRowSchema>;

export const settingsSummarySchema = z.object({
  recipe: z.object({ id: z.string(), version: z.number().int(), name: z.string() }),
  rows: z.array(settingsRowSchema),
});
export type SettingsSummary = z.infer<typeof settingsSummarySchema>;

const WINDOW_WORDS: Record<Recipe['window'], string> = {
  rectangular: 'Rectangular',
  hann: 'Hann',
  hamming: 'Hamming',
  flattop: 'Flat-top',
  'blackman-harris': 'Blackman-Harris',
  kaiser: 'Kaiser',
};
const DETREND_WORDS: Record<Recipe['detrend'], string> = { none: 'none', mean: 'mean removed from each block', linear: 'straight line removed from each block' };
const ESTIMATOR_WORDS: Record<Recipe['estimator'], string> = { H1: 'H1 = Gyx / Gxx', H2: 'H2 = Gyy / Gxy', Hv: 'Hv (total least squares)' };
const SCALING_UNITS: Record<Recipe['scaling'], string> = { density: 'unit²/Hz', spectrum: 'unit²' };

/** A figure with at most `digits` significant figures and no trailing zeros. */
const fig = (v: number, digits = 4) => Number(v.toPrecision(digits)).toString();
const percent = (fraction: number) => fig(fraction * 100);

type Row = Omit<SettingsRow, 'group' | 'note'> & { note?: string | null };

function blockRows(r: Recipe, sampleRatesHz: readonly number[]): Row[] {
  const rates = [...new Set(sampleRatesHz.filter((f) => Number.isFinite(f) && f > 0))].sort((a, b) => a - b);
  const rows: Row[] = [];
  if (r.blockLength !== undefined) {
    rows.push({ id: 'block-length', label: 'Block length N', value: String(r.blockLength), unit: 'samples' });
    if (rates.length === 0) rows.push({ id: 'line-spacing', label: 'Line spacing Δf', value: `fs / ${r.blockLength}`, unit: 'Hz', note: 'depends on the sample rate' });
    for (const fs of rates) {
      rows.push({ id: `line-spacing-${fs}`, label: 'Line spacing Δf', value: fig(fs / r.blockLength, 6), unit: 'Hz', note: `at ${fig(fs, 6)} Hz sampling (block ${fig(r.blockLength / fs, 6)} s)` });
    }
    return rows;
  }
  const asked = r.frequencyResolutionHz!;
  rows.push({ id: 'line-spacing', label: 'Line spacing Δf asked', value: fig(asked, 6), unit: 'Hz', note: 'the shortest power-of-two block no coarser than this' });
  for (const fs of rates) {
    const block = blockAt(r, fs);
    rows.push(
      block === null
        ? { id: `block-length-${fs}`, label: 'Block length N', value: '—', unit: 'samples', note: `no block fits at ${fig(fs, 6)} Hz sampling` }
        : { id: `block-length-${fs}`, label: 'Block length N', value: String(block), unit: 'samples', note: `at ${fig(fs, 6)} Hz sampling: Δf ${fig(fs / block, 6)} Hz, block ${fig(block / fs, 6)} s` },
    );
  }
  return rows;
}

/** The block a resolution gives at a sample rate, as the engine resolves it (null if it cannot). */
function blockAt(r: Recipe, fs: number): number | null {
  try {
    return resolveRecipe(r, { sampleRateHz: fs, samples: Number.MAX_SAFE_INTEGER }).blockLength;
  } catch {
    return null;
  }
}

function windowRows(r: Recipe): Row[] {
  const rows: Row[] = [{ id: 'window', label: 'Window', value: WINDOW_WORDS[r.window], unit: '', note: r.transient ? 'on the force and response blocks before the transient windows' : null }];
  if (r.window === 'kaiser') rows.push({ id: 'kaiser-beta', label: 'Kaiser β', value: fig(r.windowParams?.kaiserBeta ?? Number.NaN), unit: '' });
  if (r.transient) {
    const t = r.transient;
    rows.push(
      { id: 'force-window', label: 'Force window', value: percent(t.forceWindowFraction), unit: '% of the block', note: 'unity from the block start, zero after' },
      { id: 'exponential-window', label: 'Exponential window on the response, τ', value: percent(t.exponentialDecayFraction), unit: '% of the block' },
      { id: 'trigger-level', label: 'Trigger level', value: percent(t.triggerLevelFraction), unit: '% of the force peak' },
      { id: 'pretrigger', label: 'Pretrigger', value: percent(t.pretriggerFraction), unit: '% of the block' },
    );
  }
  return rows;
}

function processingRows(r: Recipe, sampleRatesHz: readonly number[]): Row[] {
  const overlapUnused = r.transient && r.overlap > 0 ? 'not used: triggered blocks do not overlap' : null;
  const weight = r.estimator === 'Hv'
    ? { id: 'weighting', label: 'Hv weighting κ', value: fig(r.hvWeight ?? 1), unit: '', note: 'ratio of output- to input-noise power' + (r.hvWeight === undefined ? ' (default)' : '') }
    : { id: 'weighting', label: 'Estimator weighting', value: 'none', unit: '', note: `${r.estimator} takes no weighting` };
  return [
    ...blockRows(r, sampleRatesHz),
    ...windowRows(r),
    { id: 'overlap', label: 'Overlap', value: percent(r.overlap), unit: '%', note: overlapUnused },
    { id: 'averages', label: 'Averages', value: r.averages === undefined || r.averages === 'all' ? 'every block of the record' : String(r.averages), unit: r.averages === undefined || r.averages === 'all' ? '' : 'blocks' },
    { id: 'detrend', label: 'Detrend', value: DETREND_WORDS[r.detrend], unit: '' },
    { id: 'estimator', label: 'Estimator', value: ESTIMATOR_WORDS[r.estimator], unit: '' },
    weight,
    { id: 'band', label: 'Band of interest', value: `${fig(r.band.lowHz, 6)} – ${fig(r.band.highHz, 6)}`, unit: 'Hz' },
    { id: 'scaling', label: 'Spectral scaling', value: r.scaling, unit: SCALING_UNITS[r.scaling] },
  ];
}

/** The recipe's tolerances as the criteria a study judges (shared/engine/scores criteria). */
function criteriaRows(r: Recipe): Row[] {
  const t = r.tolerances;
  const rows: Row[] = [];
  if (t.magnitudeDb !== undefined) {
    rows.push({ id: 'magnitude-bias', label: 'Magnitude bias: largest |mean magnitude error| over the lines', value: `≤ ${fig(t.magnitudeDb)}`, unit: 'dB' });
    rows.push({ id: 'magnitude-p95', label: 'Magnitude error, 95th percentile over seeds, worst line', value: `≤ ${fig(t.magnitudeDb)}`, unit: 'dB' });
  }
  if (t.phaseDeg !== undefined) rows.push({ id: 'phase-p95', label: 'Phase error, 95th percentile over seeds, worst line', value: `≤ ${fig(t.phaseDeg)}`, unit: '°' });
  if (t.complexRelative !== undefined) rows.push({ id: 'complex-relative', label: 'Complex relative error |H_est − H| / |H|, 95th percentile, worst line', value: `≤ ${fig(t.complexRelative)}`, unit: '' });
  if (t.resonanceFrequencyPercent !== undefined) rows.push({ id: 'resonance-frequency', label: 'Resonance frequency error, 95th percentile, worst mode', value: `≤ ${fig(t.resonanceFrequencyPercent)}`, unit: '%' });
  if (t.dampingPercent !== undefined) rows.push({ id: 'damping', label: 'Damping error, 95th percentile, worst mode', value: `≤ ${fig(t.dampingPercent)}`, unit: '%' });
  if (t.coveragePercent !== undefined) rows.push({ id: 'coverage', label: 'Coverage of the 95 % magnitude confidence band', value: `≥ ${fig(t.coveragePercent)}`, unit: '%' });
  if (t.minCoherence !== undefined) rows.push({ id: 'coherence', label: 'Coherence, 5th percentile over seeds, worst line', value: `≥ ${fig(t.minCoherence)}`, unit: '' });
  return rows;
}

/**
 * The settings of a recipe version as rows: processing first (block and Δf, window and its
 * parameters, overlap, averages, detrend, estimator and weighting, band, scaling), then every
 * acceptance criterion with its tolerance. `sampleRatesHz`: the sample rates of the scenarios the
 * recipe was run on (Δf and a resolved block are stated at each); empty when none is known.
 */
export function settingsSummary(recipe: { id: string; version: number; name: string }, definition: Recipe, sampleRatesHz: readonly number[] = []): SettingsSummary {
  const group = (g: SettingsRow['group']) => (row: Row): SettingsRow => ({ ...row, group: g, note: row.note ?? null });
  return {
    recipe: { id: recipe.id, version: recipe.version, name: recipe.name },
    rows: [...processingRows(definition, sampleRatesHz).map(group('processing')), ...criteriaRows(definition).map(group('criteria'))],
  };
}

/** One row as a line of text ("Overlap: 50 %"), for the PDF and plain-text uses. */
export function settingsRowText(row: SettingsRow): string {
  const unit = row.unit === '' ? '' : row.unit === '°' ? '°' : ` ${row.unit}`;
  return `${row.label}: ${row.value}${row.value === '—' ? '' : unit}${row.note ? ` (${row.note})` : ''}`;
}
