/**
 * Property-based bad input over every request schema of the route registry: bodies and queries
 * generated from each route's own zod schema (valid shapes mixed with hostile values: NaN/Infinity,
 * huge and negative numbers, enormous block lengths, unicode, path tricks, SQL and script text,
 * long strings, wrong types, missing and extra fields), sent over HTTP by a signed-in user whose
 * role the permission table allows. Every answer: no 5xx; every 4xx is { error: { code, message } }
 * and a validation failure names its field; a refused request stores nothing (row counts of every
 * table unchanged, audit rows only for audited refusals, never for a 400); the audit chain verifies.
 * The seed is fixed and printed (FUZZ_SEED=... to change it).
 */
import fc from 'fast-check';
import type { Role } from '@/shared/api/auth';
import { hashPassword } from '@/server/auth/password';
import { uploadFieldsSchema } from '@/shared/api/work';
import { routeRegistry, type RouteSpec } from '@/server/auth/permissions';
import { addMembership, insertUser } from '@/server/db/users';
import { buildRegistry, countChanges, errorShapeProblems, FUZZ_SEED, fromJsonSchema, hostileStrings, pathFor, roleFor, tableCounts, toJson, VOLATILE_TABLES } from './fuzz-support';
import { startTestServer, type TestServer } from './helpers';

const registry = buildRegistry();
const RUNS_PER_ROUTE = Number(process.env.FUZZ_RUNS ?? 40);

let t: TestServer;
const agents = {} as Record<Role, Awaited<ReturnType<TestServer['signIn']>>>;
const ids: Record<string, string> = {};
let cases = 0;

beforeAll(async () => {
  t = await startTestServer();
  for (const role of ['admin', 'analyst', 'reviewer', 'auditor'] as Role[]) agents[role] = await t.signIn(role);
  // Real ids so that valid-shaped bodies reach the services, not only the 404 of a missing item.
  for (const kind of ['systems', 'scenarios', 'recipes'] as const) {
    const list = await agents.analyst.get(`/api/v1/labs/${t.labId}/${kind}`).expect(200);
    ids[kind] = list.body.items[0]?.id ?? 'none';
  }
  // A member whose role the fuzzing may change, so the signed-in agents keep theirs.
  const userId = await insertUser(t.db, { email: 'fuzz-target@harborridge.test', displayName: 'Fuzz Target', passwordHash: await hashPassword('fuzz-target-password-1') });
  await addMembership(t.db, { labId: t.labId, userId, role: 'analyst' });
  ids.userId = userId;
  console.log(`fuzz-routes: seed ${FUZZ_SEED}, ${RUNS_PER_ROUTE} runs per schema`);
});
afterAll(async () => {
  await t?.close();
  await registry.destroy();
});

function agentFor(spec: RouteSpec) {
  const role = roleFor(spec);
  return role ? agents[role] : t.http;
}

const withSchemas = [...routeRegistry.values()].filter((r) => r.body || r.query);

describe('every request schema under generated bad input', () => {
  it('covers the registry (sanity: the walk below is not empty)', () => {
    expect(withSchemas.length).toBeGreaterThanOrEqual(15);
  });

  it.each(withSchemas.map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s', async (_name, spec) => {
    const part = spec.body ? 'body' : 'query';
    const arbitrary = fromJsonSchema(toJson((spec.body ?? spec.query)!));
    await fc.assert(
      fc.asyncProperty(arbitrary, async (value) => {
        cases++;
        const before = await tableCounts(t.db);
        const req = agentFor(spec)[spec.method](pathFor(spec, t.labId, ids)).timeout(15_000);
        let res;
        if (part === 'body') {
          const text = JSON.stringify(value) ?? 'null';
          res = await req.set('Content-Type', 'application/json').send(text);
        } else {
          const q = value && typeof value === 'object' && !Array.isArray(value) ? (value as object) : { q: String(value) };
          res = await req.query(q as Record<string, string>);
        }
        const after = await tableCounts(t.db);
        expect(res.status).toBeLessThan(500);
        // Node's HTTP parser answers 431 (no body) to a request line over its 16 KB header limit,
        // before the app sees it: a refusal by the platform, with nothing stored.
        if (res.status === 431) expect(part).toBe('query');
        else if (res.status >= 400) expect(errorShapeProblems(res)).toEqual([]);
        if (res.status >= 400) {
          // Audited refusals (a wrong signature password, a lockout) may add audit rows; a 400 may not.
          const skip = new Set([...VOLATILE_TABLES, ...(res.status === 400 ? [] : ['audit_events'])]);
          expect(countChanges(before, after, skip)).toEqual([]);
        }
      }),
      // Exports simulate the demo scenario's 131,072 samples for every valid query (1-6 s each on
      // this machine): a few runs keep the file near a minute; the other schemas share the rest.
      { numRuns: spec.action === 'exports.read' ? 6 : RUNS_PER_ROUTE, seed: FUZZ_SEED, endOnFailure: true },
    );
  }, 60_000);

  // The upload route takes a multipart form (no JSON body schema in the registry): its text fields
  // come from uploadFieldsSchema, the file name and content are hostile too.
  it('POST /labs/:labId/uploads (multipart form fields, file names and contents)', async () => {
    const fields = fromJsonSchema(toJson(uploadFieldsSchema));
    const fileName = fc.oneof(fc.constantFrom('record.csv', ...hostileStrings.map((h) => `${h.slice(0, 100)}.csv`)), fc.string({ unit: 'binary', maxLength: 30 }));
    const content = fc.oneof(
      fc.constant('time_s,input,output\n' + Array.from({ length: 64 }, (_v, i) => `${i / 64},${Math.sin(i)},${2 * Math.sin(i)}`).join('\n')),
      fc.string({ maxLength: 300 }),
      fc.constantFrom('', '\uFEFF', 'a,b\n1', '"unclosed\n1,2', 'f_hz,re,im\n1,NaN,0\n'),
    );
    await fc.assert(
      fc.asyncProperty(fields, fileName, content, async (value, name, text) => {
        cases++;
        const before = await tableCounts(t.db);
        const req = agents.analyst.post(`/api/v1/labs/${t.labId}/uploads`).timeout(15_000);
        if (value && typeof value === 'object' && !Array.isArray(value)) {
          for (const [k, v] of Object.entries(value)) req.field(k, typeof v === 'string' ? v : JSON.stringify(v) ?? '');
        }
        const res = await req.attach('file', Buffer.from(text), name || 'x');
        const after = await tableCounts(t.db);
        expect(res.status).toBeLessThan(500);
        if (res.status >= 400) {
          expect(errorShapeProblems(res)).toEqual([]);
          expect(countChanges(before, after, new Set([...VOLATILE_TABLES, ...(res.status === 400 ? [] : ['audit_events'])]))).toEqual([]);
        }
      }),
      { numRuns: RUNS_PER_ROUTE, seed: FUZZ_SEED, endOnFailure: true },
    );
  }, 60_000);

  it(`ran at least 1,000 cases and the audit chain still verifies`, async () => {
    expect(cases).toBeGreaterThanOrEqual(1000);
    const res = await agents.admin.get(`/api/v1/labs/${t.labId}/audit/verify`).expect(200);
    expect(res.body.ok).toBe(true);
    expect(res.body.firstBroken).toBeNull();
    expect(res.body.checked).toBeGreaterThan(0);
  });
});
