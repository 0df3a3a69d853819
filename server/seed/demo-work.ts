/**
 * The demo lab's work (invented, from the product brief's scenario): systems for its two
 * structures, the built-in scenarios (scenarios/*.json), two recipes (scenarios/recipes/*.json)
 * and one finished study.
 *
 * The study is run synchronously here, in this thread, through the same runner the background
 * pool uses, with few seeds, so the seeded server opens with real results and start-up stays
 * short. Idempotent: a lab that already has the demo systems is left as it is; a study left
 * unfinished by an interrupted seed is resumed by the scheduler through its job row.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { SystemSpec } from '@/shared/engine/systems';
import { parseRecipe } from '@/shared/engine/recipe';
import { parseScenario } from '@/shared/engine/scenario';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { claimJob, enqueueJob, finishJob } from '../db/jobs';
import type { Db } from '../db/knex';
import { insertStudy } from '../db/studies';
import { findResourceByName, insertResource, type VersionedKind } from '../db/versioned';
import { createLogger } from '../logger';
import { runStudy } from '../jobs/study-runner';
import { runStudyTask } from '../jobs/study-run';
import type { RunExecutor } from '../jobs/run-task';
import { recordAudit } from '../services/audit';
import { DEMO_LAB } from './demo-lab';

const SCENARIOS_DIR = path.resolve(__dirname, '../../scenarios');
const RECIPES_DIR = path.join(SCENARIOS_DIR, 'recipes');

/** The demo structures as known-answer systems (modal form, invented figures within the brief). */
export const DEMO_SYSTEMS: { name: string; description: string; spec: SystemSpec }[] = [
  {
    name: 'Rooftop fan mounting frame',
    description: 'Three close modes between 20 and 120 Hz, 0.6–1.8 % damping; force and response at the motor plate.',
    spec: {
      kind: 'modal',
      quantity: 'receptance',
      modes: [
        { naturalFrequencyHz: 44, dampingRatio: 0.01, modalConstant: 0.033 },
        { naturalFrequencyHz: 51.5, dampingRatio: 0.006, modalConstant: -0.021 },
        { naturalFrequencyHz: 63, dampingRatio: 0.018, modalConstant: 0.027 },
      ],
    },
  },
  {
    name: 'Drone motor arm',
    description: 'Lightweight arm: one lightly damped mode near 340 Hz and a second near 910 Hz; accelerometer at the motor mount.',
    spec: {
      kind: 'modal',
      quantity: 'accelerance',
      modes: [
        { naturalFrequencyHz: 340, dampingRatio: 0.007, modalConstant: 12.5 },
        { naturalFrequencyHz: 910, dampingRatio: 0.012, modalConstant: -5.2 },
      ],
    },
  },
];

/** Seeds per scenario of the demo study: enough for spread figures, few enough for a quick start. */
export const DEMO_STUDY_SEEDS = 3;
/** Scenarios in the demo study (the first ones by file name). */
export const DEMO_STUDY_SCENARIOS = 2;

function jsonFiles(dir: string): { file: string; json: unknown }[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => ({ file: f, json: JSON.parse(fs.readFileSync(path.join(dir, f), 'utf8')) as unknown }));
}

const inlineExecutor: RunExecutor = {
  capacity: 1,
  run: async (task) => runStudyTask(task),
  close: async () => undefined,
};

const silentMailer = { send: async () => undefined, close: () => undefined };

/** Seeds the demo lab's work if its demo systems are absent. Returns true when it seeded. */
export async function seedDemoWork(db: Db): Promise<boolean> {
  const lab = await db('labs').where({ slug: DEMO_LAB.slug }).first('id');
  if (!lab) return false;
  if (await findResourceByName(db, 'systems', lab.id, DEMO_SYSTEMS[0].name)) return false;
  const author = await db('users').where({ email: 'analyst@harborridge.test' }).first('id');
  if (!author) return false;
  const labId: string = lab.id;
  const scenarios = jsonFiles(SCENARIOS_DIR).map((s) => ({ ...s, parsed: parseScenario(s.json) }));
  const recipes = jsonFiles(RECIPES_DIR).slice(0, 2).map((r) => ({ ...r, parsed: parseRecipe(r.json) }));

  const at = Date.now();
  const studyId = await db.transaction(async (trx) => {
    const add = async (kind: VersionedKind, noun: string, name: string, description: string, body: unknown) => {
      const id = await insertResource(trx, kind, labId, { name, description, body, note: 'demo data', authorId: author.id, at });
      await recordAudit(trx, { labId, actorUserId: null, action: `${kind}.create`, targetType: noun, targetId: id, after: { version: 1, name, seed: true } });
      return id;
    };
    for (const s of DEMO_SYSTEMS) await add('systems', 'system', s.name, s.description, s.spec);
    const scenarioIds: string[] = [];
    for (const s of scenarios) scenarioIds.push(await add('scenarios', 'scenario', s.parsed.name, s.parsed.description ?? '', s.parsed));
    const recipeIds: string[] = [];
    for (const r of recipes) recipeIds.push(await add('recipes', 'recipe', r.parsed.name, r.parsed.description ?? '', r.parsed));
    if (recipeIds.length === 0 || scenarioIds.length === 0) return null;
    const picked = scenarioIds.slice(0, DEMO_STUDY_SCENARIOS).map((id) => ({ id, version: 1 }));
    const id = await insertStudy(trx, {
      labId,
      name: `${recipes[0].parsed.name} on ${picked.length} built-in scenarios`,
      recipeId: recipeIds[0],
      recipeVersion: 1,
      scenarios: picked,
      seeds: DEMO_STUDY_SEEDS,
      baseSeed: 1,
      engineVersion: ENGINE_VERSION,
      createdBy: author.id,
      at,
    });
    await enqueueJob(trx, 'study', { studyId: id });
    await recordAudit(trx, { labId, actorUserId: null, action: 'studies.start', targetType: 'study', targetId: id, after: { seed: true, seeds: DEMO_STUDY_SEEDS } });
    return id;
  });
  if (studyId) await runDemoStudy(db, studyId);
  return true;
}

async function runDemoStudy(db: Db, studyId: string) {
  const job = await db('jobs').where({ type: 'study' }).whereRaw("json_extract(payload, '$.studyId') = ?", [studyId]).first('id');
  if (!job || !(await claimJob(db, job.id))) return;
  const outcome = await runStudy(
    { db, logger: createLogger('silent'), mailer: silentMailer, executor: inlineExecutor },
    studyId,
    { stopping: new AbortController().signal, progress: () => undefined, end: () => undefined },
  );
  await finishJob(db, job.id, outcome === 'finished' ? 'done' : outcome === 'interrupted' ? 'failed' : outcome);
}
