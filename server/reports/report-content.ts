/**
 * The content of a validation report (for one study, or for an approved standard with all its
 * evidence studies), as plain data: the page prints it and the PDF renders it. Nothing in it
 * depends on the time it is made, so the same stored data always give the same content and the
 * same sha256.
 */
import type { ReportContent, Scope } from '@/shared/api/approval';
import type { CriterionResult } from '@/shared/api/work';
import { decisionRuleWords } from '@/shared/engine/scores/decision-rules';
import { parseRecipe } from '@/shared/engine/recipe';
import { SEED_RULE, studySeed } from '@/shared/engine/study';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { findDecision, findSubmission, submissionWithStudy, versionState } from '../db/approval';
import type { Db } from '../db/knex';
import { findLab } from '../db/members';
import { findStudy, studyScenarios } from '../db/studies';
import { findResource, findVersion } from '../db/versioned';
import { AppError, notFound } from '../errors';
import { scenarioOf } from '../services/scenario-definition';
import { signatureOf } from '../services/signature';
import { getStandard } from '../services/standards';
import { getStudyResults } from '../services/study-results';
import { evidenceDocument, evidenceSha256 } from '../services/evidence';
import { scenarioPlot } from './report-plots';
import { settingsSummary } from '@/shared/api/settings-summary';
import { studySampleRates } from './recipe-settings';
import { acquisitionWords, errorSourceWords, excitationWords, systemWords } from './scenario-words';

export const CAUTIONS = [
  'Synthetic verification checks the processing, not the transducers, the fixture or the test set-up: it does not replace calibration, the lab\'s accredited procedures or engineering judgement.',
  'Shaker and impact testing involve moving masses and high forces; follow the lab\'s safety rules and local codes.',
  'Approval in Plumbline records the lab\'s decision; responsibility stays with the lab\'s licensed or authorised staff.',
];

const verdict = (pass: boolean) => (pass ? 'PASS' : 'FAIL') as 'PASS' | 'FAIL';
const criterionVerdict = (c: CriterionResult): 'PASS' | 'FAIL' | 'CONDITIONAL' => (c.decision === 'conditional' ? 'CONDITIONAL' : verdict(c.pass));
const sig = (v: number) => Number(v.toPrecision(3)).toString();

function criterionEntry(c: CriterionResult) {
  const base = { label: c.label, limit: c.limit, observed: c.observed, unit: c.unit, pass: c.pass, verdict: criterionVerdict(c), worstLineHz: c.worstLineHz };
  if (!c.decision) return base;
  return {
    ...base,
    rule: decisionRuleWords(c.rule),
    expandedUncertainty: c.expandedUncertainty ?? null,
    guardBand: c.guardBand ?? null,
    acceptanceLimit: c.acceptanceLimit ?? null,
    falseAcceptProbability: c.falseAcceptProbability ?? null,
    falseRejectProbability: c.falseRejectProbability ?? null,
  };
}

/**
 * The statement of conformity of one scenario (ILAC G8:09/2019 §4.3; ISO/IEC 17025 §7.8.6.2): which
 * decision rule each criterion used, the specification (the recipe version's limits) and the
 * results it covers (this scenario version, these seeds, on this engine).
 */
function conformityStatement(recipe: { name: string; version: number }, scenario: string, seeds: string, criteria: CriterionResult[]): string | undefined {
  if (criteria.length === 0 || !criteria.every((c) => c.decision)) return undefined;
  const each = criteria.map((c) => {
    const decision = c.decision ?? (c.pass ? 'pass' : 'fail');
    const risk = decision === 'fail' ? c.falseRejectProbability : c.falseAcceptProbability;
    const riskWords = risk === null || risk === undefined ? '' : `, probability of a false ${decision === 'fail' ? 'reject' : 'accept'} ${sig(risk * 100)} %`;
    const observed = c.observed === null ? 'no figure' : `${sig(c.observed)} ${c.unit}`.trim();
    const u = c.expandedUncertainty === null || c.expandedUncertainty === undefined ? '' : ` ± ${sig(c.expandedUncertainty)} (U, k = 2)`;
    return `${c.label}: ${observed}${u} against ${c.id === 'coverage' || c.id === 'min-coherence' ? '≥' : '≤'} ${sig(c.limit)} ${c.unit}`.trim() + ` by ${decisionRuleWords(c.rule)} — ${decision.toUpperCase()}${riskWords}`;
  });
  return `Statement of conformity for scenario "${scenario}", ${seeds}, against the specification of recipe "${recipe.name}" version ${recipe.version}. ${each.join('; ')}. The uncertainty is the Monte Carlo uncertainty of each figure over the seeds (bootstrap, fixed seed); the statement covers these simulated results only.`;
}

async function labOf(db: Db, labId: string) {
  const lab = await findLab(db, labId);
  if (!lab) throw notFound('The lab');
  return { id: lab.id, name: lab.name, footer: lab.report_footer ?? '' };
}

async function recipeOf(db: Db, labId: string, id: string, version: number) {
  const head = await findResource(db, 'recipes', labId, id);
  const row = await findVersion(db, 'recipes', id, version);
  if (!head || !row) throw notFound(`Version ${version} of recipe ${id}`);
  const definition = JSON.parse(row.body) as Record<string, unknown>;
  return {
    entry: { id, version, name: row.name, state: (await versionState(db, id, version)) ?? 'draft', author: { id: row.author_id, displayName: row.author_name }, definition },
    recipe: parseRecipe(definition),
  };
}

/** One study of a report: its scenarios in words, per-scenario criteria with verdicts, plots. */
async function studyEntry(db: Db, labId: string, studyId: string, toleranceDb: number | undefined, recipe: { name: string; version: number }): Promise<ReportContent['studies'][number]> {
  const study = await findStudy(db, labId, studyId);
  if (!study) throw notFound(`Study ${studyId}`);
  const results = await getStudyResults(db, labId, studyId);
  const stored = await studyScenarios(db, studyId);
  return {
    id: study.id,
    name: study.name,
    status: study.status,
    engineVersion: study.engine_version,
    seedsPerScenario: study.seeds,
    baseSeed: study.base_seed,
    seedRule: SEED_RULE,
    runBy: { id: study.created_by, displayName: study.created_by_name },
    startedAt: study.started_at === null ? null : Number(study.started_at),
    finishedAt: study.finished_at === null ? null : Number(study.finished_at),
    pass: results.pass,
    scenarios: stored.map((sc) => {
      const scenario = scenarioOf(JSON.parse(sc.body));
      const r = results.scenarios.find((x) => x.scenarioId === sc.scenario_id);
      const first = studySeed(study.base_seed, sc.position, 0);
      const pass = r?.pass ?? false;
      const used = r?.adaptive?.seedsUsed ?? study.seeds;
      const seeds = used === 1 ? `seed ${first}` : `seeds ${first}–${first + used - 1} (${used} seeds${r?.adaptive ? `, adaptive: stopped ${r.adaptive.stop === 'stable' ? 'as every criterion was stable' : 'at the maximum'}` : ''})`;
      return {
        id: sc.scenario_id,
        version: sc.scenario_version,
        name: sc.name,
        system: systemWords(scenario),
        acquisition: acquisitionWords(scenario),
        excitation: excitationWords(scenario),
        errorSources: errorSourceWords(scenario),
        seeds,
        pass,
        verdict: verdict(pass),
        reference: r?.reference ?? null,
        criteria: (r?.criteria ?? []).map(criterionEntry),
        ...(r ? { conformity: conformityStatement(recipe, sc.name, seeds, r.criteria) } : {}),
        figures: r?.figures ?? {},
        warnings: [...(r?.referenceNote ? [r.referenceNote] : []), ...(r?.warnings ?? []).map((w) => `${w.message} (${w.runs} run(s))`)],
        plot: r ? scenarioPlot(r, scenario, toleranceDb) : null,
      };
    }),
  };
}

function purposeText(recipeName: string, version: number, seeds: number, stated: string): string {
  const base = `Shows how the processing recipe "${recipeName}" version ${version} turns known-answer signals into FRFs: each scenario below is simulated with its error sources over ${seeds} seed(s), processed with the recipe, and scored against the exact FRF of its system.`;
  return stated ? `${stated}\n\n${base}` : base;
}

function reproducibility(recipe: { name: string; version: number }, studies: ReportContent['studies']): string {
  const engines = [...new Set(studies.map((s) => s.engineVersion))].join(', ');
  return [
    `Every figure was computed from the stored definitions listed here: recipe "${recipe.name}" version ${recipe.version}, the scenario versions of each study and their seeds (rule: ${SEED_RULE}, base seed as stated), on engine version ${engines}.`,
    'The engine reads no clock and no unseeded random source, so the same study on the same engine version gives the same numbers bit for bit.',
    `Re-verification re-runs an approved standard's studies on the current engine (version ${ENGINE_VERSION}) and reports, line by line, whether any number moved.`,
  ].join(' ');
}

export async function studyReportContent(db: Db, labId: string, studyId: string): Promise<ReportContent> {
  const study = await findStudy(db, labId, studyId);
  if (!study) throw notFound(`Study ${studyId}`);
  if (study.status !== 'finished' && study.status !== 'failed') {
    throw new AppError(409, 'study_not_finished', `This study is ${study.status}; its report exists once it has finished.`);
  }
  const { entry, recipe } = await recipeOf(db, labId, study.recipe_id, study.recipe_version);
  const submission = await submissionWithStudy(db, labId, studyId);
  const decision = submission?.decision_id ? await findDecision(db, submission.id) : undefined;
  const studies = [await studyEntry(db, labId, studyId, recipe.tolerances.magnitudeDb, entry)];
  return {
    kind: 'study',
    title: `Validation report: study "${study.name}"`,
    lab: await labOf(db, labId),
    purpose: purposeText(entry.name, entry.version, study.seeds, submission?.purpose ?? ''),
    scope: submission ? (JSON.parse(submission.scope_json) as Scope) : null,
    recipe: entry,
    studies,
    settings: settingsSummary(entry, recipe, await studySampleRates(db, [studyId])),
    justification: submission?.justification ?? null,
    signature: decision?.decision === 'approved' ? await signatureOf(db, decision) : null,
    standard: null,
    evidenceCheck: null,
    engineVersion: ENGINE_VERSION,
    reproducibility: reproducibility(entry, studies),
    cautions: CAUTIONS,
  };
}

export async function standardReportContent(db: Db, labId: string, standardId: string): Promise<ReportContent> {
  const standard = await getStandard(db, labId, standardId);
  const { entry, recipe } = await recipeOf(db, labId, standard.recipe.id, standard.recipe.version);
  const decision = await findDecision(db, standard.submissionId);
  const studies = [];
  for (const id of standard.evidenceStudyIds) studies.push(await studyEntry(db, labId, id, recipe.tolerances.magnitudeDb, entry));
  const recomputed = evidenceSha256(await evidenceDocument(db, labId, standard.recipe, standard.evidenceStudyIds, decision!.engine_version));
  const s = standard.scope;
  const stated = standard.purpose || `Approved processing standard of the lab for ${s.structureType}, ${s.band.lowHz}–${s.band.highHz} Hz, ${s.dampingPercent.min}–${s.dampingPercent.max} % damping, ${s.excitations.join(', ')} excitation.`;
  return {
    kind: 'standard',
    title: `Validation report: standard "${entry.name}" version ${entry.version}`,
    lab: await labOf(db, labId),
    purpose: purposeText(entry.name, entry.version, Math.max(...studies.map((x) => x.seedsPerScenario)), stated),
    scope: s,
    recipe: entry,
    studies,
    settings: settingsSummary(entry, recipe, await studySampleRates(db, standard.evidenceStudyIds)),
    justification: (await findSubmission(db, labId, standard.submissionId))?.justification ?? null,
    signature: standard.signature,
    standard: {
      id: standard.id,
      status: standard.status,
      effectiveAt: standard.effectiveAt,
      reviewDueAt: standard.reviewDueAt,
      supersedes: standard.supersedes?.id ?? null,
      supersededBy: standard.supersededBy?.id ?? null,
    },
    evidenceCheck: { recomputedSha256: recomputed, matchesSignature: recomputed === standard.signature.evidenceSha256 },
    engineVersion: ENGINE_VERSION,
    reproducibility: reproducibility(entry, studies),
    cautions: CAUTIONS,
  };
}
