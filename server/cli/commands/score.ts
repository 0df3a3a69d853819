/**
 * `plumbline score`: magnitude, phase and complex relative errors of an estimated FRF against an
 * exact FRF, line by line over a band, with the worst line of each; with --scenario also the
 * resonance frequency, damping and peak errors of each mode by the half-power method.
 */
import { scoreFrf } from '@/shared/engine/scores/line-scores';
import type { ComplexArray } from '@/shared/engine/types';
import {
  CliInputError,
  choiceOption,
  optionalString,
  parseBand,
  requiredString,
  type ParsedValues,
} from '../args';
import { EXIT, type CliCommand } from '../command';
import { formatCsv, readNumericCsv, requireColumn } from '../csv';
import { checkOutputPath, writeOutputs } from '../output';
import { formatShort, formatTable, toJson } from '../table';
import { bandLineRange, exactOnLines } from './exact-lines';
import { scenarioExact, type ScenarioExact } from './scenario-exact';

const HELP = `Usage: plumbline score --estimate FRF.csv (--exact EXACT.csv | --scenario FILE) [options]

Scores an estimated FRF against the exact one on the estimate's frequency lines.

Inputs:
  --estimate FILE.csv    estimated FRF: frequency_hz and either h_re, h_im or h1_re, h1_im
                         (the output of "plumbline estimate" has both)
  --use NAME             which estimate columns to score: h | h1 | h2 | hv
                         (default h when present, else h1)
  --exact FILE.csv       exact FRF: frequency_hz, h_re, h_im (the --exact output of "simulate");
                         lines that differ from the estimate's are linearly interpolated, with a
                         warning on stderr naming how many
  --scenario FILE        instead of --exact: a scenario file or built-in name; its exact FRF is
                         evaluated on the estimate's own lines, and mode errors are added
  --band LO,HI           band of lines to score, Hz (default: every line above 0 Hz)

Output:
  --format table|json    summary format (default table)
  --output FILE          where the summary goes (default: stdout)
  --lines FILE.csv       also write the per-line errors, columns: frequency_hz,
                         magnitude_error_db (20·log10(|Ĥ|/|H|)), phase_error_deg (arg(Ĥ·conj H),
                         wrapped to (−180, 180]), complex_relative_error (|Ĥ − H| / |H|, fraction)

Summary figures: largest |magnitude error| (dB), |phase error| (degrees) and complex relative
error (fraction) over the band, each with the line where it occurs, plus mean and RMS. With
--scenario, per mode: estimated peak frequency (Hz), resonance frequency error (%), half-power
damping ratio and its error (%), peak value error (dB), or why the mode could not be resolved.

Exit status: 0 done; 2 bad input (message on stderr, no output file written).
`;

function estimateColumns(values: ParsedValues, columns: string[]): { re: string; im: string } {
  const use = optionalString(values, 'use');
  if (use !== undefined) {
    const name = choiceOption(values, 'use', ['h', 'h1', 'h2', 'hv'] as const, 'h');
    return { re: `${name}_re`, im: `${name}_im` };
  }
  if (columns.includes('h_re') && columns.includes('h_im')) return { re: 'h_re', im: 'h_im' };
  if (columns.includes('h1_re') && columns.includes('h1_im')) return { re: 'h1_re', im: 'h1_im' };
  throw new CliInputError(`--estimate: needs columns h_re, h_im or h1_re, h1_im (columns: ${columns.join(', ')})`);
}

function run(values: ParsedValues): number {
  const estimatePath = requiredString(values, 'estimate');
  const exactPath = optionalString(values, 'exact');
  const scenarioArg = optionalString(values, 'scenario');
  if ((exactPath === undefined) === (scenarioArg === undefined)) {
    throw new CliInputError('give exactly one of --exact FILE.csv or --scenario FILE');
  }
  const format = choiceOption(values, 'format', ['table', 'json'] as const, 'table');
  const outputPath = optionalString(values, 'output');
  const linesPath = optionalString(values, 'lines');
  const bandRaw = optionalString(values, 'band');
  const bandHz = bandRaw !== undefined ? parseBand('band', bandRaw) : undefined;
  checkOutputPath(outputPath, 'output');
  checkOutputPath(linesPath, 'lines');

  const table = readNumericCsv(estimatePath, '--estimate', true);
  const where = `--estimate "${estimatePath}"`;
  const lines = requireColumn(table, 'frequency_hz', where);
  const names = estimateColumns(values, table.columns);
  const estimate: ComplexArray = { re: requireColumn(table, names.re, where), im: requireColumn(table, names.im, where) };
  for (let k = 1; k < lines.length; k++) {
    if (!(lines[k]! > lines[k - 1]!)) throw new CliInputError(`${where}: frequency_hz must increase (row ${k + 2})`);
  }

  const band = bandHz
    ? bandLineRange(lines, bandHz.lowHz, bandHz.highHz)
    : bandLineRange(lines, Number.MIN_VALUE, Number.POSITIVE_INFINITY);
  // Only the band's lines are scored, so the exact FRF need only cover those.
  const bandLines = lines.slice(band.start, band.end);
  const bandEstimate: ComplexArray = {
    re: estimate.re.slice(band.start, band.end),
    im: estimate.im.slice(band.start, band.end),
  };
  let exact: ComplexArray;
  let interpolatedLines = 0;
  let fromScenario: ScenarioExact | undefined;
  if (exactPath !== undefined) {
    const exactTable = readNumericCsv(exactPath, '--exact');
    const exactWhere = `--exact "${exactPath}"`;
    const onLines = exactOnLines(
      requireColumn(exactTable, 'frequency_hz', exactWhere),
      { re: requireColumn(exactTable, 'h_re', exactWhere), im: requireColumn(exactTable, 'h_im', exactWhere) },
      bandLines,
    );
    exact = onLines.exact;
    interpolatedLines = onLines.interpolatedLines;
  } else {
    fromScenario = scenarioExact(scenarioArg!, bandLines);
    exact = fromScenario.exact;
  }
  const warnings: string[] = [];
  if (interpolatedLines > 0) {
    warnings.push(
      `the exact FRF's lines differ from the estimate's: ${interpolatedLines} of ${bandLines.length} line(s) ` +
        'interpolated linearly (near sharp resonances this misstates the errors; export the exact FRF ' +
        'on the same lines, e.g. simulate --block N)',
    );
  }
  for (let i = 0; i < bandLines.length; i++) {
    if (!Number.isFinite(bandEstimate.re[i]!) || !Number.isFinite(bandEstimate.im[i]!)) {
      throw new CliInputError(`${where}: ${names.re}/${names.im} is not a finite number at ${bandLines[i]} Hz (narrow --band)`);
    }
  }
  const whole = { start: 0, end: bandLines.length };
  const score = scoreFrf({ frequenciesHz: bandLines, exact, estimate: bandEstimate, band: whole });
  const modes = fromScenario ? fromScenario.modeErrors(bandEstimate, whole) : undefined;
  for (const warning of warnings) process.stderr.write(`warning: ${warning}\n`);

  const files: { path: string; text: string }[] = [];
  if (linesPath !== undefined) {
    const text = formatCsv(
      ['frequency_hz', 'magnitude_error_db', 'phase_error_deg', 'complex_relative_error'],
      [score.frequenciesHz, score.magnitudeErrorDb, score.phaseErrorDeg, score.complexRelativeError],
    );
    files.push({ path: linesPath, text });
  }
  const summary = {
    estimate: estimatePath,
    estimateColumns: names,
    exact: exactPath ?? null,
    scenario: fromScenario?.name ?? null,
    unit: fromScenario?.unit ?? null,
    interpolatedLines,
    ...score.summary,
    modes: modes ?? null,
    warnings,
  };
  const text = format === 'json' ? toJson(summary) : scoreTable(summary);
  writeOutputs(files, outputPath, text);
  return EXIT.ok;
}

type Summary = ReturnType<typeof scoreFrf>['summary'] & {
  modes: ReturnType<ScenarioExact['modeErrors']> | null;
  warnings: string[];
};

function scoreTable(s: Summary): string {
  const rows = [
    ['magnitude error', `${formatShort(s.maxAbsMagnitudeDb)} dB`, `${formatShort(s.worstMagnitudeHz)} Hz`, `${formatShort(s.meanMagnitudeDb)} dB`, `${formatShort(s.rmsMagnitudeDb)} dB`],
    ['phase error', `${formatShort(s.maxAbsPhaseDeg)} deg`, `${formatShort(s.worstPhaseHz)} Hz`, `${formatShort(s.meanPhaseDeg)} deg`, `${formatShort(s.rmsPhaseDeg)} deg`],
    ['complex relative error', formatShort(s.maxComplexRelative), `${formatShort(s.worstComplexHz)} Hz`, '', formatShort(s.rmsComplexRelative)],
  ];
  let out = `Band ${formatShort(s.bandLowHz)}–${formatShort(s.bandHighHz)} Hz, ${s.lines} lines` +
    (s.undefinedLines > 0 ? ` (${s.undefinedLines} with exact |H| = 0 left out)` : '') + '\n\n';
  out += formatTable(['score', 'largest |error|', 'at line', 'mean', 'RMS'], rows, ['left', 'right', 'right', 'right', 'right']);
  if (s.modes && s.modes.length > 0) {
    const modeRows = s.modes.map((m) =>
      m.status === 'resolved'
        ? [
            `${m.modeIndex + 1}`,
            `${formatShort(m.naturalFrequencyHz)} Hz`,
            `${formatShort(m.estimatedPeakHz!)} Hz`,
            `${formatShort(m.resonanceFrequencyErrorPercent!)} %`,
            `${formatShort(m.dampingRatio * 100)} %`,
            `${formatShort(m.estimatedDampingRatio! * 100)} %`,
            `${formatShort(m.dampingErrorPercent!)} %`,
            m.peakValueErrorDb === null ? '—' : `${formatShort(m.peakValueErrorDb)} dB`,
          ]
        : [`${m.modeIndex + 1}`, `${formatShort(m.naturalFrequencyHz)} Hz`, `${m.status}: ${m.reason ?? ''}`, '', '', '', '', ''],
    );
    out += '\nModes (half-power method on the estimate):\n';
    out += formatTable(
      ['mode', 'exact f_n', 'peak', 'f error', 'exact ζ', 'estimated ζ', 'ζ error', 'peak error'],
      modeRows,
      ['right', 'right', 'right', 'right', 'right', 'right', 'right', 'right'],
    );
  }
  for (const warning of s.warnings) out += `\nwarning: ${warning}\n`;
  return out;
}

export const scoreCommand: CliCommand = {
  name: 'score',
  summary: 'score an estimated FRF against the exact FRF (dB, degrees, relative error, modes)',
  help: HELP,
  options: {
    estimate: { type: 'string' },
    exact: { type: 'string' },
    scenario: { type: 'string' },
    use: { type: 'string' },
    band: { type: 'string' },
    format: { type: 'string' },
    output: { type: 'string' },
    lines: { type: 'string' },
  },
  run,
};
