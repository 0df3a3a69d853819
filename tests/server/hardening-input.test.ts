/**
 * Oversized and mistyped input on every JSON route of the registry, called with a role the
 * permission table allows: a body over the 1 MB limit is a 413 body_too_large, a JSON body sent as
 * text/plain or as multipart is a 415, an unreadable charset or deeply nested JSON is a 4xx; each
 * with { error: { code, message } } and nothing stored. The upload route: JSON instead of a file is
 * a 400, and a wrong field type is named. (One oversized body on one route and the upload size
 * limit are in foundation.test.ts and uploads-files.test.ts.)
 */
import type { Role } from '@/shared/api/auth';
import { routeRegistry, type RouteSpec } from '@/server/auth/permissions';
import { buildRegistry, countChanges, errorShapeProblems, pathFor, roleFor, tableCounts, VOLATILE_TABLES } from './fuzz-support';
import { startTestServer, type TestServer } from './helpers';

const registry = buildRegistry();
let t: TestServer;
const agents = {} as Record<Role, Awaited<ReturnType<TestServer['signIn']>>>;
const ids: Record<string, string> = {};

beforeAll(async () => {
  t = await startTestServer();
  for (const role of ['admin', 'analyst', 'reviewer', 'auditor'] as Role[]) agents[role] = await t.signIn(role);
  for (const kind of ['systems', 'scenarios', 'recipes'] as const) {
    ids[kind] = (await agents.analyst.get(`/api/v1/labs/${t.labId}/${kind}`).expect(200)).body.items[0]?.id;
  }
});
afterAll(async () => {
  await t?.close();
  await registry.destroy();
});

const jsonRoutes = [...routeRegistry.values()].filter((r) => r.body);
const call = (spec: RouteSpec) => {
  const role = roleFor(spec);
  return (role ? agents[role] : t.http)[spec.method](pathFor(spec, t.labId, ids)).timeout(15_000);
};

/** Sends, then checks: the status, the error shape, and that no table changed. */
async function refused(spec: RouteSpec, send: (req: ReturnType<typeof call>) => Promise<{ status: number; body: unknown }>, statuses: number[]) {
  const before = await tableCounts(t.db);
  const res = await send(call(spec));
  const after = await tableCounts(t.db);
  expect(statuses).toContain(res.status);
  expect(errorShapeProblems(res)).toEqual([]);
  expect(countChanges(before, after, VOLATILE_TABLES)).toEqual([]);
  return res;
}

const name = (r: RouteSpec) => `${r.method.toUpperCase()} ${r.path}`;

describe.each(jsonRoutes.map((r) => [name(r), r] as const))('%s', (_n, spec) => {
  it('refuses a JSON body over 1 MB with 413 body_too_large', async () => {
    const big = JSON.stringify({ name: 'x'.repeat(1_100_000), reason: 'x', email: 'a@b.test' });
    const res = await refused(spec, (req) => req.set('Content-Type', 'application/json').send(big), [413]);
    expect((res.body as { error: { code: string } }).error.code).toBe('body_too_large');
  });

  it('refuses JSON sent as text/plain with 415', async () => {
    await refused(spec, (req) => req.set('Content-Type', 'text/plain').send('{"name":"x","email":"a@b.test","password":"x"}'), [415]);
  });

  it('refuses a multipart form with 415', async () => {
    await refused(spec, (req) => req.field('name', 'x').field('email', 'a@b.test'), [415]);
  });

  it('refuses JSON in a charset it cannot read, and deeply nested JSON, with a 4xx', async () => {
    await refused(spec, (req) => req.set('Content-Type', 'application/json; charset=klingon').send('{}'), [415]);
    const deep = '{"name":' + '['.repeat(5000) + ']'.repeat(5000) + '}';
    await refused(spec, (req) => req.set('Content-Type', 'application/json').send(deep), [400, 401, 404, 409, 410, 429]);
  });
});

describe('the upload route', () => {
  const spec = () => routeRegistry.get('POST /labs/:labId/uploads')!;
  it('is in the registry', () => expect(spec()).toBeDefined());

  it('refuses a JSON body without a file with a 400 naming what is missing', async () => {
    const res = await refused(spec(), (req) => req.send({ kind: 'time', recipeId: 'x' }), [400]);
    expect((res.body as { error: { message: string } }).error.message).toMatch(/file|kind|recipe/i);
  });

  it('refuses a file in the wrong form field and a text field with hostile values', async () => {
    await refused(spec(), (req) => req.attach('notTheFile', Buffer.from('a,b\n1,2\n'), 'x.csv'), [400]);
    const res = await refused(spec(), (req) => req.field('kind', "'; DROP TABLE uploads; --").attach('file', Buffer.from('time_s,input,output\n0,1,2\n'), '../../x.csv'), [400]);
    expect(JSON.stringify(res.body)).toMatch(/kind/);
  });
});
