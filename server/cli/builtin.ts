/**
 * Built-in scenarios and recipes live in scenarios/*.json and scenarios/recipes/*.json. A
 * `--scenario` or `--recipe` value that is not an existing file but names a built-in one (its
 * file name without .json) resolves to that file.
 */
import { existsSync, readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { CliInputError } from './args';

/** The repository's scenarios folder (server/cli → ../../scenarios). */
export const SCENARIOS_DIR = resolve(__dirname, '..', '..', 'scenarios');
export const RECIPES_DIR = join(SCENARIOS_DIR, 'recipes');

function listJson(folder: string): string[] {
  if (!existsSync(folder)) return [];
  return readdirSync(folder)
    .filter((file) => file.endsWith('.json'))
    .sort()
    .map((file) => join(folder, file));
}

/** Paths of all built-in scenario files, sorted by name. */
export function builtInScenarioPaths(): string[] {
  return listJson(SCENARIOS_DIR);
}

function resolveIn(folder: string, arg: string, option: string): string {
  if (existsSync(arg)) return arg;
  const named = join(folder, arg.endsWith('.json') ? arg : `${arg}.json`);
  if (!arg.includes('/') && existsSync(named)) return named;
  const names = listJson(folder).map((p) => p.slice(folder.length + 1, -'.json'.length));
  throw new CliInputError(
    `--${option}=${arg}: no such file, and no built-in of that name (built-ins: ${names.join(', ') || 'none'})`,
  );
}

/** A scenario file path, or the built-in scenario of that name. */
export function resolveScenarioPath(arg: string): string {
  return resolveIn(SCENARIOS_DIR, arg, 'scenario');
}

/** A recipe file path, or the built-in recipe of that name. */
export function resolveRecipePath(arg: string): string {
  return resolveIn(RECIPES_DIR, arg, 'recipe');
}
