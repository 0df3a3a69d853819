/** `plumbline windows`: the figures of each analysis window at a block length. */
import { WINDOW_NAMES, windowFigures } from '@/shared/engine/windows';
import { choiceOption, numberOption, optionalString, type ParsedValues } from '../args';
import { EXIT, type CliCommand } from '../command';
import { checkOutputPath, emit } from '../output';
import { formatShort, formatTable, toJson } from '../table';

/** Kaiser β used for the listing when none is given (side lobes near −60 dB; a plain choice). */
const DEFAULT_LISTING_KAISER_BETA = 8;

const HELP = `Usage: plumbline windows [--block N] [--fs HZ] [--kaiser-beta B] [--format table|json]

Lists, for every window the engine offers (rectangular, hann, hamming, flattop, blackman-harris,
kaiser), its figures computed on a DFT-even (periodic) window of N samples:

  coherent gain          mean of the window, a fraction (rectangular 1)
  ENBW                   equivalent noise bandwidth, bins (× fs/N for Hz when --fs is given)
  scalloping loss        amplitude loss of a sine half-way between two lines, dB
  highest side lobe      level of the highest side lobe against the main lobe, dB
  overlap correlation    correlation of successive blocks at 50 % and 75 % overlap, percent
                         (P. D. Welch, 1967; F. J. Harris, Proc. IEEE 66(1), 1978)

Options:
  --block N              window length in samples (default 1024)
  --fs HZ                sample rate in Hz: adds the ENBW in Hz (ENBW bins × fs / N)
  --kaiser-beta B        Kaiser window shape parameter, dimensionless (default 8 for this list)
  --format table|json    default table
  --output FILE          output file (default: stdout)

Exit status: 0 done; 2 bad input.
`;

function run(values: ParsedValues): number {
  const blockLength = numberOption(values, 'block', 1024, { integer: true, min: 8 })!;
  const sampleRateHz = numberOption(values, 'fs', undefined, { above: 0 });
  const kaiserBeta = numberOption(values, 'kaiser-beta', DEFAULT_LISTING_KAISER_BETA, { min: 0, max: 100 })!;
  const format = choiceOption(values, 'format', ['table', 'json'] as const, 'table');
  const outputPath = optionalString(values, 'output');
  checkOutputPath(outputPath, 'output');

  const windows = WINDOW_NAMES.map((name) => {
    const params = name === 'kaiser' ? { kaiserBeta } : undefined;
    const figures = windowFigures(name, blockLength, params);
    return {
      window: name,
      ...(params ?? {}),
      coherentGain: figures.coherentGain,
      enbwBins: figures.enbwBins,
      enbwHz: sampleRateHz !== undefined ? (figures.enbwBins * sampleRateHz) / blockLength : null,
      scallopingLossDb: figures.scallopingLossDb,
      highestSidelobeDb: figures.highestSidelobeDb,
      overlapCorrelation50Percent: figures.overlapCorrelation.at50 * 100,
      overlapCorrelation75Percent: figures.overlapCorrelation.at75 * 100,
    };
  });
  if (format === 'json') {
    emit(outputPath, toJson({ blockLength, sampleRateHz: sampleRateHz ?? null, windows }));
    return EXIT.ok;
  }
  const header = ['window', 'coherent gain', 'ENBW', ...(sampleRateHz !== undefined ? ['ENBW at fs'] : []),
    'scalloping loss', 'highest side lobe', 'overlap corr. 50 %', 'overlap corr. 75 %'];
  const rows = windows.map((w) => [
    w.window,
    formatShort(w.coherentGain),
    `${formatShort(w.enbwBins)} bins`,
    ...(w.enbwHz !== null ? [`${formatShort(w.enbwHz)} Hz`] : []),
    `${formatShort(w.scallopingLossDb, 3)} dB`,
    `${formatShort(w.highestSidelobeDb, 3)} dB`,
    `${formatShort(w.overlapCorrelation50Percent, 3)} %`,
    `${formatShort(w.overlapCorrelation75Percent, 3)} %`,
  ]);
  const align = header.map((_, c) => (c === 0 ? 'left' : 'right') as 'left' | 'right');
  emit(outputPath, `Window figures at N = ${blockLength} samples\n\n` + formatTable(header, rows, align));
  return EXIT.ok;
}

export const windowsCommand: CliCommand = {
  name: 'windows',
  summary: 'list the figures of each window (gain, ENBW, scalloping, side lobes, overlap)',
  help: HELP,
  options: {
    block: { type: 'string' },
    fs: { type: 'string' },
    'kaiser-beta': { type: 'string' },
    format: { type: 'string' },
    output: { type: 'string' },
  },
  run,
};
