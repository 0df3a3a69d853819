/**
 * Support for the property-based tests of bad input (tests/server/fuzz-*.test.ts): arbitraries
 * built from a route's zod schema (through its JSON Schema, z.toJSONSchema) that mix valid shapes
 * with hostile values, the error-shape checks every 4xx must pass, and a row count of every table
 * to prove that a refused request stored nothing.
 */
import fc from 'fast-check';
import { z } from 'zod';
import type { Role } from '@/shared/api/auth';
import { PERMISSIONS, type RouteSpec } from '@/server/auth/permissions';
import type { Db } from '@/server/db/knex';

type Json = Record<string, unknown>;

/** The fixed seed of every fuzz run (printed by the tests so a failure can be reproduced). */
export const FUZZ_SEED = Number(process.env.FUZZ_SEED ?? 20261201);

const LONG = 'x'.repeat(20_000);

/** Strings a hostile client would send into any text field. */
export const hostileStrings: string[] = [
  '', ' ', 'NaN', 'Infinity', '-Infinity', '1e309', '-0', '0x10', '1,5', '١٢٣',
  '../../etc/passwd', 'C:\\x', '%2e%2e/%2e%2e/secret', '/dev/null', '..\\..\\boot.ini',
  "'; DROP TABLE users; --", "' OR '1'='1", '<script>alert(1)</script>', '"><img src=x onerror=alert(1)>',
  '=HYPERLINK("http://x")', '+1+1', '@SUM(A1)', '\u202Eevil\u202C.csv', 'שלום عالم', '🧪📈🔧',
  'e\u0301\u0301\u0301', 'nul\u0000byte', '\uFEFFbom', '\r\n\r\n', '\uD800', LONG,
  '__proto__', 'constructor', '{"$gt":""}',
];

/** Numbers a hostile client would send into any numeric field (NaN/Infinity become null in JSON). */
export const hostileNumbers: number[] = [
  Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, 1e308, -1e308, 2 ** 53, 2 ** 31,
  1e9, 1 << 30, -1, 0, -0, 0.5, 5e-324, 1e-300,
];

/** Any hostile value: strings, numbers, wrong types. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...hostileStrings) },
  { weight: 3, arbitrary: fc.constantFrom(...hostileNumbers) },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(null, true, false, [], {}, [1, 2], { a: 1 }, ['x']) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
  { weight: 1, arbitrary: fc.double() },
);

/** A route schema as JSON Schema (input side), the form the arbitraries are built from. */
export function toJson(schema: z.ZodType): Json {
  return z.toJSONSchema(schema, { io: 'input', unrepresentable: 'any' }) as Json;
}

/**
 * An arbitrary of values for a JSON Schema: mostly valid shapes (right types, in range, enums,
 * required fields), each node replaced by a hostile value with some probability, required fields
 * sometimes missing and extra fields sometimes added.
 */
export function fromJsonSchema(schema: Json, root: Json = schema, depth = 0): fc.Arbitrary<unknown> {
  const valid = validOf(schema, root, depth);
  if (depth > 6) return valid;
  return fc.oneof({ weight: 6, arbitrary: valid }, { weight: 1, arbitrary: hostileValue });
}

function resolve(schema: Json, root: Json): Json {
  const ref = schema.$ref as string | undefined;
  if (!ref) return schema;
  const name = ref.replace(/^#\/(\$defs|definitions)\//, '');
  const defs = (root.$defs ?? root.definitions ?? {}) as Record<string, Json>;
  if (ref === '#') return root;
  return defs[name] ?? {};
}

function validOf(raw: Json, root: Json, depth: number): fc.Arbitrary<unknown> {
  if (raw === null || typeof raw !== 'object') return hostileValue; // boolean schemas (true/false)
  const schema = resolve(raw, root);
  if (Array.isArray(schema.prefixItems)) return fc.tuple(...(schema.prefixItems as Json[]).map((s) => fromJsonSchema(s, root, depth + 1)));
  if ('const' in schema) return fc.constant(schema.const);
  if (Array.isArray(schema.enum)) return fc.constantFrom(...(schema.enum as unknown[]));
  const branches = (schema.anyOf ?? schema.oneOf) as Json[] | undefined;
  if (branches?.length) return fc.oneof(...branches.map((b) => fromJsonSchema(b, root, depth + 1)));
  if (Array.isArray(schema.allOf) && schema.allOf.length) return validOf(schema.allOf[0] as Json, root, depth);
  const type = Array.isArray(schema.type) ? (schema.type[0] as string) : (schema.type as string | undefined);
  switch (type) {
    case 'object':
      return objectOf(schema, root, depth);
    case 'array': {
      const items = (schema.items ?? {}) as Json;
      const min = Number(schema.minItems ?? 0);
      const max = Math.max(min, Math.min(Number(schema.maxItems ?? 4), min + 3));
      return fc.array(fromJsonSchema(items, root, depth + 1), { minLength: Math.min(min, 4), maxLength: Math.min(max, 6) });
    }
    case 'string': {
      const min = Number(schema.minLength ?? 0);
      const max = Math.max(min, Math.min(Number(schema.maxLength ?? 40), 80));
      if (schema.format === 'email') return fc.oneof(fc.emailAddress(), fc.constant('not-an-email'));
      return fc.oneof(fc.string({ minLength: min, maxLength: max }), fc.string({ unit: 'grapheme', minLength: min, maxLength: max }));
    }
    case 'integer':
    case 'number': {
      const min = typeof schema.minimum === 'number' ? schema.minimum : typeof schema.exclusiveMinimum === 'number' ? schema.exclusiveMinimum : -1e6;
      const max = typeof schema.maximum === 'number' ? schema.maximum : typeof schema.exclusiveMaximum === 'number' ? schema.exclusiveMaximum : 1e6;
      return type === 'integer'
        ? fc.integer({ min: Math.max(Math.ceil(min), -(2 ** 31)), max: Math.min(Math.floor(max), 2 ** 31) })
        : fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
    }
    case 'boolean':
      return fc.boolean();
    case 'null':
      return fc.constant(null);
    default:
      return hostileValue;
  }
}

function objectOf(schema: Json, root: Json, depth: number): fc.Arbitrary<unknown> {
  const props = (schema.properties ?? {}) as Record<string, Json>;
  const required = new Set((schema.required ?? []) as string[]);
  const keys = Object.keys(props);
  const shape = Object.fromEntries(keys.map((k) => [k, fromJsonSchema(props[k]!, root, depth + 1)]));
  const base = fc.record(shape, { requiredKeys: keys.filter((k) => required.has(k)) }) as fc.Arbitrary<Record<string, unknown>>;
  return fc
    .tuple(base, fc.option(fc.constantFrom(...(keys.length ? keys : ['x'])), { freq: 4 }), fc.option(fc.constantFrom('extra', '__proto__', 'constructor', 'id', 'lab_id'), { freq: 6 }), hostileValue)
    .map(([obj, drop, extra, value]) => {
      const out = { ...obj };
      if (drop !== null) delete out[drop];
      if (extra !== null) Object.defineProperty(out, extra, { value, enumerable: true, writable: true, configurable: true });
      return out;
    });
}

/** Row counts of every table of the database (one query). */
export async function tableCounts(db: Db): Promise<Record<string, number>> {
  const tables: { name: string }[] = await db('sqlite_master').where({ type: 'table' }).whereNot('name', 'like', 'sqlite_%').whereNot('name', 'like', 'knex_%').select('name');
  const sql = tables.map((t) => `SELECT '${t.name}' AS name, COUNT(*) AS n FROM "${t.name}"`).join(' UNION ALL ');
  const rows: { name: string; n: number }[] = await db.raw(sql);
  return Object.fromEntries(rows.map((r) => [r.name, Number(r.n)]));
}

/** Tables that change for reasons other than the request's own data (sessions, mail sent later). */
export const VOLATILE_TABLES = new Set(['sessions', 'mail_outbox']);

/** What differs between two row counts, leaving out the given tables. */
export function countChanges(before: Record<string, number>, after: Record<string, number>, skip: Set<string>): string[] {
  return Object.keys({ ...before, ...after })
    .filter((t) => !skip.has(t) && before[t] !== after[t])
    .map((t) => `${t}: ${before[t]} → ${after[t]}`);
}

export interface ErrorAnswer {
  status: number;
  body: unknown;
}

/**
 * Problems with a refused answer: the shape { error: { code, message } }, and for a validation
 * failure (invalid_request) fields in details whose first path the message names.
 */
export function errorShapeProblems(res: ErrorAnswer): string[] {
  const problems: string[] = [];
  const error = (res.body as { error?: { code?: unknown; message?: unknown; details?: unknown } } | undefined)?.error;
  if (!error || typeof error.code !== 'string' || !error.code) return [`status ${res.status} without error.code: ${JSON.stringify(res.body)?.slice(0, 300)}`];
  if (typeof error.message !== 'string' || !error.message) problems.push(`error ${error.code} without a message`);
  if (error.code === 'invalid_request') {
    const fields = (error.details as { fields?: { path?: unknown; message?: unknown }[] } | undefined)?.fields;
    if (!Array.isArray(fields) || fields.length === 0) problems.push(`invalid_request without details.fields: ${JSON.stringify(error)}`);
    else {
      if (fields.some((f) => typeof f.path !== 'string' || typeof f.message !== 'string')) problems.push(`a field without path/message: ${JSON.stringify(fields)}`);
      const first = String(fields[0]!.path || 'body');
      if (!String(error.message).includes(first.split('.')[0]!)) problems.push(`message "${error.message}" does not name the field "${first}"`);
    }
  }
  return problems;
}

/**
 * Fills the route registry at load time (as tests/server/permissions.test.ts does) by building the
 * v1 router over an in-memory database; nothing connects. Close the returned database in afterAll.
 */
export function buildRegistry(): { destroy(): Promise<void> } {
  const { createAuth } = require('@/server/auth/lucia') as typeof import('@/server/auth/lucia');
  const { loadConfig } = require('@/server/config') as typeof import('@/server/config');
  const { createDb } = require('@/server/db/knex') as typeof import('@/server/db/knex');
  const { createLogger } = require('@/server/logger') as typeof import('@/server/logger');
  const { createMailer } = require('@/server/mail/mailer') as typeof import('@/server/mail/mailer');
  const { v1Routes } = require('@/server/routes') as typeof import('@/server/routes');
  const db = createDb(':memory:');
  v1Routes({
    config: loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent' }),
    db,
    auth: createAuth(db, { idleHours: 1, secure: false }),
    logger: createLogger('silent'),
    mailer: createMailer({ db, logger: createLogger('silent') }, { host: '127.0.0.1', port: 9, secure: false }, 'x@example.test'),
    version: 'test',
  } as import('@/server/deps').AppDeps);
  return { destroy: () => db.destroy() };
}

/** The role a route is called with: the first the permission table allows (public: none). */
export function roleFor(spec: RouteSpec): Role | null {
  if (spec.action === 'public') return null;
  if (spec.action === 'signed-in') return 'auditor';
  return (PERMISSIONS[spec.action] as readonly Role[])[0]!;
}

/**
 * A concrete path of a route: the lab, real ids where given (`ids.systems` for /systems/:id, …,
 * `ids.userId`), and ids that do not exist elsewhere.
 */
export function pathFor(spec: RouteSpec, labId: string, ids: Record<string, string>): string {
  const kind = /\/labs\/:labId\/(systems|scenarios|recipes)\/:id/.exec(spec.path)?.[1];
  return `/api/v1${spec.path
    .replace(':labId', labId)
    .replace(':userId', ids.userId ?? 'fuzz-no-such-user')
    .replace(':id', (kind && ids[kind]) || 'fuzz-no-such-id')
    .replace(/:[A-Za-z0-9_]+/g, 'fuzz-no-such-token')}`;
}
