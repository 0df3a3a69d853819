/** Reading the JSON files the CLI takes (scenarios, recipes), with errors that name the file. */
import { readFileSync } from 'node:fs';
import { CliInputError } from './args';

/** Reads and parses a JSON file; unreadable files and syntax errors become CliInputError. */
export function readJsonFile(path: string, what: string): unknown {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (error) {
    throw new CliInputError(`${what}: cannot read "${path}" (${(error as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch (error) {
    throw new CliInputError(`${what} "${path}" is not valid JSON: ${(error as Error).message}`);
  }
}

/** Runs an engine parser on a file's JSON, prefixing any error with the file's name. */
export function parseJsonFile<T>(path: string, what: string, parse: (json: unknown) => T): T {
  const json = readJsonFile(path, what);
  try {
    return parse(json);
  } catch (error) {
    throw new CliInputError(`${what} "${path}": ${(error as Error).message}`);
  }
}
