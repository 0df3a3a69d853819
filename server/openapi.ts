/**
 * The OpenAPI 3.1 document of /api/v1, generated from the route registry (server/auth/permissions)
 * and the zod schemas each route registered (z.toJSONSchema, JSON Schema 2020-12 as OpenAPI 3.1
 * uses). Lab routes state their permission action and the roles that hold it.
 */
import { z } from 'zod';
import { apiErrorSchema } from '@/shared/api/auth';
import { PERMISSIONS, type RouteSpec } from './auth/permissions';

type Json = Record<string, unknown>;

function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): Json {
  const out = z.toJSONSchema(schema, { io, unrepresentable: 'any' }) as Json;
  delete out.$schema;
  return out;
}

/** Express path → OpenAPI path: /labs/:labId → /labs/{labId}. */
export const openApiPath = (path: string) => path.replace(/:([A-Za-z0-9_]+)/g, '{$1}');

function queryParameters(schema: z.ZodType | undefined): Json[] {
  if (!schema || !(schema instanceof z.ZodObject)) return [];
  return Object.entries(schema.shape as Record<string, z.ZodType>).map(([name, field]) => ({
    name,
    in: 'query',
    required: !field.safeParse(undefined).success,
    schema: jsonSchema(field, 'input'),
    ...(field.description && { description: field.description }),
  }));
}

const errorResponse = (description: string) => ({
  description,
  content: { 'application/json': { schema: { $ref: '#/components/schemas/ApiError' } } },
});

function operation(spec: RouteSpec): Json {
  const pathParams = [...spec.path.matchAll(/:([A-Za-z0-9_]+)/g)].map((m) => ({
    name: m[1], in: 'path', required: true, schema: { type: 'string' },
  }));
  const status = String(spec.status ?? 200);
  const success: Json = { description: status === '204' ? 'Done (no content)' : 'Success' };
  if (spec.response) success.content = { 'application/json': { schema: jsonSchema(spec.response, 'output') } };
  else if (spec.produces) success.content = { [spec.produces]: { schema: { type: 'string' } } };

  const responses: Json = { [status]: success, '400': errorResponse('The request is not valid (field paths in details.fields)') };
  const lab = spec.action !== 'public' && spec.action !== 'signed-in';
  if (spec.action !== 'public') responses['401'] = errorResponse('Not signed in');
  if (lab) {
    responses['403'] = errorResponse("The caller's role in this lab lacks the action");
    responses['404'] = errorResponse('No such lab for this user (or no such item in it)');
  }
  const roles = lab ? PERMISSIONS[spec.action as keyof typeof PERMISSIONS] : undefined;
  return {
    operationId: `${spec.method}${spec.path.replace(/[:/{}-]+(\w)?/g, (_m, c: string | undefined) => (c ?? '').toUpperCase())}`,
    summary: spec.summary,
    tags: [spec.tag ?? 'api'],
    ...(spec.action !== 'public' && { security: [{ session: [] }] }),
    ...(lab && { description: `Action \`${spec.action}\`; allowed roles: ${roles!.join(', ')}.`, 'x-plumbline-action': spec.action, 'x-plumbline-roles': roles }),
    parameters: [...pathParams, ...queryParameters(spec.query)],
    ...(spec.body && { requestBody: { required: true, content: { 'application/json': { schema: jsonSchema(spec.body, 'input') } } } }),
    responses,
  };
}

/** Builds the document from every registered route (call after the routes are mounted). */
export function buildOpenApiDocument(routes: Iterable<RouteSpec>, info: { version: string; serverUrl?: string }): Json {
  const paths: Record<string, Json> = {};
  const sorted = [...routes].sort((a, b) => a.path.localeCompare(b.path) || a.method.localeCompare(b.method));
  for (const spec of sorted) {
    const p = `/api/v1${openApiPath(spec.path)}`;
    paths[p] ??= {};
    paths[p][spec.method] = operation(spec);
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Plumbline API',
      version: info.version,
      description: 'Method verification for FRF processing. Errors are { error: { code, message, details } }. Times are milliseconds since the Unix epoch.',
    },
    ...(info.serverUrl && { servers: [{ url: info.serverUrl }] }),
    paths,
    components: {
      schemas: { ApiError: jsonSchema(apiErrorSchema, 'output') },
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: 'plumbline_session' } },
    },
  };
}
