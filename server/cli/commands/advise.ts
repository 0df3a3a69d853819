/**
 * `plumbline advise`: a draft recipe for a scenario and a magnitude tolerance — resolution from
 * the narrowest half-power bandwidth, averages from the expected coherence, transient windows —
 * with the errors it should give. The draft can be saved as a recipe file and run with verify.
 */
import { adviseRecipe, type Advice } from '@/shared/engine/advice';
import { findingText } from '@/shared/engine/preflight/check';
import { parseScenario } from '@/shared/engine/scenario';
import type { WindowName } from '@/shared/engine/types';
import { WINDOW_NAMES } from '@/shared/engine/windows';
import {
  CliInputError,
  choiceOption,
  numberOption,
  optionalString,
  parseBand,
  requiredNumber,
  requiredString,
  type ParsedValues,
} from '../args';
import { resolveScenarioPath } from '../builtin';
import { EXIT, type CliCommand } from '../command';
import { parseJsonFile } from '../files';
import { checkOutputPath, writeOutputs } from '../output';
import { formatShort, toJson } from '../table';

const HELP = `Usage: plumbline advise --scenario FILE --target-db X [options]

Drafts a recipe for the scenario so that 95 % of measurements stay within ±X dB of the exact FRF
at every line of the band, and predicts the errors it should give:
  resolution     Δf ≤ B_r/4 for the narrowest half-power bandwidth B_r = 2·ζ·f_n in the band
                 (common practice), refined while the predicted resolution bias exceeds half the
                 tolerance (random excitation, Hann)
  averages       from Bendat & Piersol's random error sqrt(1−γ²)/(|γ|·sqrt(2·n_d)) at the lowest
                 expected coherence in the band, at least 10
  transients     for impacts, an exponential window and the damping ζ_add = 1/(ω_n·τ) it adds
  estimator      H1 for noise on the response, H2 for noise on the force, Hv for both

Options:
  --scenario FILE        scenario JSON file or built-in name (required)
  --target-db X          magnitude tolerance X > 0, dB (required), e.g. 0.5
  --band LO,HI           band of interest, Hz (default: the excitation band)
  --window NAME          window for random excitation (default hann)
  --overlap F            overlap for random excitation, fraction in [0, 1) (default 0.5)
  --max-averages N       cap on the averages (default 1000)
  --resonance-tolerance P  resonance-frequency tolerance, % of f_n: lines no coarser than it
  --format table|json    default table; json holds the whole advice with the draft recipe
  --output FILE          where the advice goes (default: stdout)
  --recipe-out FILE      also write the draft recipe as a recipe JSON file for "verify"

Exit status: 0 done; 2 bad input, or a band the pre-flight check refuses on the scenario
(message on stderr, no output file written).
`;

function run(values: ParsedValues): number {
  const scenarioPath = resolveScenarioPath(requiredString(values, 'scenario'));
  const targetMagnitudeDb = requiredNumber(values, 'target-db', { above: 0, max: 40 });
  const bandRaw = optionalString(values, 'band');
  const band = bandRaw !== undefined ? parseBand('band', bandRaw) : undefined;
  const window = values.window !== undefined ? choiceOption<WindowName>(values, 'window', WINDOW_NAMES, 'hann') : undefined;
  if (window === 'kaiser') throw new CliInputError('--window kaiser is not offered by advise (it needs a β); pick another');
  const overlap = numberOption(values, 'overlap', undefined, { min: 0, below: 1 });
  const maxAverages = numberOption(values, 'max-averages', undefined, { integer: true, min: 10 });
  const resonanceFrequencyPercent = numberOption(values, 'resonance-tolerance', undefined, { above: 0, max: 100 });
  const format = choiceOption(values, 'format', ['table', 'json'] as const, 'table');
  const outputPath = optionalString(values, 'output');
  const recipePath = optionalString(values, 'recipe-out');
  checkOutputPath(outputPath, 'output');
  checkOutputPath(recipePath, 'recipe-out');

  const scenario = parseJsonFile(scenarioPath, '--scenario', parseScenario);
  const advice = adviseRecipe(scenario, { targetMagnitudeDb, band, window, overlap, maxAverages, resonanceFrequencyPercent });
  // A band the scenario cannot measure is the caller's input and stops here; a record shorter than
  // the draft needs is advice (it stays among the warnings: lengthen the record).
  const bandRefusals = advice.preflight.refusals.filter((f) => f.setting === 'band');
  if (bandRefusals.length > 0) {
    const refusals = bandRefusals.map((f) => findingText(f)).join('\n  ');
    throw new CliInputError(`the draft recipe cannot run on "${advice.scenarioName}":\n  ${refusals}`);
  }
  const files = recipePath !== undefined ? [{ path: recipePath, text: toJson(advice.recipe) }] : [];
  const text = format === 'json' ? toJson(advice) : adviceText(advice);
  writeOutputs(files, outputPath, text);
  return EXIT.ok;
}

function adviceText(a: Advice): string {
  const lines: string[] = [];
  lines.push(`Advice for "${a.scenarioName}", target ±${formatShort(a.targetMagnitudeDb)} dB (95 % of measurements)`);
  lines.push('');
  if (a.governingMode) {
    const m = a.governingMode;
    lines.push(`narrowest mode in the band   ${formatShort(m.naturalFrequencyHz)} Hz, ζ = ${formatShort(m.dampingRatio * 100)} %, B_r = ${formatShort(m.halfPowerBandwidthHz)} Hz`);
  }
  lines.push(`frequency resolution         ${formatShort(a.frequencyResolutionHz)} Hz (block ${a.blockLength} samples, ${formatShort(a.blockDurationS)} s)`);
  lines.push(`window, overlap              ${a.window}, ${formatShort(a.overlap * 100)} %`);
  lines.push(`averages                     ${a.blocks} blocks (${formatShort(a.effectiveAverages)} effective)`);
  lines.push(`record length                ${formatShort(a.recordLengthS)} s (${a.recordSamples} samples)`);
  lines.push(`estimator                    ${a.recipe.estimator}`);
  if (a.resolutionBias) {
    const b = a.resolutionBias;
    lines.push(`resolution bias at the peak  ${formatShort(20 * Math.log10(1 + b.kernel))} dB (window kernel); Bendat & Piersol rule ${formatShort(20 * Math.log10(1 + b.bendatPiersol))} dB`);
  }
  lines.push(`predicted 95 % error         ${formatShort(a.predicted95Db)} dB at ${formatShort(a.worstLineHz)} Hz (the line that sized the averages)`);
  if (a.transient) {
    lines.push(`exponential window           τ = ${formatShort(a.transient.tauS)} s (${formatShort(a.transient.exponentialDecayFraction * 100)} % of the block)`);
    for (const d of a.transient.addedDamping) {
      lines.push(`  adds ζ = ${formatShort(d.addedDampingRatio * 100)} % at ${formatShort(d.naturalFrequencyHz)} Hz (1/(ω_n·τ), common practice)`);
    }
  }
  for (const note of a.notes) lines.push(`note: ${note}`);
  for (const warning of a.warnings) lines.push(`warning: ${warning}`);
  lines.push('');
  lines.push('Draft recipe (save with --recipe-out FILE, then run "plumbline verify"):');
  lines.push(JSON.stringify(a.recipe, null, 2));
  return lines.join('\n') + '\n';
}

export const adviseCommand: CliCommand = {
  name: 'advise',
  summary: 'draft a recipe for a scenario and a magnitude tolerance, with its predicted errors',
  help: HELP,
  options: {
    scenario: { type: 'string' },
    'target-db': { type: 'string' },
    band: { type: 'string' },
    window: { type: 'string' },
    overlap: { type: 'string' },
    'max-averages': { type: 'string' },
    'resonance-tolerance': { type: 'string' },
    format: { type: 'string' },
    output: { type: 'string' },
    'recipe-out': { type: 'string' },
  },
  run,
};
