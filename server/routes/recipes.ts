/** /labs/:labId/recipes: versioned processing recipes (thin: parse, call the service, answer). */
import { Router } from 'express';
import { z } from 'zod';
import {
  recipeCreateSchema,
  recipeUpdateSchema,
  recipeVersionSchema,
  resourceListQuerySchema,
  resourceListSchema,
  versionListSchema,
  versionParamSchema,
} from '@/shared/api/work';
import { parseRecipe } from '@/shared/engine/recipe';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { resourceService } from '../services/versioned-resources';
import { parseBody } from './parse';

export const recipes = resourceService({ kind: 'recipes', noun: 'recipe', parse: parseRecipe });
const idParam = z.object({ id: z.string() });

export function recipeRoutes(deps: Pick<AppDeps, 'db'>): Router {
  const r = Router();
  const base = '/labs/:labId/recipes';
  labRoute(r, deps.db, { method: 'get', path: base, action: 'recipes.read', summary: 'List the recipes of a lab', query: resourceListQuerySchema, response: resourceListSchema }, async (req, res) => {
    res.json(await recipes.list(deps.db, req.lab.id, parseBody(resourceListQuerySchema, req.query)));
  });
  labRoute(r, deps.db, { method: 'post', path: base, action: 'recipes.write', summary: 'Create a recipe (version 1)', body: recipeCreateSchema, response: recipeVersionSchema, status: 201 }, async (req, res) => {
    res.status(201).json(await recipes.create(deps.db, req.lab.id, req.user.id, parseBody(recipeCreateSchema, req.body)));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id`, action: 'recipes.read', summary: 'The latest version of a recipe', response: recipeVersionSchema }, async (req, res) => {
    res.json(await recipes.get(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'put', path: `${base}/:id`, action: 'recipes.write', summary: 'Change a recipe: stores a new version', body: recipeUpdateSchema, response: recipeVersionSchema }, async (req, res) => {
    res.json(await recipes.update(deps.db, req.lab.id, req.user.id, parseBody(idParam, req.params).id, parseBody(recipeUpdateSchema, req.body)));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/versions`, action: 'recipes.read', summary: 'Every version of a recipe, newest first', response: versionListSchema }, async (req, res) => {
    res.json(await recipes.versions(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/versions/:version`, action: 'recipes.read', summary: 'One version of a recipe', response: recipeVersionSchema }, async (req, res) => {
    const { version } = parseBody(versionParamSchema, req.params);
    res.json(await recipes.get(deps.db, req.lab.id, parseBody(idParam, req.params).id, version));
  });
  return r;
}
