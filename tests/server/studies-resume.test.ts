/**
 * A study survives a crash: the server is stopped while the study runs (some runs stored, the rest
 * not), a new server is started on the same DATA_DIR, the study resumes from the stored runs
 * without redoing them, and it finishes with exactly the numbers — byte for byte in the stored
 * curves and runs — of the same study run without interruption.
 */
import fs from 'node:fs';
import { createDb } from '@/server/db/knex';
import { startTestServer, type TestServer } from './helpers';
import { smallRecipe, smallScenario, waitForStudy } from './work-fixtures';

const SEEDS = 8;
const TOTAL = 2 * SEEDS;

let first: TestServer;
let second: TestServer;
let dataDir: string;

afterAll(async () => {
  await second?.close();
  if (first) await first.running.close(); // harmless if already closed
  if (dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
});

it('resumes after a crash and ends with the numbers of an uninterrupted study', async () => {
  // One worker, and records of 16384 samples, so the crash lands with runs still to do.
  first = await startTestServer({ STUDY_WORKERS: '1' });
  dataDir = first.config.dataDir;
  const analyst = await first.signIn('analyst');
  const lab = `/api/v1/labs/${first.labId}`;
  const long = (name: string, snrDb: number) => ({ ...smallScenario(name, snrDb), acquisition: { sampleRateHz: 512, durationS: 32 } });
  const scenarioA = (await analyst.post(`${lab}/scenarios`).send({ definition: long('Resume A', 30) }).expect(201)).body.id;
  const scenarioB = (await analyst.post(`${lab}/scenarios`).send({ definition: long('Resume B', 15) }).expect(201)).body.id;
  const recipe = (await analyst.post(`${lab}/recipes`).send({ definition: { ...smallRecipe('Resume recipe'), blockLength: 1024 } }).expect(201)).body.id;
  const body = { recipe: { id: recipe }, scenarios: [{ id: scenarioA }, { id: scenarioB }], seeds: SEEDS, baseSeed: 40 };
  const interrupted = (await analyst.post(`${lab}/studies`).send({ name: 'Interrupted', ...body }).expect(202)).body.id;

  // Stop the server as soon as two runs are stored: the pool is torn down mid-study.
  for (;;) {
    const row = await first.db('runs').where({ study_id: interrupted }).count({ n: '*' }).first();
    if (Number(row?.n) >= 2) break;
    await new Promise((r) => setTimeout(r, 5));
  }
  await first.running.close();

  // What the crash left on disk, read with a connection of our own.
  const disk = createDb(first.config.databaseFile);
  const left = await disk('runs').where({ study_id: interrupted }).orderBy('id').select('id', 'position', 'seed_index', 'started_at', 'line_scores');
  const studyAtCrash = await disk('studies').where({ id: interrupted }).first();
  const jobAtCrash = await disk('jobs').whereRaw("json_extract(payload, '$.studyId') = ?", [interrupted]).first();
  await disk.destroy();
  expect(left.length).toBeGreaterThanOrEqual(2);
  expect(left.length).toBeLessThan(TOTAL);
  expect(studyAtCrash).toMatchObject({ status: 'running', runs_done: left.length });
  expect(jobAtCrash).toMatchObject({ status: 'running', attempts: 1 });

  // A new server on the same data: the study resumes by itself.
  second = await startTestServer({ DATA_DIR: dataDir, STUDY_WORKERS: '2' });
  const analyst2 = await second.signIn('analyst');
  const resumed = await waitForStudy(analyst2, `${lab}/studies/${interrupted}`);
  expect(resumed).toMatchObject({ status: 'finished', progress: { done: TOTAL, failed: 0, total: TOTAL } });
  const after = await second.db('runs').where({ study_id: interrupted }).orderBy('id').select('id', 'position', 'seed_index', 'started_at', 'line_scores');
  expect(after).toHaveLength(TOTAL);
  // The runs stored before the crash were kept, not redone.
  expect(after.slice(0, left.length)).toEqual(left);
  const job = await second.db('jobs').whereRaw("json_extract(payload, '$.studyId') = ?", [interrupted]).first();
  expect(job).toMatchObject({ status: 'done', attempts: 2 });

  // The same study, uninterrupted, on the same server.
  const straight = (await analyst2.post(`${lab}/studies`).send({ name: 'Straight through', ...body }).expect(202)).body.id;
  expect((await waitForStudy(analyst2, `${lab}/studies/${straight}`)).status).toBe('finished');

  const results = async (id: string) => {
    const { body: r } = await analyst2.get(`${lab}/studies/${id}/results`).expect(200);
    return { ...r, studyId: null };
  };
  expect(await results(interrupted)).toEqual(await results(straight));

  // Byte for byte: every stored run and every aggregated curve.
  const blobs = async (id: string) =>
    (await second.db('runs').where({ study_id: id }).orderBy([{ column: 'position' }, { column: 'seed_index' }]).select('position', 'seed_index', 'seed', 'line_scores')).map(
      (r) => [r.position, r.seed_index, r.seed, (r.line_scores as Buffer).toString('base64')],
    );
  expect(await blobs(interrupted)).toEqual(await blobs(straight));
  const curves = async (id: string) =>
    (await second.db('result_curves').where({ study_id: id }).orderBy([{ column: 'scenario_id' }, { column: 'kind' }]).select('scenario_id', 'kind', 'data')).map(
      (r) => [r.scenario_id, r.kind, (r.data as Buffer).toString('base64')],
    );
  const curvesA = await curves(interrupted);
  expect(curvesA.length).toBeGreaterThan(30);
  expect(curvesA).toEqual(await curves(straight));
  const summary = async (id: string) => (await second.db('studies').where({ id }).first()).summary;
  expect(await summary(interrupted)).toBe(await summary(straight));
}, 120_000);
