/**
 * Versioned systems, scenarios and recipes over HTTP against a real SQLite file: create, update
 * (a new version each time, old ones readable), stale edits refused, validation errors that name
 * the field, list paging/sorting/filtering done by the server, roles, and isolation between labs.
 */
import { createOtherLab, startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { sdofSystem, smallRecipe, smallScenario } from './work-fixtures';
import type request from 'supertest';

let t: TestServer;
let analyst: request.Agent;
let lab: string;

beforeAll(async () => {
  t = await startTestServer();
  analyst = await t.signIn('analyst');
  lab = `/api/v1/labs/${t.labId}`;
}, 30_000);
afterAll(() => t.close());

describe('versions', () => {
  it('creates version 1, appends version 2 on update, keeps version 1 readable', async () => {
    const created = await analyst.post(`${lab}/systems`).send({ name: 'Bench SDOF', description: 'first', definition: sdofSystem }).expect(201);
    expect(created.body).toMatchObject({ name: 'Bench SDOF', latestVersion: 1, version: { version: 1 }, definition: sdofSystem });
    const id = created.body.id;

    const changed = { ...sdofSystem, dampingRatio: 0.05 };
    const updated = await analyst.put(`${lab}/systems/${id}`).send({ name: 'Bench SDOF', note: 'more damping', definition: changed, baseVersion: 1 }).expect(200);
    expect(updated.body).toMatchObject({ latestVersion: 2, version: { version: 2, note: 'more damping' }, definition: changed, description: 'first' });

    const latest = await analyst.get(`${lab}/systems/${id}`).expect(200);
    expect(latest.body.definition.dampingRatio).toBe(0.05);
    const v1 = await analyst.get(`${lab}/systems/${id}/versions/1`).expect(200);
    expect(v1.body.definition.dampingRatio).toBe(0.02);
    expect(v1.body.version.author.displayName).toBe('Tomas Lindqvist');
    const versions = await analyst.get(`${lab}/systems/${id}/versions`).expect(200);
    expect(versions.body.items.map((v: { version: number }) => v.version)).toEqual([2, 1]);
    await analyst.get(`${lab}/systems/${id}/versions/3`).expect(404);

    // What was stored: two immutable version rows, one head at version 2, and the audit events.
    const rows = await t.db('system_versions').where({ system_id: id }).orderBy('version');
    expect(rows.map((r) => JSON.parse(r.body).dampingRatio)).toEqual([0.02, 0.05]);
    expect((await t.db('systems').where({ id }).first()).latest_version).toBe(2);
    const audit = await t.db('audit_events').where({ target_id: id }).orderBy('id').select('action');
    expect(audit.map((a) => a.action)).toEqual(['systems.create', 'systems.update']);
  });

  it('refuses an edit that starts from an old version (409) and stores nothing', async () => {
    const { body } = await analyst.post(`${lab}/recipes`).send({ definition: smallRecipe('Conflict recipe') }).expect(201);
    await analyst.put(`${lab}/recipes/${body.id}`).send({ definition: { ...smallRecipe('Conflict recipe'), overlap: 0.25 }, baseVersion: 1 }).expect(200);
    const stale = await analyst.put(`${lab}/recipes/${body.id}`).send({ definition: { ...smallRecipe('Conflict recipe'), overlap: 0.75 }, baseVersion: 1 }).expect(409);
    expect(stale.body.error).toMatchObject({ code: 'version_conflict', details: { baseVersion: 1, latestVersion: 2 } });
    expect(await t.db('recipe_versions').where({ recipe_id: body.id }).count({ n: '*' }).first()).toEqual({ n: 2 });
  });

  it('takes the name from the definition when it has one (recipes, scenarios)', async () => {
    const r = await analyst.post(`${lab}/scenarios`).send({ definition: smallScenario('Named inside') }).expect(201);
    expect(r.body.name).toBe('Named inside');
    // The engine fills in defaults (errors: {} when absent); the stored body is that parsed form.
    const { errors: _e, ...withoutErrors } = smallScenario('Defaults filled');
    const d = await analyst.post(`${lab}/scenarios`).send({ definition: withoutErrors }).expect(201);
    expect(d.body.definition.errors).toEqual({});
  });

  it.each([
    ['systems', 'definition.dampingRatio', { name: 'x', definition: { ...sdofSystem, dampingRatio: 1.5 } }],
    ['systems', 'name', { definition: sdofSystem }],
    ['recipes', 'definition.overlap', { definition: { ...smallRecipe(), overlap: 1.2 } }],
    ['recipes', 'definition.frequencyResolutionHz', { definition: { ...smallRecipe(), frequencyResolutionHz: 2 } }],
    ['scenarios', 'definition.acquisition.durationS', { definition: { ...smallScenario(), acquisition: { sampleRateHz: 512 } } }],
    ['scenarios', 'definition.excitation.band.highHz', { definition: { ...smallScenario(), excitation: { kind: 'random', band: { lowHz: 0, highHz: 300 }, level: { rmsN: 1 } } } }],
  ])('%s: a bad body is a 400 naming %s, and nothing is stored', async (kind, field, body) => {
    const before = await t.db(kind).count({ n: '*' }).first();
    const res = await analyst.post(`${lab}/${kind}`).send(body).expect(400);
    expect(res.body.error.code).toBe('invalid_request');
    expect(res.body.error.details.fields.map((f: { path: string }) => f.path)).toContain(field);
    expect(await t.db(kind).count({ n: '*' }).first()).toEqual(before);
  });
});

describe('lists', () => {
  const names = ['Page test Delta', 'Page test alpha', 'Page test Echo', 'Page test Bravo', 'Page test charlie'];
  let ids: Record<string, string>;

  beforeAll(async () => {
    ids = {};
    for (const name of names) ids[name] = (await analyst.post(`${lab}/recipes`).send({ definition: smallRecipe(name) }).expect(201)).body.id;
    // Touch one so that it is the most recently updated.
    await analyst.put(`${lab}/recipes/${ids['Page test Bravo']}`).send({ definition: { ...smallRecipe('Page test Bravo'), overlap: 0 }, baseVersion: 1 }).expect(200);
  });

  const list = (query: string) => analyst.get(`${lab}/recipes?${query}`);

  it('pages, sorts by name case-insensitively and filters by part of the name', async () => {
    const first = await list('q=page%20TEST&sort=name&order=asc&limit=2&offset=0').expect(200);
    expect(first.body).toMatchObject({ total: 5, limit: 2, offset: 0 });
    expect(first.body.items.map((i: { name: string }) => i.name)).toEqual(['Page test alpha', 'Page test Bravo']);
    const last = await list('q=page%20test&sort=name&order=asc&limit=2&offset=4').expect(200);
    expect(last.body.items.map((i: { name: string }) => i.name)).toEqual(['Page test Echo']);
    const desc = await list('q=Page%20test&sort=name&order=desc&limit=3').expect(200);
    expect(desc.body.items.map((i: { name: string }) => i.name)).toEqual(['Page test Echo', 'Page test Delta', 'Page test charlie']);
  });

  it('sorts by last change', async () => {
    const res = await list('q=Page%20test&sort=updatedAt&order=desc&limit=1').expect(200);
    expect(res.body.items[0]).toMatchObject({ name: 'Page test Bravo', latestVersion: 2 });
  });

  it('takes % and _ in the filter literally', async () => {
    await analyst.post(`${lab}/recipes`).send({ definition: smallRecipe('Rate 100% check') }).expect(201);
    const res = await list('q=100%25').expect(200);
    expect(res.body.items.map((i: { name: string }) => i.name)).toEqual(['Rate 100% check']);
    expect((await list('q=_').expect(200)).body.total).toBe(0);
  });

  it.each(['sort=colour', 'order=up', 'limit=0', 'limit=500', 'offset=-1'])('refuses %s with a 400', async (q) => {
    const res = await list(q).expect(400);
    expect(res.body.error.code).toBe('invalid_request');
  });
});

describe('roles and labs', () => {
  let systemId: string;
  let scenarioId: string;
  let recipeId: string;
  let other: { labId: string; emails: Record<string, string> };

  beforeAll(async () => {
    systemId = (await analyst.post(`${lab}/systems`).send({ name: 'Isolated', definition: sdofSystem }).expect(201)).body.id;
    scenarioId = (await analyst.post(`${lab}/scenarios`).send({ definition: smallScenario('Isolated scenario') }).expect(201)).body.id;
    recipeId = (await analyst.post(`${lab}/recipes`).send({ definition: smallRecipe('Isolated recipe') }).expect(201)).body.id;
    other = await createOtherLab(t.db);
  });

  it('lets reviewers and auditors read but not write', async () => {
    for (const role of ['reviewer', 'auditor'] as const) {
      const a = await t.signIn(role);
      await a.get(`${lab}/systems/${systemId}`).expect(200);
      await a.post(`${lab}/systems`).send({ name: 'nope', definition: sdofSystem }).expect(403);
      await a.put(`${lab}/recipes/${recipeId}`).send({ definition: smallRecipe(), baseVersion: 1 }).expect(403);
    }
  });

  it("hides one lab's resources from another lab's members", async () => {
    const outsider = await t.signIn(other.emails.analyst, TEST_PASSWORD);
    const otherLab = `/api/v1/labs/${other.labId}`;
    // Through the resource's own lab: the outsider is no member, so the lab itself is not found.
    await outsider.get(`${lab}/systems/${systemId}`).expect(404);
    await outsider.get(`${lab}/systems`).expect(404);
    // Through the outsider's own lab: the id belongs to another lab, so it is not found either.
    for (const [kind, id] of [['systems', systemId], ['scenarios', scenarioId], ['recipes', recipeId]]) {
      await outsider.get(`${otherLab}/${kind}/${id}`).expect(404);
      await outsider.get(`${otherLab}/${kind}/${id}/versions`).expect(404);
      await outsider.get(`${otherLab}/${kind}/${id}/versions/1`).expect(404);
      await outsider.put(`${otherLab}/${kind}/${id}`).send({ name: 'taken', definition: kind === 'systems' ? sdofSystem : kind === 'recipes' ? smallRecipe() : smallScenario(), baseVersion: 1 }).expect(404);
    }
    const own = await outsider.get(`${otherLab}/systems`).expect(200);
    expect(own.body.total).toBe(0);
    expect((await t.db('systems').where({ id: systemId }).first()).latest_version).toBe(1);
  });
});
