/**
 * The demo lab's work (invented, from the product brief's scenario): systems for its two
 * structures, the built-in scenarios (scenarios/*.json), two recipes (scenarios/recipes/*.json)
 * and one finished study.
 *
 * All built-in scenarios and recipes are seeded (the recipes folder holds three). The study is
 * run synchronously here, in this thread, through the same runner the background pool uses, with
 * few seeds, so the seeded server opens with real results and start-up stays short. Idempotent: a lab that already has the demo systems is left as it is; a study left
 * unfinished by an interrupted seed is resumed by the scheduler through its job row.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { SystemSpec } from '@/shared/engine/systems';
import { parseRecipe } from '@/shared/engine/recipe';
import { parseScenario } from '@/shared/engine/scenario';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { claimJob, enqueueJob, finishJob, openJobForStudy } from '../db/jobs';
import type { Db } from '../db/knex';
import { insertStudy } from '../db/studies';
import { findUserByEmail, findLabBySlug } from '../db/users';
import { findResourceByName, insertResource, type VersionedKind } from '../db/versioned';
import { createLogger } from '../logger';
import { runStudy } from '../jobs/study-runner';
import { assembleScenarioTask } from '../jobs/assemble-scenario';
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
    description: 'Driving-point receptance at the motor plate: three close modes at 36, 46 and 53 Hz (1.2 %, 0.55 % and 0.9 % damping), as in the built-in frame scenarios.',
    spec: {
      kind: 'modal',
      quantity: 'receptance',
      modes: [
        { naturalFrequencyHz: 36, dampingRatio: 0.012, modalConstant: 0.03 },
        { naturalFrequencyHz: 46, dampingRatio: 0.0055, modalConstant: 0.02 },
        { naturalFrequencyHz: 53, dampingRatio: 0.009, modalConstant: 0.015 },
      ],
    },
  },
  {
    name: 'Drone motor arm',
    description: 'Accelerance at the motor mount of the lightweight arm: one lightly damped mode at 340 Hz (0.5 %) and a second at 910 Hz (1.2 %), as in the built-in arm scenarios.',
    spec: {
      kind: 'modal',
      quantity: 'accelerance',
      modes: [
        { naturalFrequencyHz: 340, dampingRatio: 0.005, modalConstant: 12.5 },
        { naturalFrequencyHz: 910, dampingRatio: 0.012, modalConstant: 8 },
      ],
    },
  },
];

/**
 * The demo study: the frame survey recipe against noise on either channel (H1 is unbiased by
 * output noise and biased low by input noise), few seeds so that seeding takes about a second.
 */
export const DEMO_STUDY = {
  recipe: 'frame-survey-hann-50.json',
  scenarios: ['frame-output-noise.json', 'frame-input-noise.json'],
  seeds: 3,
};

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
  assemble: async (task) => assembleScenarioTask(task),
  close: async () => undefined,
};

const silentMailer = { send: async () => undefined, close: () => undefined };

/**
 * Seeds the demo lab's work if its demo systems are absent. Returns true when it seeded.
 * `withStudy: false` leaves the demo study out (the test environment: every test server would
 * otherwise spend about a second computing it; tests that need a study start their own).
 */
export async function seedDemoWork(db: Db, opts: { withStudy: boolean } = { withStudy: true }): Promise<boolean> {
  const lab = await findLabBySlug(db, DEMO_LAB.slug);
  if (!lab) return false;
  if (await findResourceByName(db, 'systems', lab.id, DEMO_SYSTEMS[0].name)) return false;
  const author = await findUserByEmail(db, 'analyst@harborridge.test');
  if (!author) return false;
  const labId: string = lab.id;
  const scenarios = jsonFiles(SCENARIOS_DIR).map((s) => ({ ...s, parsed: parseScenario(s.json) }));
  const recipes = jsonFiles(RECIPES_DIR).map((r) => ({ ...r, parsed: parseRecipe(r.json) }));

  const at = Date.now();
  const studyId = await db.transaction(async (trx) => {
    const add = async (kind: VersionedKind, noun: string, name: string, description: string, body: unknown) => {
      const id = await insertResource(trx, kind, labId, { name, description, body, note: 'demo data', authorId: author.id, at });
      await recordAudit(trx, { labId, actorUserId: null, action: `${kind}.create`, targetType: noun, targetId: id, after: { version: 1, name, seed: true } });
      return id;
    };
    for (const s of DEMO_SYSTEMS) await add('systems', 'system', s.name, s.description, s.spec);
    const scenarioIds = new Map<string, string>();
    for (const s of scenarios) scenarioIds.set(s.file, await add('scenarios', 'scenario', s.parsed.name, s.parsed.description ?? '', s.parsed));
    const recipeIds = new Map<string, string>();
    for (const r of recipes) recipeIds.set(r.file, await add('recipes', 'recipe', r.parsed.name, r.parsed.description ?? '', r.parsed));
    const recipeId = recipeIds.get(DEMO_STUDY.recipe);
    const picked = DEMO_STUDY.scenarios.map((f) => scenarioIds.get(f)).filter((id): id is string => Boolean(id));
    if (!opts.withStudy || !recipeId || picked.length === 0) return null;
    const id = await insertStudy(trx, {
      labId,
      name: 'Frame survey against noise on either channel',
      recipeId,
      recipeVersion: 1,
      scenarios: picked.map((sid) => ({ id: sid, version: 1 })),
      seeds: DEMO_STUDY.seeds,
      baseSeed: 1,
      engineVersion: ENGINE_VERSION,
      createdBy: author.id,
      at,
    });
    await enqueueJob(trx, 'study', { studyId: id });
    await recordAudit(trx, { labId, actorUserId: null, action: 'studies.start', targetType: 'study', targetId: id, after: { seed: true, seeds: DEMO_STUDY.seeds } });
    return id;
  });
  if (studyId) await runDemoStudy(db, studyId);
  return true;
}

async function runDemoStudy(db: Db, studyId: string) {
  const job = await openJobForStudy(db, studyId);
  if (!job || !(await claimJob(db, job.id))) return;
  const outcome = await runStudy(
    { db, logger: createLogger('silent'), mailer: silentMailer, executor: inlineExecutor },
    studyId,
    { stopping: new AbortController().signal, progress: () => undefined, end: () => undefined },
  );
  await finishJob(db, job.id, outcome === 'finished' ? 'done' : outcome === 'interrupted' ? 'failed' : outcome);
}
