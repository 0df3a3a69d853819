/**
 * Studies over HTTP against a real SQLite file and the real worker pool: start (202 at once),
 * progress as server-sent events, runs stored one by one, results with criteria and curves,
 * mail to the author, a study whose runs fail, cancellation, and isolation between labs.
 */
import { parseRecipe } from '@/shared/engine/recipe';
import { runStudy } from '@/shared/engine/study';
import { createOtherLab, startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { parseEvents, periodicRecipe, periodicScenario, sessionCookie, smallRecipe, smallScenario, waitForStudy } from './work-fixtures';
import type request from 'supertest';

let t: TestServer;
let analyst: request.Agent;
let lab: string;
const ids: Record<string, string> = {};

beforeAll(async () => {
  t = await startTestServer();
  analyst = await t.signIn('analyst');
  lab = `/api/v1/labs/${t.labId}`;
  const post = async (kind: string, definition: unknown) => (await analyst.post(`${lab}/${kind}`).send({ definition }).expect(201)).body.id as string;
  ids.periodic = await post('scenarios', periodicScenario());
  ids.noisy = await post('scenarios', smallScenario());
  ids.exactRecipe = await post('recipes', periodicRecipe());
  ids.hannRecipe = await post('recipes', smallRecipe());
  // A softening cubic spring this strong makes the response diverge: the pre-flight check cannot
  // see it (it depends on the simulated level), so every run fails.
  ids.diverging = await post('scenarios', { ...smallScenario('Softening spring that diverges'), errors: { cubicStiffness: { k3NPerM3: -1e14 } } });
}, 30_000);
afterAll(() => t.close());

const start = (body: Record<string, unknown>, agent = analyst) => agent.post(`${lab}/studies`).send({ seeds: 3, ...body });

describe('a study from start to finished', () => {
  let studyId: string;
  let events: { event: string; data: Record<string, unknown> }[];

  beforeAll(async () => {
    const cookie = await sessionCookie(t.url, 'analyst@harborridge.test', TEST_PASSWORD);
    const res = await start({ name: 'Whole periods and noise', recipe: { id: ids.exactRecipe }, scenarios: [{ id: ids.periodic }, { id: ids.noisy }] }).expect(202);
    studyId = res.body.id;
    expect(res.body).toMatchObject({ status: 'queued', progress: { done: 0, total: 6 }, seeds: 3, baseSeed: 1 });
    // The stream ends by itself after its `end` event.
    const stream = await fetch(`${t.url}${lab}/studies/${studyId}/events`, { headers: { cookie } });
    expect(stream.headers.get('content-type')).toMatch(/^text\/event-stream/);
    events = parseEvents(await stream.text());
  }, 60_000);

  it('pushes progress events and one final end event', async () => {
    const last = events[events.length - 1];
    expect(last.event).toBe('end');
    expect(last.data).toMatchObject({ type: 'end', progress: { status: 'finished', done: 6, failed: 0, total: 6, etaSeconds: null }, error: null });
    const done = events.filter((e) => e.event === 'progress').map((e) => (e.data.progress as { done: number }).done);
    expect(done.length).toBeGreaterThan(0);
    expect([...done].sort((a, b) => a - b)).toEqual(done); // never goes back
    expect(events.filter((e) => e.event === 'end')).toHaveLength(1);
  });

  it('stores every run in order with the seeds of the documented rule', async () => {
    const study = await analyst.get(`${lab}/studies/${studyId}`).expect(200);
    expect(study.body).toMatchObject({ status: 'finished', progress: { done: 6, total: 6, currentScenario: null }, error: null });
    expect(study.body.startedAt).toBeGreaterThanOrEqual(study.body.createdAt);
    expect(study.body.finishedAt).toBeGreaterThanOrEqual(study.body.startedAt);
    const runs = await analyst.get(`${lab}/studies/${studyId}/runs`).expect(200);
    // seed = baseSeed + scenarioIndex·1 000 000 + run (the engine's rule, shared/engine/study.ts)
    expect(runs.body.items.map((r: { position: number; seedIndex: number; seed: number; status: string }) => [r.position, r.seedIndex, r.seed, r.status])).toEqual([
      [0, 0, 1, 'finished'], [0, 1, 2, 'finished'], [0, 2, 3, 'finished'],
      [1, 0, 1_000_001, 'finished'], [1, 1, 1_000_002, 'finished'], [1, 2, 1_000_003, 'finished'],
    ]);
    expect(runs.body.items[0].summary).toMatchObject({ reference: 'linear-frf', blocks: 16 });
    const job = await t.db('jobs').whereRaw("json_extract(payload, '$.studyId') = ?", [studyId]).first();
    expect(job).toMatchObject({ status: 'done', attempts: 1 });
  });

  it('gives H1 equal to the exact FRF on whole periods (no leakage, no noise)', async () => {
    const res = await analyst.get(`${lab}/studies/${studyId}/results`).expect(200);
    const periodic = res.body.scenarios[0];
    expect(periodic).toMatchObject({ scenarioId: ids.periodic, seeds: 3, failedRuns: 0, pass: true, reference: 'linear-frf' });
    // Lines 10…150 Hz at fs/N = 2 Hz: 71 lines.
    expect(periodic.curves.frequenciesHz).toHaveLength(71);
    expect(periodic.curves.frequenciesHz[0]).toBe(10);
    // Analytic truth (see periodicScenario): |error| is rounding only, and γ² = 1.
    expect(Math.max(...periodic.curves.p95AbsMagnitudeDb)).toBeLessThan(1e-9);
    expect(Math.max(...periodic.curves.p95AbsPhaseDeg)).toBeLessThan(1e-7);
    expect(Math.min(...periodic.curves.meanCoherence)).toBeGreaterThan(1 - 1e-12);
    expect(periodic.criteria.map((c: { id: string; pass: boolean }) => [c.id, c.pass])).toEqual([
      ['magnitude-bias', true], ['magnitude-p95', true], ['phase-p95', true],
    ]);
  });

  it('answers exactly what the engine computes for the same study in one process', async () => {
    const res = await analyst.get(`${lab}/studies/${studyId}/results`).expect(200);
    const direct = runStudy({ recipe: parseRecipe(periodicRecipe()), scenarios: [periodicScenario(), smallScenario()], seeds: 3, baseSeed: 1 });
    const json = (v: unknown) => JSON.parse(JSON.stringify(v));
    direct.results.forEach((r, j) => {
      const served = res.body.scenarios[j];
      expect(served.criteria).toEqual(json(r.judged.criteria));
      for (const [name, values] of Object.entries(r.judged.aggregate)) {
        if (values instanceof Float64Array) expect(served.curves[name]).toEqual(json(Array.from(values, (v) => (Number.isFinite(v) ? v : null))));
      }
    });
    expect(res.body.pass).toBe(direct.pass);
  });

  it('mails the author and writes the audit trail', async () => {
    const mail = await t.waitForMail('analyst@harborridge.test', (m) => m.subject === 'Study finished: Whole periods and noise');
    expect(mail.text).toContain('6 runs');
    const actions = await t.db('audit_events').where({ target_id: studyId }).orderBy('id').pluck('action');
    expect(actions).toEqual(['studies.start', 'studies.finish']);
  });
});

describe('a study whose runs fail', () => {
  it('records each run error, ends as failed, says which runs, and mails the author', async () => {
    const res = await start({ name: 'A diverging spring', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.diverging }], seeds: 2 }).expect(202);
    const study = await waitForStudy(analyst, `${lab}/studies/${res.body.id}`);
    expect(study).toMatchObject({ status: 'failed', progress: { done: 2, failed: 2, total: 2 }, pass: false });
    expect(study.error).toMatch(/2 run problem\(s\): "Softening spring that diverges" seed 1 \(run 1\): errors.cubicStiffness.k3NPerM3/);
    const runs = await analyst.get(`${lab}/studies/${res.body.id}/runs`).expect(200);
    expect(runs.body.items.map((r: { status: string }) => r.status)).toEqual(['failed', 'failed']);
    expect(runs.body.items[0].error).toMatch(/makes the response diverge at this level/);
    const results = await analyst.get(`${lab}/studies/${res.body.id}/results`).expect(200);
    expect(results.body.scenarios[0]).toMatchObject({ seeds: 0, failedRuns: 2, pass: false, criteria: [] });
    await t.waitForMail('analyst@harborridge.test', (m) => m.subject === 'Study failed: A diverging spring');
  }, 60_000);
});

describe('a study that cannot be completed', () => {
  it('ends as failed with the reason instead of staying "running" (a stored run that cannot be read)', async () => {
    const res = await start({ name: 'Damaged run', recipe: { id: ids.exactRecipe }, scenarios: [{ id: ids.periodic }], seeds: 2 }).expect(202);
    const url = `${lab}/studies/${res.body.id}`;
    expect((await waitForStudy(analyst, url)).status).toBe('finished');
    const jobOf = () => t.db('jobs').whereRaw("json_extract(payload, '$.studyId') = ?", [res.body.id]);
    while ((await jobOf().first()).status !== 'done') await new Promise((r) => setTimeout(r, 10));
    // Damage one stored run and put the study back in the queue, as a half-finished one would be.
    await t.db('runs').where({ study_id: res.body.id, seed_index: 1 }).update({ line_scores: Buffer.from('not a packed run') });
    await t.db('studies').where({ id: res.body.id }).update({ status: 'running', finished_at: null });
    await jobOf().update({ status: 'queued' });
    t.running.studies.enqueue(res.body.id);
    const ended = await waitForStudy(analyst, url);
    expect(ended.status).toBe('failed');
    expect(ended.error).toMatch(/^The study could not be completed: /);
    expect((await jobOf().first()).status).toBe('failed');
  }, 60_000);
});

describe('cancellation', () => {
  it('stops scheduling runs of a running study and ends it as cancelled', async () => {
    const res = await start({ name: 'Long one', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.noisy }], seeds: 400 }).expect(202);
    const url = `${lab}/studies/${res.body.id}`;
    const stored = () => t.db('runs').where({ study_id: res.body.id }).count({ n: '*' }).first().then((r) => Number(r?.n));
    while ((await stored()) < 1) await new Promise((r) => setTimeout(r, 10));
    // Reads are served while the pool works (the runs run off the event loop).
    await analyst.get(`${lab}/systems`).expect(200);
    expect((await analyst.get(url).expect(200)).body.status).toBe('running');

    const cancelled = await analyst.post(`${url}/cancel`).expect(202);
    expect(['running', 'cancelled']).toContain(cancelled.body.status);
    const ended = await waitForStudy(analyst, url);
    expect(ended.status).toBe('cancelled');
    const atEnd = await stored();
    expect(atEnd).toBeLessThan(400);
    // Nothing more is stored after the end: once the scheduler has no work left (every run that was
    // in flight has come back and been handled), the count is still the one at the end.
    await t.running.studies.idle();
    expect(await stored()).toBe(atEnd);
    expect((await analyst.post(`${url}/cancel`).expect(409)).body.error.code).toBe('study_ended');
    expect((await analyst.get(`${url}/results`).expect(409)).body.error.code).toBe('study_not_finished');
    const job = await t.db('jobs').whereRaw("json_extract(payload, '$.studyId') = ?", [res.body.id]).first();
    expect(job.status).toBe('cancelled');
    const actions = await t.db('audit_events').where({ target_id: res.body.id }).orderBy('id').pluck('action');
    expect(actions).toEqual(['studies.start', 'studies.cancel']);
  }, 60_000);

  it('ends a queued study at once', async () => {
    const first = await start({ name: 'Blocking', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.noisy }], seeds: 400 }).expect(202);
    const queued = await start({ name: 'Behind it', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.noisy }], seeds: 5 }).expect(202);
    const res = await analyst.post(`${lab}/studies/${queued.body.id}/cancel`).expect(202);
    expect(res.body).toMatchObject({ status: 'cancelled', progress: { done: 0 } });
    expect(await t.db('runs').where({ study_id: queued.body.id }).count({ n: '*' }).first()).toEqual({ n: 0 });
    await analyst.post(`${lab}/studies/${first.body.id}/cancel`).expect(202);
    expect((await waitForStudy(analyst, `${lab}/studies/${first.body.id}`)).status).toBe('cancelled');
    expect((await analyst.get(`${lab}/studies/${queued.body.id}`)).body.status).toBe('cancelled');
  }, 60_000);
});

describe('the list of studies', () => {
  it('filters by status and name, sorts and pages on the server', async () => {
    const finished = await analyst.get(`${lab}/studies?status=finished&sort=createdAt&order=asc`).expect(200);
    expect(finished.body.items.length).toBeGreaterThan(0);
    expect(finished.body.items.every((s: { status: string }) => s.status === 'finished')).toBe(true);
    const times = finished.body.items.map((s: { createdAt: number }) => s.createdAt);
    expect([...times].sort((a, b) => a - b)).toEqual(times);
    const named = await analyst.get(`${lab}/studies?q=periods%20and&limit=1`).expect(200);
    expect(named.body).toMatchObject({ total: 1, limit: 1, items: [{ name: 'Whole periods and noise', status: 'finished', pass: expect.any(Boolean) }] });
    const page = await analyst.get(`${lab}/studies?sort=name&order=desc&limit=2&offset=1`).expect(200);
    expect(page.body.items).toHaveLength(2);
    await analyst.get(`${lab}/studies?status=sleeping`).expect(400);
  });
});

describe('requests that are refused', () => {
  it.each([
    ['an unknown recipe', () => ({ name: 'x', recipe: { id: 'nope' }, scenarios: [{ id: ids.noisy }] }), 404],
    ['an unknown scenario version', () => ({ name: 'x', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.noisy, version: 9 }] }), 404],
    ['a scenario twice', () => ({ name: 'x', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.noisy }, { id: ids.noisy }] }), 400],
    ['no seeds', () => ({ name: 'x', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.noisy }], seeds: 0 }), 400],
    ['more than 5000 runs', () => ({ name: 'x', recipe: { id: ids.hannRecipe }, scenarios: 'abcdef'.split('').map((id) => ({ id })), seeds: 1000 }), 400],
  ])('%s', async (_what, body, status) => {
    const before = await t.db('studies').count({ n: '*' }).first();
    const res = await start(body());
    expect(res.status).toBe(status);
    expect(await t.db('studies').count({ n: '*' }).first()).toEqual(before);
  }, 60_000);

  it('lets only analysts start and cancel, and hides studies from other labs', async () => {
    const done = await start({ name: 'Short', recipe: { id: ids.exactRecipe }, scenarios: [{ id: ids.periodic }], seeds: 1 }).expect(202);
    await waitForStudy(analyst, `${lab}/studies/${done.body.id}`);
    for (const role of ['reviewer', 'auditor', 'admin'] as const) {
      const a = await t.signIn(role);
      await start({ name: 'x', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.noisy }] }, a).expect(403);
      await a.get(`${lab}/studies/${done.body.id}/results`).expect(200);
    }
    const other = await createOtherLab(t.db, 'Cinder Flats Test Lab');
    const outsider = await t.signIn(other.emails.analyst, TEST_PASSWORD);
    const otherLab = `/api/v1/labs/${other.labId}`;
    for (const path of ['', '/runs', '/results', '/events']) await outsider.get(`${otherLab}/studies/${done.body.id}${path}`).expect(404);
    await outsider.post(`${otherLab}/studies/${done.body.id}/cancel`).expect(404);
    // Another lab's recipe and scenario cannot be used from one's own lab either.
    await outsider.post(`${otherLab}/studies`).send({ name: 'x', recipe: { id: ids.hannRecipe }, scenarios: [{ id: ids.noisy }], seeds: 1 }).expect(404);
    expect((await outsider.get(`${otherLab}/studies`).expect(200)).body.total).toBe(0);
  }, 60_000);
});
