/**
 * `plumbline simulate`: the input and output signals of a scenario for one seed, and optionally
 * its exact FRF, as CSV (or JSON) files a lab can also feed to its own acquisition software.
 */
import { parseScenario, simulateScenario } from '@/shared/engine/scenario';
import {
  CliInputError,
  choiceOption,
  numberOption,
  optionalString,
  requiredString,
  type ParsedValues,
} from '../args';
import { resolveScenarioPath } from '../builtin';
import { EXIT, type CliCommand } from '../command';
import { formatCsv } from '../csv';
import { parseJsonFile } from '../files';
import { checkOutputPath, writeFilesAtomic } from '../output';
import { toJson } from '../table';

const HELP = `Usage: plumbline simulate --scenario FILE --output SIGNALS.csv [options]

Simulates a scenario (a file, or the name of a built-in one in scenarios/) for one seed and writes
the force and response signals; with --exact also the exact FRF of the underlying linear system.
The same scenario and seed give the same samples, bit for bit.

Options:
  --scenario FILE        scenario JSON file or built-in name (required)
  --seed N               seed of the random generators, a whole number ≥ 0 (default 1)
  --output FILE          signals file (required); columns:
                           time_s   sample time, s (n / fs)
                           input    force, N (with the scenario's input errors added)
                           output   response in the scenario's FRF quantity: m (receptance),
                                    m/s (mobility) or m/s² (accelerance), with its output errors
  --exact FILE           exact FRF file; columns:
                           frequency_hz   line frequency, Hz (0 to fs/2)
                           h_re, h_im     exact FRF, m/N, m/(N·s) or m/(N·s²)
  --df HZ                line spacing of the exact FRF, Hz (default fs / record length)
  --block N              instead of --df: the spacing fs / N of "estimate --block N", so that
                         "score" compares on the same lines without interpolation
  --format csv|json      default csv; json writes {"metadata": {...}, "columns": {...}} with the
                         sample rate, units, the simulation report and warnings

A summary (samples, sample rate, units, clipped samples, warnings) is printed on stdout.
Exit status: 0 done; 2 bad input (message on stderr, no output file written).
`;

function exactGrid(values: ParsedValues, sampleRateHz: number, samples: number): Float64Array {
  const df = numberOption(values, 'df', undefined, { above: 0 });
  const block = numberOption(values, 'block', undefined, { integer: true, min: 2 });
  if (df !== undefined && block !== undefined) throw new CliInputError('give --df or --block, not both');
  const spacing = df ?? sampleRateHz / (block ?? samples);
  const count = Math.floor(sampleRateHz / 2 / spacing + 1e-9) + 1;
  if (count > 4_000_000) throw new CliInputError(`--df=${spacing} gives ${count} lines; use a coarser spacing`);
  const grid = new Float64Array(count);
  if (block !== undefined || df === undefined) {
    const n = block ?? samples;
    for (let k = 0; k < count; k++) grid[k] = (k * sampleRateHz) / n;
  } else {
    for (let k = 0; k < count; k++) grid[k] = k * spacing;
  }
  return grid;
}

function run(values: ParsedValues): number {
  const scenarioPath = resolveScenarioPath(requiredString(values, 'scenario'));
  const seed = numberOption(values, 'seed', 1, { integer: true, min: 0, max: 2 ** 32 - 1 })!;
  const outputPath = requiredString(values, 'output');
  const exactPath = optionalString(values, 'exact');
  const format = choiceOption(values, 'format', ['csv', 'json'] as const, 'csv');
  if (exactPath === undefined && (values.df !== undefined || values.block !== undefined)) {
    throw new CliInputError('--df and --block set the exact FRF lines: give --exact FILE too');
  }
  if (outputPath === '-' || exactPath === '-') throw new CliInputError('simulate writes files: give --output (and --exact) a file name, not "-"');
  checkOutputPath(outputPath, 'output');
  checkOutputPath(exactPath, 'exact');
  if (exactPath !== undefined && exactPath === outputPath) throw new CliInputError('--exact and --output must differ');

  const scenario = parseJsonFile(scenarioPath, '--scenario', parseScenario);
  const record = simulateScenario(scenario, seed);
  const n = record.input.length;
  const fs = record.sampleRateHz;
  const time = new Float64Array(n);
  for (let i = 0; i < n; i++) time[i] = i / fs;
  const grid = exactPath !== undefined ? exactGrid(values, fs, n) : undefined;
  const exact = grid ? record.reference.frf(grid) : undefined;

  const metadata = {
    scenario: scenario.name,
    file: scenarioPath,
    seed,
    sampleRateHz: fs,
    samples: n,
    durationS: n / fs,
    inputUnit: record.inputUnit,
    outputUnit: record.outputUnit,
    frfQuantity: record.reference.quantity,
    frfUnit: record.reference.unit,
    referenceNote: record.referenceNote ?? null,
    modes: record.reference.modes,
    antiResonancesHz: record.reference.antiResonancesHz,
    report: record.report,
  };
  const files: { path: string; text: string }[] = [];
  if (format === 'csv') {
    files.push({ path: outputPath, text: formatCsv(['time_s', 'input', 'output'], [time, record.input, record.output]) });
    if (grid && exact) {
      files.push({ path: exactPath!, text: formatCsv(['frequency_hz', 'h_re', 'h_im'], [grid, exact.re, exact.im]) });
    }
  } else {
    files.push({
      path: outputPath,
      text: toJson({ metadata, columns: { time_s: time, input: record.input, output: record.output } }),
    });
    if (grid && exact) {
      files.push({
        path: exactPath!,
        text: toJson({ metadata, columns: { frequency_hz: grid, h_re: exact.re, h_im: exact.im } }),
      });
    }
  }
  writeFilesAtomic(files);
  const lines = [
    `scenario "${scenario.name}", seed ${seed}: ${n} samples at ${fs} Hz (${n / fs} s)`,
    `input in ${record.inputUnit}, output in ${record.outputUnit}; exact FRF ${record.reference.quantity} in ${record.reference.unit}`,
    `wrote ${outputPath}` + (exactPath ? ` and ${exactPath} (${grid!.length} lines)` : ''),
  ];
  if (record.report.inputClippedSamples > 0 || record.report.outputClippedSamples > 0) {
    lines.push(`clipped samples: input ${record.report.inputClippedSamples}, output ${record.report.outputClippedSamples}`);
  }
  if (record.referenceNote) lines.push(`note: ${record.referenceNote}`);
  for (const warning of record.report.warnings) lines.push(`warning: ${warning}`);
  process.stdout.write(lines.join('\n') + '\n');
  return EXIT.ok;
}

export const simulateCommand: CliCommand = {
  name: 'simulate',
  summary: 'simulate a scenario: force and response signals, and the exact FRF',
  help: HELP,
  options: {
    scenario: { type: 'string' },
    seed: { type: 'string' },
    output: { type: 'string' },
    exact: { type: 'string' },
    df: { type: 'string' },
    block: { type: 'string' },
    format: { type: 'string' },
  },
  run,
};
