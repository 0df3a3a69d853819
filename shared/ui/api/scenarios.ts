/** The lab's scenarios (versioned), and the links of their CSV exports (signals, exact FRF). */
import { scenarioVersionSchema } from '@/shared/api/work';
import type { Scenario, ScenarioInput } from '@/shared/engine/scenario';
import { labPath } from './labs';
import { createResourceHooks, type ResourceVersionOf } from './versioned-resource';

export type ScenarioRecord = ResourceVersionOf<Scenario>;
export const scenariosApi = createResourceHooks<Scenario, ScenarioInput>('scenarios', scenarioVersionSchema);
export const scenarioKeys = scenariosApi.keys;

/** GET …/scenarios/:id/signals.csv: force and response for one seed, at a stored version. */
export function signalsCsvPath(labId: string, id: string, options: { seed: number; version?: number }): string {
  const q = new URLSearchParams({ seed: String(options.seed) });
  if (options.version) q.set('version', String(options.version));
  return labPath(labId, `/scenarios/${encodeURIComponent(id)}/signals.csv?${q}`);
}

/** GET …/scenarios/:id/exact.csv: the exact FRF at the scenario's line spacing. */
export function exactCsvPath(labId: string, id: string, version?: number): string {
  const q = version ? `?version=${version}` : '';
  return labPath(labId, `/scenarios/${encodeURIComponent(id)}/exact.csv${q}`);
}
