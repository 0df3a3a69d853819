/**
 * Sweep studies: one or two settings varied over a grid, every grid point run over the same seeds.
 *
 * Settings a sweep may vary (SWEEP_SETTINGS):
 * - the lab's choices: block length (or frequency resolution), averages (or record length),
 *   window, overlap, estimator. Record length is the scenario's acquisition.durationS, but it is
 *   what the lab pays for, so it counts as a choice;
 * - the test's conditions, where the scenario allows: SNR of the force or response channel (on a
 *   channel without noise, or whose noise is given as an SNR), and the channel delay.
 * At most two settings, at most one of them a condition; values are resolved through the recipe
 * and scenario resolvers (parseRecipe, resolveScenario, resolveRecipe), so a value that cannot be
 * processed on the scenario's record is refused at expansion, naming the setting and the value.
 *
 * Grid order: the first setting varies slowest (point = i₀·n₁ + i₁). Seeds: every point uses the
 * seeds of a one-scenario study (seed = baseSeed + run), so all points see the same records up
 * to the varied setting.
 *
 * Measurement time of a point: the record needed for its averages at its block and overlap,
 * T = ((n_avg − 1)·S + N)/fs with the step S = N − round(overlap·N) samples, i.e.
 * T = (n_avg − 1)·(1 − overlap)·N/fs + N/fs when overlap·N is a whole number of samples (Welch's
 * segmentation, P. D. Welch, IEEE Trans. Audio Electroacoust. AU-15(2), 1967). n_avg is the
 * recipe's averages, or every block the record holds ('all'); transient recipes do not overlap.
 */
import { EngineInputError } from './errors';
import { parseRecipe, resolveRecipe, type Recipe } from './recipe';
import { resolveScenario, type Scenario, type ScenarioInput } from './scenario';
import { WINDOW_NAMES } from './windows';

export type SweepSettingKind = 'choice' | 'condition';

export interface SweepSettingInfo {
  kind: SweepSettingKind;
  label: string;
  unit: string;
  /** Number values, or one of `choices` (averages also takes 'all'). */
  values: 'number' | 'integer-or-all' | readonly string[];
}

/** The settings a sweep may vary (module doc), with their words and units. */
export const SWEEP_SETTINGS = {
  blockLength: { kind: 'choice', label: 'Block length', unit: 'samples', values: 'number' },
  frequencyResolutionHz: { kind: 'choice', label: 'Frequency resolution', unit: 'Hz', values: 'number' },
  averages: { kind: 'choice', label: 'Averages', unit: '', values: 'integer-or-all' },
  recordLengthS: { kind: 'choice', label: 'Record length', unit: 's', values: 'number' },
  window: { kind: 'choice', label: 'Window', unit: '', values: WINDOW_NAMES },
  overlap: { kind: 'choice', label: 'Overlap', unit: '', values: 'number' },
  estimator: { kind: 'choice', label: 'Estimator', unit: '', values: ['H1', 'H2', 'Hv'] },
  inputSnrDb: { kind: 'condition', label: 'Force channel SNR', unit: 'dB', values: 'number' },
  outputSnrDb: { kind: 'condition', label: 'Response channel SNR', unit: 'dB', values: 'number' },
  delayS: { kind: 'condition', label: 'Channel delay', unit: 's', values: 'number' },
} as const satisfies Record<string, SweepSettingInfo>;

export type SweepSetting = keyof typeof SWEEP_SETTINGS;
export const SWEEP_SETTING_NAMES = Object.keys(SWEEP_SETTINGS) as SweepSetting[];
export type SweepValue = number | string;

/** Most values per setting, and most grid points. */
export const MAX_SWEEP_VALUES = 12;
export const MAX_SWEEP_POINTS = 48;

export interface SweepAxis {
  setting: SweepSetting;
  values: SweepValue[];
}

export interface SweepPoint {
  index: number;
  /** The varied settings' values at this point. */
  settings: Partial<Record<SweepSetting, SweepValue>>;
  recipe: Recipe;
  scenario: ScenarioInput;
  blockLength: number;
  frequencyResolutionHz: number;
  /** Blocks averaged (the record's whole count when the recipe says 'all'). */
  averages: number;
  measurementTimeS: number;
  /** Points with the same choices share a key (they differ only in the condition). */
  choiceKey: string;
  warnings: string[];
}

export interface SweepPlan {
  axes: SweepAxis[];
  points: SweepPoint[];
}

/**
 * Record time needed for `averages` blocks of `blockLength` samples at `overlap` (module doc), s.
 * Throws EngineInputError on a block or count that is not a whole number ≥ 1.
 */
export function measurementTimeS(averages: number, blockLength: number, overlap: number, sampleRateHz: number): number {
  if (!Number.isInteger(averages) || averages < 1) throw new EngineInputError('averages', averages, 'must be a whole number ≥ 1');
  if (!Number.isInteger(blockLength) || blockLength < 1) throw new EngineInputError('blockLength', blockLength, 'must be a whole number ≥ 1');
  if (!(overlap >= 0 && overlap < 1)) throw new EngineInputError('overlap', overlap, 'must be in [0, 1)');
  if (!(sampleRateHz > 0)) throw new EngineInputError('sampleRateHz', sampleRateHz, 'must be > 0');
  const step = blockLength - Math.round(overlap * blockLength);
  return ((averages - 1) * step + blockLength) / sampleRateHz;
}

function checkAxes(axes: readonly SweepAxis[]): void {
  if (!Array.isArray(axes) || axes.length < 1 || axes.length > 2) {
    throw new EngineInputError('vary', Array.isArray(axes) ? axes.length : axes, 'must name one or two settings');
  }
  const seen = new Set<string>();
  for (const axis of axes) {
    if (!(axis.setting in SWEEP_SETTINGS)) {
      throw new EngineInputError('vary', axis.setting, `is not a setting a sweep can vary (one of ${SWEEP_SETTING_NAMES.join(', ')})`);
    }
    if (seen.has(axis.setting)) throw new EngineInputError('vary', axis.setting, 'is named twice');
    seen.add(axis.setting);
    const field = `vary.${axis.setting}`;
    if (!Array.isArray(axis.values) || axis.values.length < 1 || axis.values.length > MAX_SWEEP_VALUES) {
      throw new EngineInputError(field, axis.values, `needs 1 to ${MAX_SWEEP_VALUES} values`);
    }
    const info: SweepSettingInfo = SWEEP_SETTINGS[axis.setting as SweepSetting];
    for (const v of axis.values) {
      if (info.values === 'number' && !(typeof v === 'number' && Number.isFinite(v))) throw new EngineInputError(field, v, 'must be a number');
      if (info.values === 'integer-or-all' && v !== 'all' && !(typeof v === 'number' && Number.isInteger(v) && v >= 1)) {
        throw new EngineInputError(field, v, 'must be a whole number ≥ 1 or "all"');
      }
      if (Array.isArray(info.values) && !info.values.includes(v as string)) {
        throw new EngineInputError(field, v, `must be one of ${info.values.join(', ')}`);
      }
    }
    if (new Set(axis.values.map(String)).size !== axis.values.length) throw new EngineInputError(field, axis.values, 'lists a value twice');
  }
  if (axes.filter((a) => SWEEP_SETTINGS[a.setting as SweepSetting].kind === 'condition').length > 1) {
    throw new EngineInputError('vary', axes.map((a) => a.setting).join(' and '), 'may hold at most one test condition (SNR or delay)');
  }
  if (seen.has('blockLength') && seen.has('frequencyResolutionHz')) {
    throw new EngineInputError('vary', 'blockLength and frequencyResolutionHz', 'are the same setting; vary one of them');
  }
  const points = axes.reduce((n, a) => n * a.values.length, 1);
  if (points > MAX_SWEEP_POINTS) throw new EngineInputError('vary', `${points} points`, `must give at most ${MAX_SWEEP_POINTS} grid points`);
}

/** The recipe and scenario with one setting set to `value` (settings already checked). */
function applySetting(recipe: Record<string, unknown>, scenario: Scenario, setting: SweepSetting, value: SweepValue): void {
  const field = `vary.${setting}`;
  switch (setting) {
    case 'blockLength':
    case 'frequencyResolutionHz':
      delete recipe.blockLength;
      delete recipe.frequencyResolutionHz;
      recipe[setting] = value;
      return;
    case 'averages':
    case 'window':
    case 'overlap':
    case 'estimator':
      recipe[setting] = value;
      return;
    case 'recordLengthS':
      scenario.acquisition = { ...scenario.acquisition, durationS: value as number };
      return;
    case 'delayS':
      scenario.errors = { ...scenario.errors, delayS: value as number };
      return;
    case 'inputSnrDb':
    case 'outputSnrDb': {
      const channel = setting === 'inputSnrDb' ? 'inputNoise' : 'outputNoise';
      const current = scenario.errors[channel];
      if (current && !('snrDb' in current)) {
        throw new EngineInputError(field, value, `cannot be varied: the scenario sizes its ${setting === 'inputSnrDb' ? 'force' : 'response'} noise by a PSD level, not an SNR`);
      }
      scenario.errors = { ...scenario.errors, [channel]: { ...(current ?? {}), snrDb: value as number } };
      return;
    }
  }
}

/** Names the setting in an engine error raised while resolving one grid point. */
function atPoint(settings: Partial<Record<SweepSetting, SweepValue>>, error: unknown): never {
  if (error instanceof EngineInputError) {
    const where = Object.entries(settings).map(([k, v]) => `${k}=${v}`).join(', ');
    const named = new EngineInputError('vary', where, 'cannot be processed');
    named.message = `grid point ${where} cannot be processed: ${error.message}`;
    throw named;
  }
  throw error;
}

/**
 * Expands the grid (module doc) over `recipe` and `scenario`: each point's recipe and scenario,
 * resolved block, averages and measurement time. Throws EngineInputError naming the setting and
 * value when a setting cannot be varied or a value cannot be processed on the record.
 */
export function expandSweep(recipeInput: Recipe | unknown, scenarioInput: Scenario | ScenarioInput, axes: readonly SweepAxis[]): SweepPlan {
  checkAxes(axes);
  const baseRecipe = parseRecipe(recipeInput);
  const baseScenario = resolveScenario(scenarioInput).scenario;
  const combos: Partial<Record<SweepSetting, SweepValue>>[] = [{}];
  for (const axis of axes) {
    const next: Partial<Record<SweepSetting, SweepValue>>[] = [];
    for (const c of combos) for (const v of axis.values) next.push({ ...c, [axis.setting]: v });
    combos.splice(0, combos.length, ...next);
  }
  const points = combos.map((settings, index): SweepPoint => {
    const recipeDraft = structuredClone(baseRecipe) as Record<string, unknown>;
    const scenario = structuredClone(baseScenario);
    for (const axis of axes) applySetting(recipeDraft, scenario, axis.setting, settings[axis.setting]!);
    try {
      const recipe = parseRecipe(recipeDraft);
      const { plan } = resolveScenario(scenario);
      const resolved = resolveRecipe(recipe, { sampleRateHz: plan.sampleRateHz, samples: plan.recordSamples });
      const n = resolved.blockLength;
      const overlap = recipe.transient ? 0 : recipe.overlap;
      const step = n - Math.round(overlap * n);
      const available = Math.floor((plan.recordSamples - n) / step) + 1;
      const averages = Math.min(resolved.averages ?? available, available);
      const choiceKey = axes
        .filter((a) => SWEEP_SETTINGS[a.setting].kind === 'choice')
        .map((a) => `${a.setting}=${settings[a.setting]}`)
        .join('&');
      return {
        index,
        settings,
        recipe,
        scenario,
        blockLength: n,
        frequencyResolutionHz: resolved.frequencyResolutionHz,
        averages,
        measurementTimeS: measurementTimeS(averages, n, overlap, plan.sampleRateHz),
        choiceKey,
        warnings: [...plan.warnings, ...resolved.warnings],
      };
    } catch (error) {
      return atPoint(settings, error);
    }
  });
  return { axes: axes.map((a) => ({ setting: a.setting, values: [...a.values] })), points };
}
