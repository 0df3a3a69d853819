/**
 * The lab's three versioned resources as services: systems, scenarios and recipes, each checked
 * by the engine's own parser before a version is stored.
 */
import { parseRecipe } from '@/shared/engine/recipe';
import { parseScenario } from '@/shared/engine/scenario';
import { parseSystemSpec } from '@/shared/engine/systems';
import { resourceService } from './versioned-resources';

export const systems = resourceService({ kind: 'systems', noun: 'system', parse: (d) => parseSystemSpec(d) });
export const scenarios = resourceService({ kind: 'scenarios', noun: 'scenario', parse: parseScenario });
export const recipes = resourceService({ kind: 'recipes', noun: 'recipe', parse: parseRecipe });
