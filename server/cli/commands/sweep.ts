/**
 * `plumbline sweep`: varies one or two settings over a grid, runs every grid point on the same
 * seeds, judges each point's criteria and names the cheapest passing point by measurement time.
 */
import { parseRecipe } from '@/shared/engine/recipe';
import { parseScenario } from '@/shared/engine/scenario';
import { SWEEP_SETTING_NAMES, SWEEP_SETTINGS, type SweepAxis, type SweepSetting, type SweepValue } from '@/shared/engine/sweep';
import { runSweep, settingWords, type SweepPointResult } from '@/shared/engine/sweep-result';
import { CliInputError, choiceOption, numberOption, optionalString, parseNumber, requiredString, stringList, type ParsedValues } from '../args';
import { resolveRecipePath, resolveScenarioPath } from '../builtin';
import { EXIT, type CliCommand } from '../command';
import { parseJsonFile } from '../files';
import { checkOutputPath, emit } from '../output';
import { formatShort, formatTable, toJson } from '../table';

const HELP = `Usage: plumbline sweep --recipe FILE|NAME --scenario FILE|NAME --vary SETTING=v1,v2,... [--vary ...] [options]

Varies one or two settings of the recipe (or of the test) over a grid, runs every grid point on the
same seeds, judges the recipe's tolerances at each point, and names the cheapest passing point:
the one that needs the shortest record (T = (n_avg − 1)·(1 − overlap)·N/fs + N/fs).

Options:
  --recipe FILE|NAME     recipe JSON file or built-in recipe name (required)
  --scenario FILE|NAME   scenario JSON file or built-in scenario name (required)
  --vary SETTING=V,...   a setting and its values; give --vary once or twice (at most one
                         test condition). Settings:
                           blockLength (samples), frequencyResolutionHz (Hz), averages (whole
                           number or all), recordLengthS (s), window (name), overlap (fraction),
                           estimator (H1, H2, Hv) — the lab's choices;
                           inputSnrDb, outputSnrDb (dB), delayS (s) — test conditions
  --seeds N              seeds per grid point, 1…1000 (default 10); the same seeds at every point
  --base-seed N          first seed, a whole number ≥ 0 (default 1)
  --format table|json    default table
  --output FILE          where the result goes (default: stdout)

Table: one row per grid point with its settings, record time, PASS or FAIL, and every criterion's
observed value; then the cheapest passing point in one sentence.
JSON: { axes, seeds, points: [{ settings, measurementTimeS, pass, criteria, perSeed }],
cheapestPassing } with cheapestPassing null when no point passes.
Exit status: 0 done (whether or not a point passed); 2 bad input.
`;

/** "blockLength=512,1024" → one axis, numbers parsed where the setting takes numbers. */
export function parseVary(raw: string): SweepAxis {
  const eq = raw.indexOf('=');
  if (eq < 1) throw new CliInputError(`--vary=${raw} must be SETTING=v1,v2,... (settings: ${SWEEP_SETTING_NAMES.join(', ')})`);
  const setting = raw.slice(0, eq).trim();
  if (!(SWEEP_SETTING_NAMES as string[]).includes(setting)) {
    throw new CliInputError(`--vary=${raw}: "${setting}" is not a setting a sweep can vary (settings: ${SWEEP_SETTING_NAMES.join(', ')})`);
  }
  const info = SWEEP_SETTINGS[setting as SweepSetting];
  const words = raw.slice(eq + 1).split(',').map((w) => w.trim());
  if (words.some((w) => w === '')) throw new CliInputError(`--vary=${raw} has an empty value`);
  const values = words.map((w): SweepValue => {
    if (Array.isArray(info.values)) return w;
    if (info.values === 'integer-or-all' && w.toLowerCase() === 'all') return 'all';
    return parseNumber(`vary ${setting}`, w, info.values === 'integer-or-all' ? { integer: true, min: 1 } : {});
  });
  return { setting: setting as SweepSetting, values };
}

function observed(p: SweepPointResult, id: string): string {
  const c = p.criteria.find((x) => x.id === id);
  if (!c) return '—';
  if (c.observed === null) return 'none';
  return `${formatShort(c.observed)}${c.unit === '' ? '' : c.unit === '°' ? ' deg' : ` ${c.unit}`}`;
}

function sweepTable(result: ReturnType<typeof runSweep>, recipeName: string, scenarioName: string): string {
  const ids = [...new Set(result.points.flatMap((p) => p.criteria.map((c) => c.id)))];
  const limits = ids.map((id) => result.points.flatMap((p) => p.criteria).find((c) => c.id === id)!);
  const header = ['point', ...result.axes.map((a) => a.setting), 'record', 'result', ...limits.map((c) => `${c.id} (${c.id === 'coverage' || c.id === 'min-coherence' ? '≥' : '≤'} ${formatShort(c.limit)})`)];
  const rows = result.points.map((p) => [
    String(p.index + 1),
    ...result.axes.map((a) => String(p.settings[a.setting])),
    `${formatShort(p.measurementTimeS)} s`,
    p.ran ? (p.pass ? 'PASS' : 'FAIL') : 'CANNOT RUN',
    ...ids.map((id) => observed(p, id)),
  ]);
  let out = `Sweep of recipe "${recipeName}" on "${scenarioName}", seeds ${result.seeds[0]}–${result.seeds[result.seeds.length - 1]} at every point\n`;
  out += formatTable(header, rows, header.map((_, i) => (i === 0 || i > result.axes.length ? 'right' : 'left')));
  for (const p of result.points.filter((x) => !x.ran)) {
    out += `point ${p.index + 1} (${Object.entries(p.settings).map(([k, v]) => settingWords(k as SweepSetting, v)).join(', ')}) could not run: ${p.error}\n`;
  }
  return `${out}\n${result.statement}\n`;
}

function run(values: ParsedValues): number {
  const recipe = parseJsonFile(resolveRecipePath(requiredString(values, 'recipe')), '--recipe', parseRecipe);
  const scenario = parseJsonFile(resolveScenarioPath(requiredString(values, 'scenario')), '--scenario', parseScenario);
  const vary = stringList(values, 'vary').map(parseVary);
  if (vary.length === 0) throw new CliInputError('--vary SETTING=v1,v2,... is required (once or twice)');
  const seeds = numberOption(values, 'seeds', 10, { integer: true, min: 1, max: 1000 })!;
  const baseSeed = numberOption(values, 'base-seed', 1, { integer: true, min: 0, max: Number.MAX_SAFE_INTEGER - 1e12 })!;
  const format = choiceOption(values, 'format', ['table', 'json'] as const, 'table');
  const outputPath = optionalString(values, 'output');
  checkOutputPath(outputPath, 'output');
  const result = runSweep({ recipe, scenario, vary, seeds, baseSeed });
  const text =
    format === 'json'
      ? toJson({
          recipe: recipe.name,
          scenario: scenario.name,
          axes: result.axes,
          seeds: result.seeds,
          points: result.points,
          cheapestPassing: result.cheapestPassing,
          statement: result.statement,
        })
      : sweepTable(result, recipe.name, scenario.name);
  emit(outputPath, text);
  return EXIT.ok;
}

export const sweepCommand: CliCommand = {
  name: 'sweep',
  summary: 'vary one or two settings over a grid and name the cheapest passing point',
  help: HELP,
  options: {
    recipe: { type: 'string' },
    scenario: { type: 'string' },
    vary: { type: 'string', multiple: true },
    seeds: { type: 'string' },
    'base-seed': { type: 'string' },
    format: { type: 'string' },
    output: { type: 'string' },
  },
  run,
};
