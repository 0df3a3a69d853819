/**
 * Argument handling shared by the `plumbline` subcommands: one error type for bad input (the
 * process exits with status 2 and prints the message on stderr) and strict parsers for numbers,
 * choices and frequency bands, each naming the option and the offending value.
 */
import { parseArgs, type ParseArgsConfig } from 'node:util';

/** Bad input given to the CLI: unknown option, missing value, unreadable file, invalid data. */
export class CliInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CliInputError';
  }
}

export type OptionSpec = NonNullable<ParseArgsConfig['options']>;
export type ParsedValues = Record<string, string | boolean | string[] | boolean[] | undefined>;

/** Parses `argv` against `options` (plus --help), turning parseArgs errors into CliInputError. */
export function parseCommandArgs(argv: string[], options: OptionSpec, positionalOption?: string): ParsedValues {
  try {
    const { values, positionals } = parseArgs({
      args: argv,
      options: { ...options, help: { type: 'boolean', short: 'h' } },
      strict: true,
      allowPositionals: true,
    });
    const parsed = values as ParsedValues;
    if (positionals.length > 0) {
      if (positionalOption === undefined) {
        throw new CliInputError(`unexpected argument "${positionals[0]}" (options start with --)`);
      }
      // `--scenario a.json b.json`: the words after the option are more values of it.
      parsed[positionalOption] = [...stringList(parsed, positionalOption), ...positionals];
    }
    return parsed;
  } catch (error) {
    if (error instanceof CliInputError) throw error;
    const message = error instanceof Error ? error.message : String(error);
    throw new CliInputError(message);
  }
}

/** The string value of an option, or undefined when absent. */
export function optionalString(values: ParsedValues, name: string): string | undefined {
  const value = values[name];
  if (value === undefined) return undefined;
  if (Array.isArray(value)) return value.length > 0 ? String(value[value.length - 1]) : undefined;
  return String(value);
}

/** The string value of a required option. */
export function requiredString(values: ParsedValues, name: string): string {
  const value = optionalString(values, name);
  if (value === undefined || value === '') throw new CliInputError(`--${name} is required`);
  return value;
}

/** All values of a repeatable option (`--scenario a.json --scenario b.json`). */
export function stringList(values: ParsedValues, name: string): string[] {
  const value = values[name];
  if (value === undefined) return [];
  return (Array.isArray(value) ? value : [value]).map(String);
}

export interface NumberRule {
  integer?: boolean;
  /** Inclusive lower bound. */
  min?: number;
  /** Exclusive lower bound. */
  above?: number;
  /** Inclusive upper bound. */
  max?: number;
  /** Exclusive upper bound. */
  below?: number;
  powerOfTwo?: boolean;
}

/** Parses a number strictly (the whole text must be a finite number) and checks its range. */
export function parseNumber(name: string, raw: string, rule: NumberRule = {}): number {
  const text = raw.trim();
  const value = text === '' ? Number.NaN : Number(text);
  const fail = (what: string): never => {
    throw new CliInputError(`--${name}=${raw} ${what}`);
  };
  if (!Number.isFinite(value)) fail('must be a finite number');
  if (rule.integer && !Number.isInteger(value)) fail('must be a whole number');
  if (rule.min !== undefined && value < rule.min) fail(`must be at least ${rule.min}`);
  if (rule.above !== undefined && value <= rule.above) fail(`must be greater than ${rule.above}`);
  if (rule.max !== undefined && value > rule.max) fail(`must be at most ${rule.max}`);
  if (rule.below !== undefined && value >= rule.below) fail(`must be less than ${rule.below}`);
  if (rule.powerOfTwo && (value < 1 || (value & (value - 1)) !== 0 || !Number.isInteger(value))) {
    fail('must be a power of two (e.g. 256, 1024, 4096)');
  }
  return value;
}

/** A numeric option, or `fallback` when absent. */
export function numberOption(
  values: ParsedValues,
  name: string,
  fallback: number | undefined,
  rule: NumberRule = {},
): number | undefined {
  const raw = optionalString(values, name);
  return raw === undefined ? fallback : parseNumber(name, raw, rule);
}

/** A required numeric option. */
export function requiredNumber(values: ParsedValues, name: string, rule: NumberRule = {}): number {
  return parseNumber(name, requiredString(values, name), rule);
}

/** One of a fixed set of words (case-insensitive match, canonical spelling returned). */
export function choiceOption<T extends string>(
  values: ParsedValues,
  name: string,
  choices: readonly T[],
  fallback: T,
): T {
  const raw = optionalString(values, name);
  if (raw === undefined) return fallback;
  const found = choices.find((choice) => choice.toLowerCase() === raw.trim().toLowerCase());
  if (found === undefined) {
    throw new CliInputError(`--${name}=${raw} must be one of: ${choices.join(', ')}`);
  }
  return found;
}

/** A frequency band "LO,HI" in Hz with 0 ≤ LO < HI. */
export function parseBand(name: string, raw: string): { lowHz: number; highHz: number } {
  const parts = raw.split(',');
  if (parts.length !== 2) throw new CliInputError(`--${name}=${raw} must be two numbers in Hz, "LO,HI"`);
  const lowHz = parseNumber(name, parts[0]!, { min: 0 });
  const highHz = parseNumber(name, parts[1]!, { min: 0 });
  if (!(highHz > lowHz)) throw new CliInputError(`--${name}=${raw} needs LO < HI`);
  return { lowHz, highHz };
}
