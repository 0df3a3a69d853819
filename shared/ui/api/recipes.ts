/** The lab's processing recipes (versioned): list, latest, versions, one version, create, update. */
import { recipeVersionSchema } from '@/shared/api/work';
import type { Recipe } from '@/shared/engine/recipe';
import { createResourceHooks, type ResourceVersionOf } from './versioned-resource';

export type RecipeRecord = ResourceVersionOf<Recipe>;
export const recipesApi = createResourceHooks<Recipe>('recipes', recipeVersionSchema);
export const recipeKeys = recipesApi.keys;
