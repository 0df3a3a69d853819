/**
 * Re-verification of an approved standard: every evidence study is run again on today's engine
 * and compared, line by line, with what is stored (each result curve, the criteria, the modes,
 * the band figures of every scenario). See reports/result-compare.ts for identical / within
 * 1e-12 / changed. The outcome is recorded in the audit trail.
 *
 * It runs synchronously in the request, in this process, through the same engine calls the
 * background workers make (runScenarioSeed, then assembleStudy exactly as finaliseStudy does),
 * yielding to the event loop after each run so the API keeps answering meanwhile. That suits
 * the small studies a standard is usually evidenced by. Figures the engine gained after a study
 * was stored (Monte Carlo standard errors, decision rules, exact-region coverage) have nothing
 * stored to compare with and are left out; every stored value is compared. That suits
 * the small studies a standard is usually evidenced by; a standard whose evidence holds more than
 * MAX_REVERIFY_RUNS runs is refused with a clear message rather than blocking the server.
 */
import { REVERIFY_TOLERANCE, type Reverification } from '@/shared/api/approval';
import { parseRecipe } from '@/shared/engine/recipe';
import type { MonteCarloAggregate } from '@/shared/engine/scores/monte-carlo';
import { assembleStudy, runScenarioSeed, SEED_STRIDE, studySeed, type ComparisonAggregate, type RunResult } from '@/shared/engine/study';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { blobToFloat64 } from '../db/float-blob';
import type { Db } from '../db/knex';
import { findStudy, listCurves, studyScenarios } from '../db/studies';
import { findVersion } from '../db/versioned';
import { AppError, notFound } from '../errors';
import { compareArrays, compareTrees, type LineComparison } from '../reports/result-compare';
import { recordAudit } from './audit';
import { getStandard } from './standards';
import { bandFiguresOf } from '../jobs/assemble-scenario';
import type { StoredStudySummary } from './study-results';

export const MAX_REVERIFY_RUNS = 400;
type Line = Reverification['lines'][number];
const json = (v: unknown) => JSON.parse(JSON.stringify(v)) as unknown;
const tick = () => new Promise<void>((resolve) => setImmediate(resolve));

/** What finaliseStudy stores of a comparison, rebuilt from a fresh aggregate. */
function storedShape(c: ComparisonAggregate) {
  return json({ pass: c.pass, criteria: c.criteria, modes: c.modes, figures: bandFiguresOf(c.aggregate) }) as Record<string, unknown>;
}

function curvesOf(a: MonteCarloAggregate, prefix: string, out: Map<string, Float64Array>) {
  for (const [k, v] of Object.entries(a)) if (v instanceof Float64Array) out.set(prefix + k, v);
}

interface Target {
  studyId: string;
  scenario: string;
}

function line(t: Target, quantity: string, c: LineComparison, atHz: number | null): Line & { c: LineComparison } {
  return { studyId: t.studyId, scenario: t.scenario, quantity, values: c.values, verdict: c.verdict, maxDifference: c.maxDifference, atHz, error: null, c };
}

async function studyLines(db: Db, labId: string, studyId: string, lines: (Line & { c?: LineComparison })[]): Promise<{ engine: string; runs: number }> {
  const study = await findStudy(db, labId, studyId);
  if (!study) throw notFound(`Study ${studyId}`);
  const recipe = parseRecipe(JSON.parse((await findVersion(db, 'recipes', study.recipe_id, study.recipe_version))!.body));
  const summary = JSON.parse(study.summary ?? '{"scenarios":[]}') as StoredStudySummary;
  const storedCurves = await listCurves(db, studyId);
  let runs = 0;
  for (const sc of await studyScenarios(db, studyId)) {
    const t = { studyId, scenario: sc.name };
    const definition = JSON.parse(sc.body);
    const results: RunResult[] = [];
    // An adaptive study's scenario used the seeds it stopped at.
    const seeds = summary.scenarios.find((x) => x.position === sc.position)?.adaptive?.seedsUsed ?? study.seeds;
    try {
      for (let i = 0; i < seeds; i++) {
        results.push(runScenarioSeed(definition, recipe, studySeed(study.base_seed, sc.position, i)));
        runs++;
        await tick();
      }
    } catch (err) {
      lines.push({ ...t, quantity: 'runs', values: study.seeds, verdict: 'changed', maxDifference: null, atHz: null, error: `a run fails on engine ${ENGINE_VERSION}: ${(err as Error).message}` });
      continue;
    }
    const now = assembleStudy({ recipe, scenarios: [definition], seeds, baseSeed: study.base_seed + sc.position * SEED_STRIDE }, results).results[0]!;
    const fresh = new Map<string, Float64Array>();
    curvesOf(now.judged.aggregate, '', fresh);
    if (now.plain) curvesOf(now.plain.aggregate, 'plain.', fresh);
    const mine = new Map(storedCurves.filter((c) => c.scenario_id === sc.scenario_id).map((c) => [c.kind, blobToFloat64(c.data)]));
    const freqs = mine.get('frequenciesHz') ?? fresh.get('frequenciesHz');
    for (const kind of [...(mine.size ? mine : fresh).keys()].sort()) {
      const c = compareArrays(mine.get(kind) ?? new Float64Array(0), fresh.get(kind) ?? new Float64Array(0), REVERIFY_TOLERANCE);
      const hz = typeof c.at === 'number' && freqs && c.at < freqs.length ? freqs[c.at]! : null;
      lines.push(line(t, kind, c, hz));
    }
    const stored = summary.scenarios.find((s) => s.position === sc.position);
    const storedJudged = (stored?.judged ?? null) as Record<string, unknown> | null;
    const nowJudged = storedShape(now.judged);
    for (const part of ['pass', 'criteria', 'modes', 'figures'] as const) {
      lines.push(line(t, part, compareTrees(storedJudged?.[part] ?? null, nowJudged[part], REVERIFY_TOLERANCE, { storedPathsOnly: true }), null));
    }
    if (stored?.plain || now.plain) {
      lines.push(line(t, 'plain', compareTrees(stored?.plain ?? null, now.plain ? storedShape(now.plain) : null, REVERIFY_TOLERANCE, { storedPathsOnly: true }), null));
    }
  }
  return { engine: study.engine_version, runs };
}

/** Re-runs an approved standard's evidence on today's engine and compares (module doc). */
export async function reverifyStandard(db: Db, labId: string, userId: string, standardId: string): Promise<Reverification> {
  const standard = await getStandard(db, labId, standardId);
  let planned = 0;
  for (const id of standard.evidenceStudyIds) {
    const s = await findStudy(db, labId, id);
    planned += (s?.seeds ?? 0) * (await studyScenarios(db, id)).length;
  }
  if (planned > MAX_REVERIFY_RUNS) {
    throw new AppError(422, 'too_large_to_reverify', `This standard's evidence holds ${planned} runs; re-verification in the request is limited to ${MAX_REVERIFY_RUNS}. Start a study with the same recipe version, scenarios and seeds instead and compare its results.`);
  }
  const lines: (Line & { c?: LineComparison })[] = [];
  const engines = new Set<string>();
  let runs = 0;
  for (const id of standard.evidenceStudyIds) {
    const r = await studyLines(db, labId, id, lines);
    engines.add(r.engine);
    runs += r.runs;
  }
  const rank = { identical: 0, 'within-tolerance': 1, changed: 2 } as const;
  const verdict = lines.reduce<Reverification['verdict']>((w, l) => (rank[l.verdict] > rank[w] ? l.verdict : w), 'identical');
  const worst = lines
    .filter((l) => l.verdict !== 'identical')
    .sort((a, b) => rank[b.verdict] - rank[a.verdict] || (a.maxDifference === null ? -1 : b.maxDifference === null ? 1 : b.maxDifference - a.maxDifference))[0];
  const largestChange = worst
    ? { studyId: worst.studyId, scenario: worst.scenario, quantity: worst.c && typeof worst.c.at === 'string' ? `${worst.quantity}.${worst.c.at}` : worst.quantity, frequencyHz: worst.atHz, stored: worst.c?.stored ?? null, recomputed: worst.c?.recomputed ?? null, difference: worst.maxDifference }
    : null;
  const result: Reverification = {
    standardId, engineVersion: ENGINE_VERSION, storedEngineVersions: [...engines], verdict, tolerance: REVERIFY_TOLERANCE, runs, largestChange,
    lines: lines.map(({ c: _c, ...l }) => l), at: Date.now(),
  };
  await recordAudit(db, {
    labId, actorUserId: userId, action: 'standards.reverify', targetType: 'standard', targetId: standardId,
    after: { verdict, engineVersion: ENGINE_VERSION, storedEngineVersions: result.storedEngineVersions, runs, largestChange, changedLines: lines.filter((l) => l.verdict === 'changed').length },
  });
  return result;
}
