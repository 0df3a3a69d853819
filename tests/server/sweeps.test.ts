/**
 * Sweep studies over HTTP: a bad grid is refused in plain words; a sweep runs on the job pool,
 * stores every run, and when the server is stopped mid-sweep a new server on the same data resumes
 * it without redoing stored runs and ends with exactly the numbers of the same sweep run straight
 * through. Measurement times are hand-computed: n blocks of N samples at 50 % overlap and 512 Hz
 * need (n − 1)·0.5·N/512 + N/512 s (Welch's segmentation, P. D. Welch, IEEE Trans. Audio
 * Electroacoust. AU-15(2), 1967); with every block of a 32 s record (16384 samples) that is 31
 * blocks of 1024 samples or 63 of 512, both 32 s.
 */
import fs from 'node:fs';
import { createDb } from '@/server/db/knex';
import { startTestServer, type TestServer } from './helpers';
import { smallRecipe, smallScenario, waitForStudy } from './work-fixtures';

const SEEDS = 4;
const POINTS = 3;
const TOTAL = POINTS * SEEDS;

let first: TestServer;
let second: TestServer;
let dataDir: string;

afterAll(async () => {
  await second?.close();
  if (first) await first.running.close();
  if (dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
});

it('refuses a bad grid, then runs, stores and resumes a sweep to the same numbers', async () => {
  first = await startTestServer({ STUDY_WORKERS: '1' });
  dataDir = first.config.dataDir;
  const analyst = await first.signIn('analyst');
  const lab = `/api/v1/labs/${first.labId}`;
  const scenario = (await analyst.post(`${lab}/scenarios`).send({ definition: { ...smallScenario('Sweep SDOF', 20), acquisition: { sampleRateHz: 512, durationS: 32 } } }).expect(201)).body.id;
  const recipe = (await analyst.post(`${lab}/recipes`).send({ definition: { ...smallRecipe('Sweep base'), averages: 'all' } }).expect(201)).body.id;

  const bad = await analyst.post(`${lab}/sweeps`).send({ name: 'Bad', recipe: { id: recipe }, scenario: { id: scenario }, vary: [{ setting: 'blockLength', values: [1000] }], seeds: 2 }).expect(422);
  expect(bad.body.error.message).toBe('This sweep cannot run: grid point blockLength=1000 cannot be processed: blockLength=1000 must be a power of two in [4, 16777216]');
  await analyst.post(`${lab}/sweeps`).send({ name: 'Too big', recipe: { id: recipe }, scenario: { id: scenario }, vary: [{ setting: 'blockLength', values: [256] }], seeds: 5001 }).expect(400);
  const reviewer = await first.signIn('reviewer');
  await reviewer.post(`${lab}/sweeps`).send({ name: 'Not mine to run', recipe: { id: recipe }, scenario: { id: scenario }, vary: [{ setting: 'blockLength', values: [256] }], seeds: 1 }).expect(403);

  const body = { recipe: { id: recipe }, scenario: { id: scenario }, vary: [{ setting: 'blockLength', values: [1024, 512, 256] }], seeds: SEEDS, baseSeed: 11 };
  const interrupted = (await analyst.post(`${lab}/sweeps`).send({ name: 'Interrupted', ...body }).expect(202)).body;
  expect(interrupted).toMatchObject({ status: 'queued', points: POINTS, progress: { total: TOTAL } });
  for (;;) {
    const row = await first.db('sweep_runs').where({ sweep_id: interrupted.id }).count({ n: '*' }).first();
    if (Number(row?.n) >= 2) break;
    await new Promise((r) => setTimeout(r, 5));
  }
  await first.running.close();

  const disk = createDb(first.config.databaseFile);
  const left = await disk('sweep_runs').where({ sweep_id: interrupted.id }).orderBy('id').select('id', 'point', 'seed_index', 'started_at', 'result');
  const atCrash = await disk('sweeps').where({ id: interrupted.id }).first();
  await disk.destroy();
  expect(left.length).toBeGreaterThanOrEqual(2);
  expect(left.length).toBeLessThan(TOTAL);
  expect(atCrash).toMatchObject({ status: 'running', runs_done: left.length });

  second = await startTestServer({ DATA_DIR: dataDir, STUDY_WORKERS: '2' });
  const analyst2 = await second.signIn('analyst');
  const resumed = await waitForStudy(analyst2, `${lab}/sweeps/${interrupted.id}`);
  expect(resumed).toMatchObject({ status: 'finished', progress: { done: TOTAL, failed: 0, total: TOTAL } });
  const after = await second.db('sweep_runs').where({ sweep_id: interrupted.id }).orderBy('id').select('id', 'point', 'seed_index', 'started_at', 'result');
  expect(after).toHaveLength(TOTAL);
  expect(after.slice(0, left.length)).toEqual(left);

  const straight = (await analyst2.post(`${lab}/sweeps`).send({ name: 'Straight through', ...body }).expect(202)).body.id;
  expect((await waitForStudy(analyst2, `${lab}/sweeps/${straight}`)).status).toBe('finished');
  const results = async (id: string) => {
    const { body: r } = await analyst2.get(`${lab}/sweeps/${id}/results`).expect(200);
    return { ...r, sweepId: null };
  };
  const a = await results(interrupted.id);
  expect(a).toEqual(await results(straight));
  const blobs = async (id: string) =>
    (await second.db('sweep_runs').where({ sweep_id: id }).orderBy([{ column: 'point' }, { column: 'seed_index' }]).select('point', 'seed', 'result')).map((r) => [r.point, r.seed, (r.result as Buffer).toString('base64')]);
  expect(await blobs(interrupted.id)).toEqual(await blobs(straight));
  const summary = async (id: string) => (await second.db('sweeps').where({ id }).first()).summary;
  expect(await summary(interrupted.id)).toBe(await summary(straight));

  // What the results say, against the hand-computed times and the seed rule.
  expect(a.seeds).toEqual([11, 12, 13, 14]);
  expect(a.points.map((p: { blockLength: number }) => p.blockLength)).toEqual([1024, 512, 256]);
  expect(a.points.map((p: { averages: number }) => p.averages)).toEqual([31, 63, 127]);
  expect(a.points.map((p: { measurementTimeS: number }) => p.measurementTimeS)).toEqual([32, 32, 32]);
  for (const p of a.points) {
    expect(p.ran).toBe(true);
    expect(p.criteria.map((c: { id: string }) => c.id)).toEqual(['magnitude-bias', 'magnitude-p95', 'phase-p95', 'min-coherence']);
    expect(p.perSeed['min-coherence']).toHaveLength(SEEDS);
    expect(p.recipe.blockLength).toBe(p.blockLength);
  }
  if (a.cheapestPassing) expect(a.statement).toMatch(/^The cheapest passing point is block length \d+ samples: 32 s of record/);
  else expect(a.statement).toMatch(/^No point of this sweep passes/);
  const audit = await second.db('audit_events').where({ target_id: straight }).select('action');
  expect(audit.map((e: { action: string }) => e.action)).toEqual(['sweeps.start']);
}, 180_000);
