/**
 * A study's results, made only from its stored runs: each scenario's runs are unpacked exactly
 * and assembled by the engine (assembleStudy, through jobs/assemble-scenario.ts, on the worker
 * pool) in the engine's canonical seed order, so a study resumed after a crash aggregates to the
 * same bytes as one that ran straight through.
 *
 * Per scenario the engine's aggregate curves (per-line statistics over seeds) are stored as
 * Float64 blobs in result_curves (kind = the aggregate's field name, 'plain.' + name for the
 * transient recipes' plain comparison); criteria, modes and band figures go to the study's
 * summary JSON. A scenario with a failed run is not aggregated; the study then ends as failed
 * and its error names each failed run.
 */
import type { AdaptiveOutcome, ScenarioResult, StudyResults } from '@/shared/api/work';
import { blobToFloat64, float64ToBlob } from '../db/float-blob';
import type { Db } from '../db/knex';
import { findStudy, findStudyById, listCurves, listRuns, replaceCurves, studyScenarios, updateStudy, type CurveRow } from '../db/studies';
import { findVersion } from '../db/versioned';
import { AppError, notFound } from '../errors';
import type { AssembleOutcome, AssembleTask, AssembledComparison } from '../jobs/assemble-scenario';
import { recordAudit } from './audit';

/** Where the aggregation runs: the worker pool in the server, in-thread in the demo seed. */
export type Assembler = (task: AssembleTask) => Promise<AssembleOutcome>;

/** What the study's summary JSON keeps per scenario. */
export interface StoredScenarioResult {
  position: number;
  scenarioId: string;
  scenarioVersion: number;
  name: string;
  seeds: number;
  failedRuns: number;
  aggregated: boolean;
  reference: string | null;
  referenceNote: string | null;
  warnings: { message: string; runs: number }[];
  judged: AssembledComparison | null;
  plain: AssembledComparison | null;
  /** Adaptive studies: seeds used and why the scenario stopped. */
  adaptive?: AdaptiveOutcome | null;
}

export interface StoredStudySummary {
  pass: boolean | null;
  scenarios: StoredScenarioResult[];
}

/**
 * Aggregates the stored runs and ends the study as finished (every run stored and none failed)
 * or failed, in one transaction with its curves and an audit event. Returns the final status.
 */
export async function finaliseStudy(db: Db, studyId: string, assemble: Assembler): Promise<{ status: 'finished' | 'failed'; error: string | null }> {
  const study = await findStudyById(db, studyId);
  if (!study) throw notFound(`Study ${studyId}`);
  const recipeRow = await findVersion(db, 'recipes', study.recipe_id, study.recipe_version);
  const recipe = JSON.parse(recipeRow!.body) as unknown;
  const scenarios = await studyScenarios(db, studyId);
  const runs = await listRuns(db, studyId, { withScores: true });
  const adaptive = study.adaptive ? (JSON.parse(study.adaptive) as { batchSize: number; significantDigits: number }) : null;
  const curves: CurveRow[] = [];
  const results: StoredScenarioResult[] = [];
  const failures: string[] = [];
  for (const s of scenarios) {
    const mine = runs.filter((r) => r.position === s.position);
    const failed = mine.filter((r) => r.status === 'failed');
    failed.forEach((r) => failures.push(`"${s.name}" seed ${r.seed} (run ${r.seed_index + 1}): ${r.error}`));
    const base: StoredScenarioResult = {
      position: s.position,
      scenarioId: s.scenario_id,
      scenarioVersion: s.scenario_version,
      name: s.name,
      seeds: mine.length - failed.length,
      failedRuns: failed.length,
      aggregated: false,
      reference: null,
      referenceNote: null,
      warnings: [],
      judged: null,
      plain: null,
    };
    // An adaptive scenario may stop before the maximum: it needs runs 0 … n − 1, n ≥ 1.
    const expected = adaptive ? Math.max(1, mine.length) : study.seeds;
    const gap = adaptive && mine.some((r, i) => r.seed_index !== i);
    if (failed.length > 0 || mine.length < expected || gap) {
      if (mine.length < expected || gap) failures.push(`"${s.name}": ${gap ? 'runs missing in the seed sequence' : `${expected - mine.length} runs missing`}`);
      results.push(base);
      continue;
    }
    const assembled = await assemble({
      recipe,
      scenario: JSON.parse(s.body),
      position: s.position,
      seeds: mine.length,
      baseSeed: study.base_seed,
      runs: mine.map((r) => new Uint8Array(r.line_scores!.buffer, r.line_scores!.byteOffset, r.line_scores!.byteLength)),
      ...(adaptive ? { adaptive: { options: adaptive, maxSeeds: study.seeds } } : {}),
    });
    for (const c of assembled.curves) curves.push({ scenario_id: s.scenario_id, kind: c.kind, length: c.values.length, data: float64ToBlob(c.values) });
    results.push({
      ...base,
      aggregated: true,
      reference: assembled.reference,
      referenceNote: assembled.referenceNote,
      warnings: assembled.warnings,
      judged: assembled.judged,
      plain: assembled.plain,
      ...(assembled.adaptive ? { adaptive: adaptiveOutcome(assembled.adaptive) } : {}),
    });
  }
  const status = failures.length ? 'failed' : 'finished';
  const error = failures.length ? `${failures.length} run problem(s): ${failures.slice(0, 10).join('; ')}${failures.length > 10 ? '; …' : ''}` : null;
  const summary: StoredStudySummary = {
    pass: status === 'finished' ? results.every((r) => r.judged?.pass === true) : false,
    scenarios: results,
  };
  await db.transaction(async (trx) => {
    await replaceCurves(trx, studyId, curves);
    await updateStudy(trx, studyId, { status, summary: JSON.stringify(summary), error, finished_at: Date.now(), current_scenario_id: null });
    await recordAudit(trx, {
      labId: study.lab_id,
      actorUserId: null,
      action: status === 'finished' ? 'studies.finish' : 'studies.fail',
      targetType: 'study',
      targetId: studyId,
      after: { status, pass: summary.pass, error },
    });
  });
  return { status, error };
}

/** The stored form of an adaptive scenario's stopping state (the state says stop by now). */
export function adaptiveOutcome(state: NonNullable<AssembleOutcome['adaptive']>): AdaptiveOutcome {
  return { seedsUsed: state.seeds, batches: state.batches, stop: state.stop ?? 'max-seeds', criteria: state.criteria };
}

const toArray = (a: Float64Array) => Array.from(a, (v) => (Number.isFinite(v) ? v : null));

/** GET /studies/:id/results: the stored aggregates, criteria and per-line curves. */
export async function getStudyResults(db: Db, labId: string, id: string): Promise<StudyResults> {
  const study = await findStudy(db, labId, id);
  if (!study) throw notFound(`Study ${id}`);
  if (study.status !== 'finished' && study.status !== 'failed') {
    throw new AppError(409, 'study_not_finished', `This study is ${study.status}; results exist once it has finished.`);
  }
  const summary = JSON.parse(study.summary ?? '{"pass":null,"scenarios":[]}') as StoredStudySummary;
  const rows = await listCurves(db, id);
  const scenarios: ScenarioResult[] = summary.scenarios.map((s) => {
    const curves: Record<string, (number | null)[]> = {};
    const plainCurves: Record<string, (number | null)[]> = {};
    for (const row of rows.filter((r) => r.scenario_id === s.scenarioId)) {
      const values = toArray(blobToFloat64(row.data));
      if (row.kind.startsWith('plain.')) plainCurves[row.kind.slice(6)] = values;
      else curves[row.kind] = values;
    }
    return {
      scenarioId: s.scenarioId,
      scenarioVersion: s.scenarioVersion,
      name: s.name,
      seeds: s.seeds,
      failedRuns: s.failedRuns,
      pass: s.judged?.pass ?? false,
      reference: s.reference,
      referenceNote: s.referenceNote,
      warnings: s.warnings,
      criteria: s.judged?.criteria ?? [],
      figures: s.judged?.figures ?? {},
      modes: (s.judged?.modes ?? []) as unknown as Record<string, unknown>[],
      curves,
      plain: s.plain ? { pass: s.plain.pass, criteria: s.plain.criteria, figures: s.plain.figures, modes: s.plain.modes as unknown as Record<string, unknown>[], curves: plainCurves } : null,
      adaptive: s.adaptive ?? null,
    };
  });
  return { studyId: id, status: study.status, engineVersion: study.engine_version, pass: summary.pass, error: study.error, scenarios };
}
