/**
 * The permission table against the running API: every mounted /api/v1 route is registered with an
 * action, and every route is walked as anonymous, as each role of a lab, and as a member of another
 * lab — generated from the registry, so a route added later is walked too. Expected answers come
 * from the table itself (401 / 404 / 403 / allowed) and from the role rules of issue 4.
 */
import type { Router } from 'express';
import type { Role } from '@/shared/api/auth';
import type { AppDeps } from '@/server/deps';
import { createAuth } from '@/server/auth/lucia';
import { ACTIONS, can, PERMISSIONS, ROLES, routeRegistry, type RouteSpec } from '@/server/auth/permissions';
import { loadConfig } from '@/server/config';
import { createDb } from '@/server/db/knex';
import { createLogger } from '@/server/logger';
import { createMailer } from '@/server/mail/mailer';
import { v1Routes } from '@/server/routes';
import { createOtherLab, startTestServer, type TestServer } from './helpers';

// Build the v1 router once at load time (no I/O: Knex, Lucia and nodemailer connect lazily) so the
// registry is filled when the tests below are generated, and so its stack can be inspected.
const buildDb = createDb(':memory:');
const buildDeps = {
  config: loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent' }),
  db: buildDb,
  auth: createAuth(buildDb, { idleHours: 1, secure: false }),
  logger: createLogger('silent'),
  mailer: createMailer({ db: buildDb, logger: createLogger('silent') }, { host: '127.0.0.1', port: 9, secure: false }, 'x@example.test'),
  version: 'test',
} as AppDeps;
const v1 = v1Routes(buildDeps);

interface Layer {
  name: string;
  slash: boolean;
  rawPath?: string;
  handle: { stack?: Layer[] };
  route?: { path: string; methods: Record<string, boolean> };
}

/** Every (method, path) the router serves, with the prefixes of nested routers. */
function mountedRoutes(router: Router, prefix = ''): { method: string; path: string }[] {
  const out: { method: string; path: string }[] = [];
  for (const layer of (router as unknown as { stack: Layer[] }).stack) {
    if (layer.route) {
      for (const m of Object.keys(layer.route.methods)) if (m !== '_all') out.push({ method: m, path: prefix + layer.route.path });
    } else if (layer.handle.stack) {
      out.push(...mountedRoutes(layer.handle as unknown as Router, layer.slash ? prefix : prefix + (layer.rawPath ?? '?')));
    }
  }
  return out;
}

const mounted = mountedRoutes(v1);
const registered = [...routeRegistry.values()];
const labRoutes = registered.filter((r) => r.action !== 'public' && r.action !== 'signed-in');

describe('the route registry', () => {
  it('has routes (sanity: the walk below is not empty)', () => {
    expect(mounted.length).toBeGreaterThanOrEqual(17);
    expect(labRoutes.length).toBeGreaterThanOrEqual(11);
  });

  it.each(mounted.map((m) => [`${m.method.toUpperCase()} ${m.path}`, m]))('%s is mounted through labRoute/openRoute', (_name, m) => {
    expect(routeRegistry.get(`${m.method.toUpperCase()} ${m.path}`)).toBeDefined();
  });

  it('registers nothing that is not mounted', () => {
    const served = new Set(mounted.map((m) => `${m.method.toUpperCase()} ${m.path}`));
    expect(registered.map((r) => `${r.method.toUpperCase()} ${r.path}`).filter((k) => !served.has(k))).toEqual([]);
  });

  it('puts every lab route under /labs/:labId with a known action', () => {
    for (const r of labRoutes) {
      expect(r.path.startsWith('/labs/:labId')).toBe(true);
      expect(ACTIONS).toContain(r.action);
    }
  });
});

describe('the permission table follows the role rules of issue 4', () => {
  const actionsOf = (role: Role) => ACTIONS.filter((a) => can(role, a));
  const readOnly = (a: string) => a.endsWith('.read') || a === 'audit.export';

  it('auditor: read-only, including the audit trail', () => {
    expect(actionsOf('auditor').every(readOnly)).toBe(true);
    expect(actionsOf('auditor')).toEqual(expect.arrayContaining(['audit.read', 'audit.export', 'studies.read', 'recipes.read']));
  });
  it('admin: people, roles, lab settings; reads everything, builds nothing', () => {
    expect(actionsOf('admin')).toEqual(expect.arrayContaining(['members.invite', 'members.change-role', 'members.remove', 'lab.settings', 'audit.read']));
    expect(ACTIONS.filter((a) => a.endsWith('.read')).every((a) => can('admin', a))).toBe(true);
    expect(actionsOf('admin').some((a) => /\.(write|start|cancel)$/.test(a) || a === 'reviews.decide')).toBe(false);
  });
  it('analyst: builds and runs, manages no people, decides no reviews', () => {
    for (const a of ['systems.write', 'scenarios.write', 'recipes.write', 'studies.start', 'studies.cancel', 'uploads.write', 'reviews.submit'] as const) expect(can('analyst', a)).toBe(true);
    for (const a of ['members.invite', 'members.change-role', 'lab.settings', 'audit.read', 'reviews.decide'] as const) expect(can('analyst', a)).toBe(false);
  });
  it("reviewer: what an analyst reads, plus review decisions", () => {
    const analystReads = actionsOf('analyst').filter(readOnly);
    expect(actionsOf('reviewer').sort()).toEqual([...analystReads, 'reviews.decide'].sort());
  });
  it('names only the four roles', () => {
    for (const roles of Object.values(PERMISSIONS)) for (const r of roles) expect(ROLES).toContain(r);
  });
});

let t: TestServer;
let walkLabId: string;
const agents = {} as Record<Role | 'otherLab', Awaited<ReturnType<TestServer['signIn']>>>;

beforeAll(async () => {
  t = await startTestServer();
  const walkLab = await createOtherLab(t.db, 'Walk Bench Lab');
  walkLabId = walkLab.labId;
  for (const role of ROLES) agents[role] = await t.signIn(walkLab.emails[role]);
  agents.otherLab = await t.signIn('admin'); // admin of the demo lab, not a member of the walk lab
});
afterAll(async () => {
  await t.close();
  await buildDb.destroy();
});

const concrete = (spec: RouteSpec, labId: string) =>
  `/api/v1${spec.path.replace(':labId', labId).replace(/:[A-Za-z0-9_]+/g, 'walk-no-such-id')}`;

function send(agent: ReturnType<TestServer['agent']> | TestServer['http'], spec: RouteSpec, labId: string) {
  const req = agent[spec.method](concrete(spec, labId)).timeout(10_000);
  return spec.method === 'get' || spec.method === 'delete' ? req : req.send({});
}

describe.each(labRoutes.map((r) => [`${r.method.toUpperCase()} ${r.path} (${r.action})`, r] as const))('%s', (_name, spec) => {
  it('answers 401 without a session', async () => {
    const res = await send(t.http, spec, walkLabId);
    expect(res.status).toBe(401);
  });

  it('answers 404 to a member of another lab, the same as for a lab that does not exist', async () => {
    const res = await send(agents.otherLab, spec, walkLabId);
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: 'not_found', message: 'This lab was not found.' } });
    const missing = await send(agents.otherLab, spec, 'no-such-lab');
    expect(missing.body).toEqual(res.body);
  });

  it.each(ROLES.map((role) => [role, can(role, spec.action as (typeof ACTIONS)[number])] as const))(
    'as %s (allowed: %s)',
    async (role, allowed) => {
      const res = await send(agents[role], spec, walkLabId);
      if (allowed) {
        expect(res.status).not.toBe(401);
        expect(res.status).not.toBe(403);
        expect(res.status).not.toBe(500);
        expect(res.body?.error?.message).not.toBe('This lab was not found.');
      } else {
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      }
    },
  );
});

describe.each(registered.filter((r) => r.action === 'signed-in').map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s (signed-in)', (_n, spec) => {
  it('answers 401 without a session and not 401 with one', async () => {
    expect((await send(t.http, spec, walkLabId)).status).toBe(401);
    expect((await send(agents.auditor, spec, walkLabId)).status).not.toBe(401);
  });
});

describe.each(registered.filter((r) => r.action === 'public').map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s (public)', (_n, spec) => {
  it('is reachable without a session', async () => {
    const res = await send(t.http, spec, walkLabId);
    expect([401, 403, 500]).not.toContain(res.status);
  });
});
