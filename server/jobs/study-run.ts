/**
 * The task a study worker thread runs: one scenario × one seed through the engine's
 * runScenarioSeed, returned as plain data (the engine's whole RunResult packed exactly, plus a
 * JSON summary for the runs list). An engine error becomes a failed outcome naming its field, so
 * the study can say which run failed and why. Loaded in worker threads through study-worker.js;
 * relative imports only, so nothing depends on the main thread's module aliases.
 */
import { parseRecipe } from '../../shared/engine/recipe';
import { parseScenario } from '../../shared/engine/scenario';
import { runScenarioSeed, type RunResult } from '../../shared/engine/study';
import { packValue } from '../db/float-blob';
import type { RunOutcome, RunTask } from './run-task';

export { assembleScenarioTask } from './assemble-scenario';

const finite = (v: number) => (Number.isFinite(v) ? v : null);

/** The run's figures shown in the runs list (JSON: non-finite values as null). */
export function runSummary(r: RunResult): Record<string, unknown> {
  const s = r.judged.score.summary;
  return {
    reference: r.reference,
    maxAbsMagnitudeDb: finite(s.maxAbsMagnitudeDb),
    maxAbsPhaseDeg: finite(s.maxAbsPhaseDeg),
    maxComplexRelative: finite(s.maxComplexRelative),
    worstLineHz: finite(s.worstLineHz),
    rmsMagnitudeDb: finite(s.rmsMagnitudeDb),
    blocks: r.blocks,
    effectiveAverages: r.effectiveAverages,
    frequencyResolutionHz: r.frequencyResolutionHz,
    modes: r.judged.modes.map((m) => ({
      naturalFrequencyHz: m.naturalFrequencyHz,
      status: m.status,
      resonanceFrequencyErrorPercent: m.resonanceFrequencyErrorPercent ?? null,
      dampingErrorPercent: m.dampingErrorPercent ?? null,
      peakValueErrorDb: m.peakValueErrorDb ?? null,
    })),
    warnings: r.warnings,
  };
}

export function runStudyTask(task: RunTask): RunOutcome {
  const startedAt = Date.now();
  try {
    const result = runScenarioSeed(parseScenario(task.scenario), parseRecipe(task.recipe), task.seed);
    const packed = packValue(result);
    return { ok: true, summary: runSummary(result), lineScores: new Uint8Array(packed.buffer, packed.byteOffset, packed.byteLength), startedAt, finishedAt: Date.now() };
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    return { ok: false, error: message, startedAt, finishedAt: Date.now() };
  }
}
