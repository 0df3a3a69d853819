/**
 * `plumbline estimate`: Welch cross-spectra and the H1, H2 and Hv FRF estimates of a two-channel
 * record held in a CSV file, one output row per frequency line.
 */
import { estimateFrf, type FrfEstimate } from '@/shared/engine/estimators';
import { processRecord } from '@/shared/engine/process';
import { parseRecipe } from '@/shared/engine/recipe';
import type { ComplexArray, Detrend, Estimator, SpectrumScaling } from '@/shared/engine/types';
import { welchCrossSpectra, type CrossSpectra } from '@/shared/engine/welch';
import { WINDOW_NAMES, windowFigures } from '@/shared/engine/windows';
import {
  CliInputError,
  choiceOption,
  numberOption,
  optionalString,
  requiredString,
  type ParsedValues,
} from '../args';
import { resolveRecipePath } from '../builtin';
import { EXIT, type CliCommand } from '../command';
import { formatCsv, readNumericCsv, requireColumn } from '../csv';
import { parseJsonFile } from '../files';
import { checkOutputPath, emit } from '../output';
import { toJson } from '../table';
import { sampleRateFromTime } from './time-column';

const ESTIMATORS: readonly Estimator[] = ['H1', 'H2', 'Hv'];
const DETRENDS: readonly Detrend[] = ['none', 'mean', 'linear'];
const SCALINGS: readonly SpectrumScaling[] = ['density', 'spectrum'];

export const ESTIMATE_COLUMNS = [
  'frequency_hz',
  'gxx',
  'gyy',
  'gyx_re',
  'gyx_im',
  'h1_re',
  'h1_im',
  'h2_re',
  'h2_im',
  'hv_re',
  'hv_im',
  'coherence',
  'h1_mag_random_error',
  'phase_random_error_deg',
  'h_re',
  'h_im',
] as const;

const HELP = `Usage: plumbline estimate --input FILE.csv [options]

Estimates the FRF between two columns of a CSV record by Welch's method (segments, window,
overlap, averaging) and writes one row per frequency line, 0 Hz to fs/2.

Input:
  --input FILE.csv       CSV with a header row and one row per sample (required)
  --fs HZ                sample rate in Hz; may be left out when the file has a time_s column
                         (then it is 1 / the sample spacing, which must be uniform)
  --x COL                input (force) column, default "input"
  --y COL                output (response) column, default "output"

Processing:
  --block N              block length in samples, a power of two (default 1024);
                         frequency resolution df = fs / N Hz
  --window NAME          rectangular | hann | hamming | flattop | blackman-harris | kaiser
                         (default hann); windows are DFT-even (periodic)
  --kaiser-beta B        Kaiser window shape parameter β in [0, 100], dimensionless
                         (required with --window kaiser)
  --overlap F            overlap of successive blocks as a fraction in [0, 1) (default 0.5)
  --averages N           use only the first N blocks (default: every whole block in the record)
  --detrend MODE         none | mean | linear, applied to each block (default mean)
  --scaling MODE         density (units²/Hz, default) | spectrum (units²)
  --estimator NAME       H1 | H2 | Hv: copied into the h_re, h_im columns (default H1)
  --hv-weight K          Hv noise weighting κ > 0: ratio of output- to input-noise power in the
                         channels' units (default 1; large κ tends to H1, small κ to H2)

  --recipe FILE          instead of the options above: process exactly as a recipe file (or a
                         built-in recipe name) says, transient force/exponential windows included

Output:
  --format csv|json      default csv
  --output FILE          output file (default: stdout); written whole or not at all

Columns (one row per line k, frequency k·fs/N):
  frequency_hz                 line frequency, Hz
  gxx, gyy                     one-sided auto-spectra of x and y, x-unit²/Hz and y-unit²/Hz
                               (x-unit², y-unit² with --scaling spectrum)
  gyx_re, gyx_im               one-sided cross-spectrum Gyx = mean Y·conj(X), x-unit·y-unit/Hz
  h1_re, h1_im                 H1 = Gyx / Gxx, y-unit per x-unit (e.g. m/N)
  h2_re, h2_im                 H2 = Gyy / Gxy
  hv_re, hv_im                 Hv, total least squares between H1 and H2
  coherence                    ordinary coherence γ² = |Gyx|² / (Gxx·Gyy), 0..1
  h1_mag_random_error          normalised random error of |H1|, a fraction:
                               sqrt(1−γ²) / (|γ|·sqrt(2·n_d)), n_d the effective averages
                               (Bendat & Piersol, Random Data)
  phase_random_error_deg       standard deviation of the phase of H1, degrees (same formula)
  h_re, h_im                   the estimator chosen with --estimator
JSON output holds {"metadata": {...}, "lines": [{column: value, ...}]} with the settings,
block count, effective averages, window figures and warnings; non-finite numbers are null.

Exit status: 0 done; 2 bad input (message on stderr, no output file written).
`;

const PROCESSING_OPTIONS = ['block', 'window', 'kaiser-beta', 'overlap', 'averages', 'detrend', 'scaling', 'estimator', 'hv-weight'];

interface Processing {
  spectra: CrossSpectra;
  frf: FrfEstimate;
  chosen: ComplexArray;
  settings: Record<string, unknown>;
  warnings: string[];
}

/** Processing from the command-line options (Welch's method with the given settings). */
function processWithOptions(values: ParsedValues, x: Float64Array, y: Float64Array, sampleRateHz: number): Processing {
  const blockLength = numberOption(values, 'block', 1024, { integer: true, min: 8, powerOfTwo: true })!;
  const window = choiceOption(values, 'window', WINDOW_NAMES, 'hann');
  const kaiserBeta = numberOption(values, 'kaiser-beta', undefined, { min: 0, max: 100 });
  if (kaiserBeta !== undefined && window !== 'kaiser') {
    throw new CliInputError(`--kaiser-beta is for --window kaiser, not --window ${window}`);
  }
  if (kaiserBeta === undefined && window === 'kaiser') {
    throw new CliInputError('--window kaiser needs --kaiser-beta B (e.g. 8)');
  }
  const overlap = numberOption(values, 'overlap', 0.5, { min: 0, below: 1 })!;
  const averages = numberOption(values, 'averages', undefined, { integer: true, min: 1 });
  const detrend = choiceOption(values, 'detrend', DETRENDS, 'mean');
  const scaling = choiceOption(values, 'scaling', SCALINGS, 'density');
  const estimator = choiceOption(values, 'estimator', ESTIMATORS, 'H1');
  const hvWeight = numberOption(values, 'hv-weight', undefined, { above: 0 });
  if (x.length < blockLength) {
    throw new CliInputError(`--block=${blockLength} is longer than the record (${x.length} samples)`);
  }
  const windowParams = kaiserBeta !== undefined ? { kaiserBeta } : undefined;
  const spectra = welchCrossSpectra(x, y, {
    sampleRateHz,
    blockLength,
    window,
    windowParams,
    overlap,
    averages,
    detrend,
    scaling,
  });
  const frf = estimateFrf(spectra, hvWeight !== undefined ? { hvWeight } : undefined);
  const chosen = estimator === 'H1' ? frf.h1 : estimator === 'H2' ? frf.h2 : frf.hv;
  const settings = {
    blockLength,
    frequencyResolutionHz: sampleRateHz / blockLength,
    window,
    windowParams: windowParams ?? {},
    windowFigures: windowFigures(window, blockLength, windowParams),
    overlap,
    averagesRequested: averages ?? 'all',
    detrend,
    scaling,
    estimator,
    hvWeight: hvWeight ?? 1,
  };
  return { spectra, frf, chosen, settings, warnings: [...spectra.warnings] };
}

/** Processing exactly as a recipe file says (including its transient windows, if any). */
function processWithRecipe(recipeArg: string, x: Float64Array, y: Float64Array, sampleRateHz: number): Processing {
  const path = resolveRecipePath(recipeArg);
  const recipe = parseJsonFile(path, '--recipe', parseRecipe);
  const processed = processRecord({ sampleRateHz, input: x, output: y }, recipe);
  const blockLength = (processed.frequenciesHz.length - 1) * 2;
  const settings = {
    recipe: recipe.name,
    recipeFile: path,
    blockLength,
    frequencyResolutionHz: sampleRateHz / blockLength,
    window: recipe.window,
    windowParams: recipe.windowParams ?? {},
    windowFigures: windowFigures(recipe.window, blockLength, recipe.windowParams),
    overlap: recipe.overlap,
    averagesRequested: recipe.averages ?? 'all',
    detrend: recipe.detrend,
    scaling: recipe.scaling,
    estimator: recipe.estimator,
    hvWeight: recipe.hvWeight ?? 1,
    band: recipe.band,
    transient: recipe.transient ?? null,
    exponentialTauS: processed.exponentialTauS ?? null,
  };
  return { spectra: processed.spectra, frf: processed.estimate, chosen: processed.chosen, settings, warnings: processed.warnings };
}

function run(values: ParsedValues): number {
  const inputPath = requiredString(values, 'input');
  const format = choiceOption(values, 'format', ['csv', 'json'] as const, 'csv');
  const outputPath = optionalString(values, 'output');
  const xName = optionalString(values, 'x') ?? 'input';
  const yName = optionalString(values, 'y') ?? 'output';
  const recipeArg = optionalString(values, 'recipe');
  if (recipeArg !== undefined) {
    const clash = PROCESSING_OPTIONS.find((name) => values[name] !== undefined);
    if (clash) throw new CliInputError(`--${clash} cannot be given with --recipe (the recipe sets the processing)`);
  }
  const fsOption = numberOption(values, 'fs', undefined, { above: 0 });
  checkOutputPath(outputPath, 'output');

  const table = readNumericCsv(inputPath, '--input');
  const where = `--input "${inputPath}"`;
  const x = requireColumn(table, xName, where);
  const y = requireColumn(table, yName, where);
  const sampleRateHz = fsOption ?? (table.data.time_s ? sampleRateFromTime(table.data.time_s, where) : undefined);
  if (sampleRateHz === undefined) {
    throw new CliInputError(`--fs is required (the input has no time_s column to take it from)`);
  }
  const { spectra, frf, chosen, settings, warnings } =
    recipeArg !== undefined
      ? processWithRecipe(recipeArg, x, y, sampleRateHz)
      : processWithOptions(values, x, y, sampleRateHz);

  const toDeg = 180 / Math.PI;
  const phaseDeg = frf.randomError.phaseRad.map((v) => v * toDeg);
  const columns: ArrayLike<number>[] = [
    spectra.frequenciesHz,
    spectra.gxx,
    spectra.gyy,
    spectra.gyx.re,
    spectra.gyx.im,
    frf.h1.re,
    frf.h1.im,
    frf.h2.re,
    frf.h2.im,
    frf.hv.re,
    frf.hv.im,
    frf.coherence,
    frf.randomError.magnitude,
    phaseDeg,
    chosen.re,
    chosen.im,
  ];
  let text: string;
  if (format === 'csv') {
    text = formatCsv([...ESTIMATE_COLUMNS], columns);
  } else {
    const lines = Array.from({ length: spectra.frequenciesHz.length }, (_, k) => {
      const row: Record<string, number> = {};
      ESTIMATE_COLUMNS.forEach((name, c) => {
        row[name] = columns[c]![k]!;
      });
      return row;
    });
    const metadata = {
      input: inputPath,
      columns: { x: xName, y: yName },
      sampleRateHz,
      samples: table.rowCount,
      ...settings,
      blocks: spectra.blocks,
      effectiveAverages: spectra.effectiveAverages,
      warnings,
    };
    text = toJson({ metadata, lines });
  }
  for (const warning of warnings) process.stderr.write(`warning: ${warning}\n`);
  emit(outputPath, text);
  return EXIT.ok;
}

export const estimateCommand: CliCommand = {
  name: 'estimate',
  summary: 'estimate H1, H2, Hv, coherence and random errors from a two-channel CSV record',
  help: HELP,
  options: {
    input: { type: 'string' },
    fs: { type: 'string' },
    x: { type: 'string' },
    y: { type: 'string' },
    block: { type: 'string' },
    window: { type: 'string' },
    'kaiser-beta': { type: 'string' },
    overlap: { type: 'string' },
    averages: { type: 'string' },
    detrend: { type: 'string' },
    scaling: { type: 'string' },
    estimator: { type: 'string' },
    'hv-weight': { type: 'string' },
    recipe: { type: 'string' },
    format: { type: 'string' },
    output: { type: 'string' },
  },
  run,
};
