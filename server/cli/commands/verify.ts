/**
 * `plumbline verify`: runs a recipe on scenarios over many seeds (simulate → process → score),
 * aggregates the errors over the seeds and judges each of the recipe's tolerances, naming the
 * observed figure with its unit and the worst line.
 */
import { parseRecipe } from '@/shared/engine/recipe';
import { parseScenario } from '@/shared/engine/scenario';
import { checkBeforeRunning } from '../preflight';
import type { Criterion } from '@/shared/engine/scores/criteria';
import { runStudy, type ComparisonAggregate, type StudyResult } from '@/shared/engine/study';
import {
  CliInputError,
  choiceOption,
  numberOption,
  optionalString,
  requiredString,
  stringList,
  type ParsedValues,
} from '../args';
import { builtInScenarioPaths, resolveRecipePath, resolveScenarioPath } from '../builtin';
import { EXIT, type CliCommand } from '../command';
import { parseJsonFile } from '../files';
import { checkOutputPath, emit } from '../output';
import { formatShort, formatTable, toJson } from '../table';

const HELP = `Usage: plumbline verify --recipe FILE (--scenario FILE... | --built-in) [options]

Runs the recipe on every scenario for N seeds, scores each estimate against the exact FRF on the
recipe's band, aggregates over the seeds and judges the recipe's tolerances. The same inputs give
the same result, bit for bit (seed of run r of scenario j = base-seed + j·1000000 + r).

Options:
  --recipe FILE          recipe JSON file or built-in recipe name (required)
  --scenario FILE...     scenario JSON files or built-in names (several after one --scenario,
                         or --scenario repeated)
  --built-in             use every built-in scenario in scenarios/ (instead of --scenario)
  --seeds N              seeds (Monte Carlo runs) per scenario, 1…1000000 (default 10)
  --base-seed N          first seed, a whole number ≥ 0 (default 1)
  --format table|json    default table
  --output FILE          where the result goes (default: stdout)
  --progress             print progress on stderr

What is judged (only the tolerances the recipe gives):
  magnitudeDb             magnitude bias (largest |mean error| over the band's lines) and the
                          largest 95th percentile of |magnitude error|, both dB
  phaseDeg                largest 95th percentile of |phase error|, degrees
  complexRelative         largest 95th percentile of |Ĥ − H| / |H|, a fraction
  resonanceFrequencyPercent, dampingPercent
                          95th percentile of |error| of the half-power resonance frequency and
                          damping ratio, percent, worst mode in the band
  coveragePercent         share of (line, seed) pairs whose exact |H| lies inside the estimate's
                          own 95 % band, percent (at least the limit)
  minCoherence            lowest 5th percentile of coherence over the band (at least the limit)
Transient recipes (exponential window) are judged against the exact FRF seen through the same
window; the comparison with the plain FRF (damping corrected by 1/(ω·τ)) is shown beside it.

Table: one block per scenario; each criterion with PASS or FAIL, the observed value with its
unit, the limit, and the line (Hz) that decided it.
Exit status: 0 every criterion passed; 1 at least one failed; 2 bad input, or a recipe the
pre-flight check refuses on a scenario (each refusal on stderr; its warnings go there too).
`;

function run(values: ParsedValues): number {
  const recipePath = resolveRecipePath(requiredString(values, 'recipe'));
  const builtIn = values['built-in'] === true;
  const scenarioArgs = stringList(values, 'scenario');
  if (builtIn && scenarioArgs.length > 0) throw new CliInputError('give --scenario FILE... or --built-in, not both');
  const scenarioPaths = builtIn ? builtInScenarioPaths() : scenarioArgs.map(resolveScenarioPath);
  if (scenarioPaths.length === 0) throw new CliInputError('--scenario FILE (one or more) or --built-in is required');
  const seeds = numberOption(values, 'seeds', 10, { integer: true, min: 1, max: 1_000_000 })!;
  const baseSeed = numberOption(values, 'base-seed', 1, { integer: true, min: 0, max: Number.MAX_SAFE_INTEGER - 1e12 })!;
  const format = choiceOption(values, 'format', ['table', 'json'] as const, 'table');
  const outputPath = optionalString(values, 'output');
  checkOutputPath(outputPath, 'output');

  const recipe = parseJsonFile(recipePath, '--recipe', parseRecipe);
  const scenarios = scenarioPaths.map((path) => parseJsonFile(path, '--scenario', parseScenario));
  checkBeforeRunning(recipe, scenarios, (text) => process.stderr.write(text));
  const progress = values.progress === true;
  let study: StudyResult;
  try {
    study = runStudy({
      recipe,
      scenarios,
      seeds,
      baseSeed,
      onProgress: progress
        ? (p) => process.stderr.write(`run ${p.completed}/${p.total} (scenario ${p.scenarioIndex + 1}, seed ${p.seed})\n`)
        : undefined,
    });
  } catch (error) {
    // A recipe that does not fit a scenario (e.g. a block longer than its record) is bad input.
    if ((error as Error).name === 'EngineInputError') {
      throw new CliInputError(`recipe "${recipe.name}" cannot run on these scenarios: ${(error as Error).message}`);
    }
    throw error;
  }
  const text = format === 'json' ? toJson(summarise(study, scenarioPaths)) : verifyTable(study);
  emit(outputPath, text);
  return study.pass ? EXIT.ok : EXIT.criteriaFailed;
}

function comparisonSummary(c: ComparisonAggregate) {
  return {
    pass: c.pass,
    criteria: c.criteria,
    coveragePercent: c.aggregate.overallCoverage * 100,
    medianRandomErrorRatio: c.aggregate.medianRandomErrorRatio,
    modes: c.modes.map((m) => ({
      modeIndex: m.modeIndex,
      naturalFrequencyHz: m.naturalFrequencyHz,
      dampingRatio: m.dampingRatio,
      outsideBand: m.outsideBand,
      resolvedSeeds: m.resolvedSeeds,
      notResolvableSeeds: m.notResolvableSeeds,
      reason: m.reason,
      resonanceFrequencyErrorPercent: m.resonanceFrequencyErrorPercent,
      dampingErrorPercent: m.dampingErrorPercent,
      peakValueErrorDb: m.peakValueErrorDb,
    })),
  };
}

/** The study without its per-line arrays: criteria, mode figures, run summaries, warnings. */
function summarise(study: StudyResult, files: string[]) {
  return {
    engineVersion: study.engineVersion,
    recipe: study.recipe,
    seedRule: study.seedRule,
    pass: study.pass,
    scenarios: study.results.map((r, j) => ({
      name: r.scenarioName,
      file: files[j],
      seeds: r.seeds,
      reference: r.reference,
      referenceNote: r.referenceNote ?? null,
      pass: r.judged.pass,
      judged: comparisonSummary(r.judged),
      plain: r.plain ? comparisonSummary(r.plain) : null,
      runs: r.runs,
      warnings: r.warnings,
    })),
  };
}

function observed(c: Criterion): string {
  if (c.observed === null) return `— (${c.note ?? 'not computed'})`;
  const unit = c.unit === '' ? '' : c.unit === '°' ? ' deg' : ` ${c.unit}`;
  return `${formatShort(c.observed)}${unit}`;
}

function limit(c: Criterion): string {
  const unit = c.unit === '' ? '' : c.unit === '°' ? ' deg' : ` ${c.unit}`;
  const atLeast = c.id === 'coverage' || c.id === 'min-coherence';
  return `${atLeast ? '≥' : '≤'} ${formatShort(c.limit)}${unit}`;
}

function criteriaTable(criteria: Criterion[]): string {
  const rows = criteria.map((c) => [
    c.pass ? 'PASS' : 'FAIL',
    c.label,
    observed(c),
    limit(c),
    c.worstLineHz === null ? '—' : `${formatShort(c.worstLineHz)} Hz`,
  ]);
  return formatTable(['result', 'criterion', 'observed', 'limit', 'worst line'], rows, ['left', 'left', 'right', 'right', 'right']);
}

function verifyTable(study: StudyResult): string {
  let out = `Recipe "${study.recipe.name}", ${study.seedRule.seedsPerScenario} seed(s) per scenario, engine ${study.engineVersion}\n`;
  for (const r of study.results) {
    out += `\n${r.judged.pass ? 'PASS' : 'FAIL'}  ${r.scenarioName}  (seeds ${r.seeds[0]}–${r.seeds[r.seeds.length - 1]})\n`;
    if (r.referenceNote) out += `note: ${r.referenceNote}\n`;
    if (r.reference === 'exponential-window') out += 'judged against the exact FRF seen through the exponential window\n';
    out += r.judged.criteria.length > 0 ? criteriaTable(r.judged.criteria) : 'the recipe gives no tolerances to judge\n';
    if (r.plain) {
      out += 'against the plain FRF (damping corrected for the exponential window), for information:\n';
      out += criteriaTable(r.plain.criteria);
    }
    for (const w of r.warnings) out += `warning (${w.runs} run(s)): ${w.message}\n`;
  }
  const failed = study.results.filter((r) => !r.judged.pass).length;
  out += `\n${study.pass ? 'PASS' : 'FAIL'}: ${study.results.length - failed} of ${study.results.length} scenario(s) met every criterion\n`;
  return out;
}

export const verifyCommand: CliCommand = {
  name: 'verify',
  summary: 'run a recipe on scenarios over many seeds and judge its tolerances',
  help: HELP,
  options: {
    recipe: { type: 'string' },
    scenario: { type: 'string', multiple: true },
    'built-in': { type: 'boolean' },
    seeds: { type: 'string' },
    'base-seed': { type: 'string' },
    format: { type: 'string' },
    output: { type: 'string' },
    progress: { type: 'boolean' },
  },
  positionalOption: 'scenario',
  run,
};
