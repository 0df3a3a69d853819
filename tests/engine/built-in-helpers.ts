/**
 * Helpers for the built-in scenario tests: load the scenario and recipe files, run a record
 * through a recipe, and read magnitudes at chosen lines. A "control" run is the same scenario
 * and seed with its error sources removed: the excitation comes from its own random stream, so
 * the two runs see the same force and differ only by the mechanism under test.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { processRecord, type ProcessedFrf } from '@/shared/engine/process';
import { parseRecipe, type Recipe } from '@/shared/engine/recipe';
import { parseScenario, simulateScenario, type Scenario, type SimulatedRecord } from '@/shared/engine/scenario';
import type { ComplexArray } from '@/shared/engine/types';

export const SCENARIOS_DIR = resolve(__dirname, '..', '..', 'scenarios');
export const RECIPES_DIR = join(SCENARIOS_DIR, 'recipes');

export function jsonFiles(folder: string): string[] {
  return readdirSync(folder).filter((f) => f.endsWith('.json')).sort();
}

export function readJson(path: string): unknown {
  return JSON.parse(readFileSync(path, 'utf8')) as unknown;
}

export function loadScenario(name: string): Scenario {
  return parseScenario(readJson(join(SCENARIOS_DIR, `${name}.json`)));
}

export function loadRecipe(name: string): Recipe {
  return parseRecipe(readJson(join(RECIPES_DIR, `${name}.json`)));
}

/** The same scenario with every error source off (the control). */
export function withoutErrors(s: Scenario): Scenario {
  return parseScenario({ ...s, errors: {} });
}

/** A plain stationary recipe for tests, from a few settings. */
export function testRecipe(settings: Partial<Recipe>): Recipe {
  return parseRecipe({
    name: 'test recipe',
    window: 'hann',
    overlap: 0.5,
    detrend: 'none',
    estimator: 'H1',
    band: { lowHz: 10, highHz: 150 },
    scaling: 'density',
    tolerances: {},
    ...settings,
  });
}

export interface Run {
  record: SimulatedRecord;
  processed: ProcessedFrf;
  /** The exact FRF on the processed lines. */
  exact: ComplexArray;
}

export function runOnce(scenario: Scenario, seed: number, recipe: Recipe): Run {
  const record = simulateScenario(scenario, seed);
  return processOnce(record, recipe);
}

export function processOnce(record: SimulatedRecord, recipe: Recipe): Run {
  const processed = processRecord(record, recipe);
  return { record, processed, exact: record.reference.frf(processed.frequenciesHz) };
}

export function magnitude(h: ComplexArray, k: number): number {
  return Math.hypot(h.re[k]!, h.im[k]!);
}

/** Index of the line nearest to `hz`. */
export function nearestLine(frequenciesHz: Float64Array, hz: number): number {
  let best = 0;
  for (let k = 1; k < frequenciesHz.length; k++) {
    if (Math.abs(frequenciesHz[k]! - hz) < Math.abs(frequenciesHz[best]! - hz)) best = k;
  }
  return best;
}

/** Indices of the lines inside [lowHz, highHz]. */
export function linesIn(frequenciesHz: Float64Array, lowHz: number, highHz: number): number[] {
  const out: number[] = [];
  frequenciesHz.forEach((f, k) => {
    if (f >= lowHz && f <= highHz) out.push(k);
  });
  return out;
}

export const dB = (ratio: number) => 20 * Math.log10(ratio);

export function mean(values: readonly number[]): number {
  return values.reduce((a, b) => a + b, 0) / values.length;
}

/** Mean square of a record (its power). */
export function meanSquare(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i]! * x[i]!;
  return s / x.length;
}
