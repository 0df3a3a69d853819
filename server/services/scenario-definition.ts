/** Reading a stored scenario version through the engine (defaults filled in, rules checked). */
import { parseScenario, type Scenario } from '@/shared/engine/scenario';
import type { SystemSpec } from '@/shared/engine/systems';
import { checkedByEngine } from './engine-input';

export function scenarioOf(definition: unknown): Scenario {
  return checkedByEngine('scenario', () => parseScenario(definition));
}

/** The known-answer system of a scenario. */
export function scenarioSystem(definition: unknown): SystemSpec {
  return scenarioOf(definition).system;
}
