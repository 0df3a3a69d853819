/** The shape of one `plumbline` subcommand. */
import type { OptionSpec, ParsedValues } from './args';

export interface CliCommand {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** Full help text: usage, every option with its unit and default, outputs, exit status. */
  help: string;
  options: OptionSpec;
  /** The option that takes bare words as more values (`--scenario a.json b.json`). */
  positionalOption?: string;
  /** Runs with parsed options; returns the exit status (0 done, 1 criteria failed). */
  run(values: ParsedValues): number | Promise<number>;
}

/** Exit statuses of the CLI. */
export const EXIT = {
  ok: 0,
  /** `verify`: at least one acceptance criterion failed. */
  criteriaFailed: 1,
  /** Bad input: unknown option, missing or invalid value, unreadable or invalid file. */
  badInput: 2,
  /** Anything unexpected (a bug): message on stderr. */
  internal: 3,
} as const;
