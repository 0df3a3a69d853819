/**
 * `plumbline`: the command-line face of the verification engine. Subcommands estimate an FRF
 * from a CSV record, simulate a scenario, verify a recipe against scenarios over many seeds,
 * score an estimated FRF against an exact one, list window figures and advise on a recipe.
 * Bad input prints one clear message on stderr and exits with status 2, writing no output file.
 */
import { CliInputError, parseCommandArgs } from './args';
import { EXIT, type CliCommand } from './command';

/** The subcommands; each module is loaded only when its command runs (quicker start). */
export const COMMANDS: { name: string; summary: string; load: () => CliCommand }[] = [
  {
    name: 'estimate',
    summary: 'estimate H1, H2, Hv, coherence and random errors from a two-channel CSV record',
    load: () => (require('./commands/estimate') as typeof import('./commands/estimate')).estimateCommand,
  },
  {
    name: 'simulate',
    summary: 'simulate a scenario: force and response signals, and the exact FRF',
    load: () => (require('./commands/simulate') as typeof import('./commands/simulate')).simulateCommand,
  },
  {
    name: 'verify',
    summary: 'run a recipe on scenarios over many seeds and judge its tolerances',
    load: () => (require('./commands/verify') as typeof import('./commands/verify')).verifyCommand,
  },
  {
    name: 'sweep',
    summary: 'vary one or two settings over a grid and name the cheapest passing point',
    load: () => (require('./commands/sweep') as typeof import('./commands/sweep')).sweepCommand,
  },
  {
    name: 'score',
    summary: 'score an estimated FRF against the exact FRF (dB, degrees, relative error, modes)',
    load: () => (require('./commands/score') as typeof import('./commands/score')).scoreCommand,
  },
  {
    name: 'windows',
    summary: 'list the figures of each window (gain, ENBW, scalloping, side lobes, overlap)',
    load: () => (require('./commands/windows') as typeof import('./commands/windows')).windowsCommand,
  },
  {
    name: 'advise',
    summary: 'draft a recipe for a scenario and a magnitude tolerance, with its predicted errors',
    load: () => (require('./commands/advise') as typeof import('./commands/advise')).adviseCommand,
  },
];

function overview(): string {
  const width = Math.max(...COMMANDS.map((c) => c.name.length));
  return [
    'plumbline — verify FRF processing against systems whose FRF is known exactly',
    '',
    'Usage: plumbline <command> [options]    plumbline <command> --help',
    '',
    'Commands:',
    ...COMMANDS.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`),
    '',
    'Exit status: 0 done; 1 verify found a failed criterion; 2 bad input (nothing written); 3 internal error.',
    '',
  ].join('\n');
}

/** True for the engine's and zod's input errors, which are the user's to fix (exit 2). */
function isInputError(error: unknown): boolean {
  if (error instanceof CliInputError) return true;
  const name = (error as { name?: unknown } | null)?.name;
  return name === 'EngineInputError' || name === 'ZodError';
}

/** Runs the CLI on `argv` (without node and script) and returns the exit status. */
export async function runCli(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    process.stdout.write(overview());
    return name === undefined ? EXIT.badInput : EXIT.ok;
  }
  const entry = COMMANDS.find((c) => c.name === name);
  if (!entry) {
    process.stderr.write(`plumbline: unknown command "${name}" (commands: ${COMMANDS.map((c) => c.name).join(', ')})\n`);
    return EXIT.badInput;
  }
  let command: CliCommand = { name: entry.name, summary: entry.summary, help: '', options: {}, run: () => EXIT.internal };
  try {
    command = entry.load();
    const values = parseCommandArgs(rest, command.options, command.positionalOption);
    if (values.help) {
      process.stdout.write(command.help);
      return EXIT.ok;
    }
    return await command.run(values);
  } catch (error) {
    if (isInputError(error)) {
      process.stderr.write(`plumbline ${command.name}: ${(error as Error).message}\n`);
      return EXIT.badInput;
    }
    process.stderr.write(`plumbline ${command.name}: internal error: ${(error as Error)?.stack ?? String(error)}\n`);
    return EXIT.internal;
  }
}

const entry = require.main?.filename ?? '';
if (require.main === module || entry.endsWith('plumbline.js') || entry.endsWith('main.ts')) {
  // A closed pipe (e.g. `plumbline estimate ... | head`) ends the output quietly.
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code === 'EPIPE') process.exit(process.exitCode ?? 0);
    throw error;
  });
  runCli(process.argv.slice(2)).then(
    (status) => {
      process.exitCode = status;
    },
    (error: unknown) => {
      process.stderr.write(`plumbline: internal error: ${String(error)}\n`);
      process.exitCode = EXIT.internal;
    },
  );
}
