/** GET /api/v1/openapi.json: the API document, built once from the registry on first request. */
import { Router } from 'express';
import type { AppDeps } from '../deps';
import { openRoute, routeRegistry } from '../auth/permissions';
import { buildOpenApiDocument } from '../openapi';

export function openApiRoutes(deps: AppDeps): Router {
  const r = Router();
  let doc: Record<string, unknown> | null = null;
  openRoute(r, { method: 'get', path: '/openapi.json', action: 'public', summary: 'This OpenAPI 3.1 document' }, (_req, res) => {
    doc ??= buildOpenApiDocument(routeRegistry.values(), { version: deps.version, serverUrl: deps.config.publicUrl });
    res.json(doc);
  });
  return r;
}
