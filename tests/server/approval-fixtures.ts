/**
 * Shared set-up of the approval, report and re-verification tests: the demo lab's agents, two small
 * SDOF frame scenarios (ζ = 2 % and 1 %), a Hann recipe fine enough for them, a helper that runs a
 * study to its end, recipe edits, role changes and audit reads.
 */
import type request from 'supertest';
import type { Role } from '@/shared/api/auth';
import { TEST_PASSWORD, type TestServer } from './helpers';
import { waitForStudy } from './work-fixtures';

export type Agents = Record<Role, request.Agent> & { analyst2: request.Agent };

export async function signInAll(t: TestServer): Promise<Agents> {
  return {
    admin: await t.signIn('admin'),
    analyst: await t.signIn('analyst'),
    analyst2: await t.signIn('analyst2@harborridge.test'),
    reviewer: await t.signIn('reviewer'),
    auditor: await t.signIn('auditor'),
  };
}

/**
 * A single-mode frame: the SDOF receptance 1/(k − mω² + jcω) at fn = 50 Hz (textbook result, e.g.
 * S. S. Rao, Mechanical Vibrations) with ζ given, random force 0–200 Hz, 60 dB SNR on the response.
 */
export function frameScenario(dampingRatio: number, errors: Record<string, unknown> = { outputNoise: { snrDb: 60 } }) {
  return {
    name: `SDOF 50 Hz at ${dampingRatio * 100} % damping`,
    system: { kind: 'sdof', quantity: 'receptance', stiffnessNPerM: 1e4, naturalFrequencyHz: 50, dampingRatio },
    acquisition: { sampleRateHz: 512, durationS: 32 },
    excitation: { kind: 'random', band: { lowHz: 0, highHz: 200 }, level: { rmsN: 1 } },
    errors,
  };
}

/**
 * Hann, 2048-sample blocks (0.25 Hz, a quarter of the 1 Hz half-power bandwidth of the 1 % mode:
 * the common-practice rule for resolution bias), 50 % overlap, H1, judged on 20–100 Hz.
 */
export function frameRecipe(name = 'Hann 2048, H1, frames') {
  return {
    name,
    blockLength: 2048,
    window: 'hann',
    overlap: 0.5,
    detrend: 'none',
    estimator: 'H1',
    band: { lowHz: 20, highHz: 100 },
    scaling: 'density',
    tolerances: { magnitudeDb: 1.5, phaseDeg: 15, minCoherence: 0.5 },
  };
}

/** The scope the two frame scenarios cover: one mode at 50 Hz with 1 % and 2 % damping, random excitation. */
export const frameScope = {
  structureType: 'Single-mode test frame',
  band: { lowHz: 30, highHz: 80 },
  dampingPercent: { min: 1, max: 2 },
  excitations: ['random'],
};

export interface WorkIds {
  lab: string;
  scenarios: string[];
  recipe: string;
}

export async function createWork(t: TestServer, analyst: request.Agent, recipe: Record<string, unknown> = frameRecipe()): Promise<WorkIds> {
  const lab = `/api/v1/labs/${t.labId}`;
  const post = async (kind: string, definition: unknown) => (await analyst.post(`${lab}/${kind}`).send({ definition }).expect(201)).body.id as string;
  return { lab, scenarios: [await post('scenarios', frameScenario(0.02)), await post('scenarios', frameScenario(0.01))], recipe: await post('recipes', recipe) };
}

/** Starts a study of the recipe version on the scenarios and waits until it has ended. */
export async function finishedStudy(agent: request.Agent, w: WorkIds, version: number, opts: { seeds?: number; name?: string; scenarios?: string[] } = {}): Promise<string> {
  const res = await agent
    .post(`${w.lab}/studies`)
    .send({ name: opts.name ?? `Evidence for v${version}`, recipe: { id: w.recipe, version }, scenarios: (opts.scenarios ?? w.scenarios).map((id) => ({ id })), seeds: opts.seeds ?? 2 })
    .expect(202);
  const study = await waitForStudy(agent, `${w.lab}/studies/${res.body.id}`);
  if (study.status !== 'finished') throw new Error(`study ${res.body.id} ended ${study.status}: ${String(study.error)}`);
  return res.body.id as string;
}

/** A new version of the recipe made by `agent` (PUT), returning its number. */
export async function editRecipe(agent: request.Agent, w: WorkIds, baseVersion: number, change: Record<string, unknown>): Promise<number> {
  const current = (await agent.get(`${w.lab}/recipes/${w.recipe}/versions/${baseVersion}`).expect(200)).body.definition;
  const res = await agent.put(`${w.lab}/recipes/${w.recipe}`).send({ baseVersion, definition: { ...current, ...change } }).expect(200);
  return res.body.version.version as number;
}

export async function userId(t: TestServer, email: string): Promise<string> {
  return (await t.db('users').where({ email }).first('id')).id as string;
}

export async function setRole(t: TestServer, admin: request.Agent, email: string, role: Role): Promise<void> {
  await admin.patch(`/api/v1/labs/${t.labId}/members/${await userId(t, email)}`).send({ role }).expect(200);
}

/** Actions of the lab's audit trail since `afterId`, oldest first. */
export async function auditSince(t: TestServer, afterId = 0): Promise<{ id: number; action: string; actor_user_id: string | null; target_id: string | null; after_json: string | null }[]> {
  return t.db('audit_events').where('lab_id', t.labId).andWhere('id', '>', afterId).orderBy('id').select('id', 'action', 'actor_user_id', 'target_id', 'after_json');
}

export async function lastAuditId(t: TestServer): Promise<number> {
  return Number((await t.db('audit_events').max({ m: 'id' }).first())?.m ?? 0);
}

export const failureOf = async (p: PromiseLike<unknown>): Promise<string> => {
  try {
    await p;
    return 'no error';
  } catch (err) {
    return (err as Error).message;
  }
};

/** Submits version 1 with one finished study for the frame scope and has the reviewer sign it off. */
export async function approvedStandard(as: Pick<Agents, 'analyst' | 'reviewer'>, w: WorkIds): Promise<{ standardId: string; submissionId: string }> {
  const studyId = await finishedStudy(as.analyst, w, 1);
  const sub = await as.analyst.post(`${w.lab}/reviews`).send({ recipe: { id: w.recipe, version: 1 }, studyIds: [studyId], scope: frameScope }).expect(201);
  const ok = await as.reviewer
    .post(`${w.lab}/reviews/${sub.body.id}/decision`)
    .send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames' })
    .expect(200);
  return { standardId: ok.body.standardId as string, submissionId: sub.body.id as string };
}
