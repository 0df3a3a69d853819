/**
 * GET /api/v1/openapi.json: an OpenAPI 3.1 document generated from the route registry and the zod
 * schemas, covering every registered route with its permission and its request/response schemas.
 */
import { PERMISSIONS, routeRegistry } from '@/server/auth/permissions';
import { openApiPath } from '@/server/openapi';
import { startTestServer, type TestServer } from './helpers';

let t: TestServer;
let doc: {
  openapi: string;
  paths: Record<string, Record<string, Record<string, any>>>; // eslint-disable-line @typescript-eslint/no-explicit-any
  components: Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
};
beforeAll(async () => {
  t = await startTestServer();
  const res = await t.http.get('/api/v1/openapi.json').expect(200).expect('content-type', /json/);
  doc = res.body;
});
afterAll(() => t.close());

describe('the OpenAPI document', () => {
  it('is OpenAPI 3.1 with the session cookie scheme and the error shape', () => {
    expect(doc.openapi).toBe('3.1.0');
    expect(doc.components.securitySchemes.session).toEqual({ type: 'apiKey', in: 'cookie', name: 'plumbline_session' });
    expect(doc.components.schemas.ApiError.properties.error.required).toEqual(['code', 'message']);
  });

  it('covers every registered route, with its action and allowed roles', () => {
    expect(routeRegistry.size).toBeGreaterThan(0);
    for (const spec of routeRegistry.values()) {
      const op = doc.paths[`/api/v1${openApiPath(spec.path)}`]?.[spec.method];
      expect([spec.method, spec.path, op?.summary]).toEqual([spec.method, spec.path, spec.summary]);
      if (spec.action in PERMISSIONS) {
        expect(op!['x-plumbline-action']).toBe(spec.action);
        expect(op!['x-plumbline-roles']).toEqual(PERMISSIONS[spec.action as keyof typeof PERMISSIONS]);
        expect(Object.keys(op!.responses)).toEqual(expect.arrayContaining(['401', '403', '404']));
      }
    }
  });

  it('turns Express parameters into OpenAPI path parameters', () => {
    const op = doc.paths['/api/v1/labs/{labId}/members/{userId}']!.patch!;
    expect(op.parameters.map((p: { name: string; in: string }) => `${p.in}:${p.name}`)).toEqual(['path:labId', 'path:userId']);
    expect(op.requestBody.content['application/json'].schema).toMatchObject({
      type: 'object',
      properties: { role: { type: 'string', enum: ['admin', 'analyst', 'reviewer', 'auditor'] } },
      required: ['role'],
    });
  });

  it('lists query parameters from the zod query schema with their limits and defaults', () => {
    const params = doc.paths['/api/v1/labs/{labId}/members']!.get!.parameters as { name: string; required: boolean; schema: Record<string, unknown> }[];
    const limit = params.find((p) => p.name === 'limit')!;
    expect(limit.required).toBe(false);
    expect(limit.schema).toMatchObject({ type: 'integer', minimum: 1, maximum: 200, default: 50 });
    expect(params.find((p) => p.name === 'sort')!.schema.enum).toEqual(['displayName', 'email', 'role', 'joinedAt']);
  });

  it('describes responses from the shared schemas', () => {
    const list = doc.paths['/api/v1/labs/{labId}/members']!.get!.responses['200'].content['application/json'].schema;
    expect(list.required).toEqual(['items', 'total', 'limit', 'offset']);
    expect(list.properties.items.items.required).toEqual(['userId', 'email', 'displayName', 'role', 'joinedAt']);
    const created = doc.paths['/api/v1/labs/{labId}/invitations']!.post!.responses;
    expect(Object.keys(created)).toContain('201');
    expect(doc.paths['/api/v1/labs/{labId}/audit/export']!.get!.responses['200'].content).toHaveProperty(['text/csv']);
  });
});
