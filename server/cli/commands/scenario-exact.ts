/**
 * The exact FRF of a scenario's linear system on given frequency lines, and the half-power mode
 * errors of an estimate against that system's modes (for `score --scenario`).
 */
import { parseScenario } from '@/shared/engine/scenario';
import { exactModeReferences, modeErrors, type ModeError } from '@/shared/engine/scores/modes';
import { buildSystem } from '@/shared/engine/systems';
import type { ComplexArray } from '@/shared/engine/types';
import { resolveScenarioPath } from '../builtin';
import { parseJsonFile } from '../files';

export interface ScenarioExact {
  name: string;
  unit: string;
  exact: ComplexArray;
  modeErrors(estimate: ComplexArray, band: { start: number; end: number }): ModeError[];
}

export function scenarioExact(arg: string, lines: Float64Array): ScenarioExact {
  const path = resolveScenarioPath(arg);
  const scenario = parseJsonFile(path, '--scenario', parseScenario);
  const system = buildSystem(scenario.system);
  return {
    name: scenario.name,
    unit: system.unit,
    exact: system.frf(lines),
    modeErrors(estimate, band) {
      const lowHz = lines[band.start]!;
      const highHz = lines[band.end - 1]!;
      const references = exactModeReferences(system.modes, system.frf, lowHz, highHz);
      return modeErrors({ frequenciesHz: lines, estimate, modes: system.modes, band, references });
    },
  };
}
