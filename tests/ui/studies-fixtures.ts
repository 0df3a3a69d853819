/**
 * Fixtures for the evidence screens' UI tests: members of the invented demo lab, a study and its
 * results, a submission with its evidence, a standard, audit entries; and a fake API that matches
 * "METHOD /path" with the query string ignored (each call keeps its full URL for assertions).
 * Every fixture is parsed with the shared schemas, so a fixture that drifts from the API fails here.
 */
import type { MeResponse, Role } from '@/shared/api/auth';
import { evidenceSchema, standardSchema, submissionSchema } from '@/shared/api/approval';
import { auditEventSchema } from '@/shared/api/people';
import { studyResultsSchema, studySchema, type Study } from '@/shared/api/work';

export const LAB = 'lab-harbor-ridge';
export const lab = (rest: string) => `/api/v1/labs/${LAB}${rest}`;
const at = Date.UTC(2026, 10, 20, 9, 30);

export function meAs(role: Role, extraLabs: { labId: string; labName: string; role: Role }[] = []): MeResponse {
  const names: Record<Role, [string, string]> = {
    admin: ['user-admin', 'Mara Okafor'],
    analyst: ['user-analyst', 'Tomas Lindqvist'],
    reviewer: ['user-reviewer', 'Dana Whitcombe'],
    auditor: ['user-auditor', 'Felix Aranda'],
  };
  const [id, displayName] = names[role];
  return {
    user: { id, email: `${role}@harborridge.test`, displayName },
    memberships: [{ labId: LAB, labName: 'Harbor Ridge Test Lab', role }, ...extraLabs],
  };
}

const person = { id: 'user-analyst', displayName: 'Tomas Lindqvist' };

export function study(over: Partial<Study> = {}): Study {
  return studySchema.parse({
    id: 'study-1', labId: LAB, name: 'Arm burst check', status: 'finished',
    recipe: { id: 'recipe-arm', version: 1, name: 'Arm shaker, burst random' },
    scenarios: [
      { id: 'sc-burst', version: 1, name: 'Arm, burst random excitation', position: 0 },
      { id: 'sc-delay', version: 1, name: 'Arm, delay between the channels', position: 1 },
    ],
    seeds: 2, baseSeed: 1,
    progress: { status: 'finished', done: 4, failed: 0, total: 4, currentScenario: null, etaSeconds: null },
    engineVersion: '1.0.0', pass: false, error: null, createdBy: person, createdAt: at, startedAt: at, finishedAt: at + 5000, adaptive: null,
    ...over,
  });
}

export const runningStudy = (done: number) =>
  study({ status: 'running', pass: null, finishedAt: null, progress: { status: 'running', done, failed: 0, total: 4, currentScenario: { id: 'sc-delay', name: 'Arm, delay between the channels' }, etaSeconds: 75 } });

const criterion = (id: string, label: string, limit: number, observed: number, unit: string, pass: boolean) => ({ id, label, limit, observed, unit, pass, worstLineHz: 741 });
const scenarioResult = (scenarioId: string, name: string, pass: boolean, magnitude: number, phase: number) => ({
  scenarioId, scenarioVersion: 1, name, seeds: 2, failedRuns: 0, reference: 'linear-frf', referenceNote: null, warnings: [], plain: null, pass, adaptive: null,
  criteria: [
    criterion('magnitude-p95', 'Magnitude error, 95th percentile of |error|', 0.5, magnitude, 'dB', magnitude <= 0.5),
    criterion('phase-p95', 'Phase error, 95th percentile of |error|', 3, phase, '°', phase <= 3),
    criterion('min-coherence', 'Coherence, 5th percentile, lowest line', 0.95, pass ? 0.9999 : 0.02, '', pass),
  ],
  figures: { seeds: 2, lines: 3, overallCoverage: 0.93, overallPhaseCoverage: 0.9, medianRandomErrorRatio: 0.9 },
  modes: [],
  curves: { frequenciesHz: [300, 340, 380] },
});

export const results = studyResultsSchema.parse({
  studyId: 'study-1', status: 'finished', engineVersion: '1.0.0', pass: false, error: null,
  scenarios: [scenarioResult('sc-burst', 'Arm, burst random excitation', true, 0.0267, 0.229), scenarioResult('sc-delay', 'Arm, delay between the channels', false, 9.54, 179.8)],
});

const scope = { structureType: 'drone motor arm', band: { lowHz: 200, highHz: 1000 }, dampingPercent: { min: 0.5, max: 1.2 }, excitations: ['burst-random'] };

/** The demo reviewer as a signer: added by the operator (the seed). */
export const signer = {
  id: 'user-reviewer', displayName: 'Dana Whitcombe', email: 'reviewer@harborridge.test',
  origin: { kind: 'operator', invitedBy: null, invitedAt: null, joinedAt: at, text: 'added by the operator (seeded or created outside Plumbline) on 2026-11-20, not by an invitation' },
};
const rule = 'No one may decide a review who submitted it, wrote any version of its recipe or started a study of its evidence; an admin cannot give itself a role that decides reviews, and an account that held the admin role in this lab within the last 30 days cannot decide one.';

export function submission(over: Record<string, unknown> = {}) {
  return submissionSchema.parse({
    id: 'sub-1', labId: LAB, recipe: { id: 'recipe-arm', version: 1, name: 'Arm shaker, burst random', state: 'in_review', latestVersion: 1 },
    stale: false, scope, purpose: 'Shaker standard for the motor arm', justification: null,
    studies: [{ id: 'study-1', name: 'Arm burst check', pass: true }],
    coverage: { covered: true, checks: [{ id: 'band-in-recipe', ok: true, detail: "scope band 200–1000 Hz lies inside the recipe's band" }] },
    failingCriteria: [], submittedBy: person, submittedAt: at, status: 'pending', decision: null, standardId: null, blockedForYou: [],
    viewer: { id: signer.id, displayName: signer.displayName, email: signer.email }, rule,
    ...over,
  });
}

export const evidence = (sub = submission()) =>
  evidenceSchema.parse({
    submission: sub, recipeDefinition: { estimator: 'H1' },
    studies: [{ id: 'study-1', name: 'Arm burst check', engineVersion: '1.0.0', seeds: 2, baseSeed: 1, pass: true, reportPath: '/reports/study/study-1',
      scenarios: [{ id: 'sc-burst', version: 1, name: 'Arm, burst random excitation', pass: true, warnings: [], criteria: results.scenarios[0].criteria }] }],
  });

export const decided = () =>
  submission({
    status: 'approved', standardId: 'std-1',
    decision: { id: 'dec-1', decision: 'approved', reviewer: { id: 'user-reviewer', displayName: 'Dana Whitcombe' }, signer, meaning: 'Approved as the lab standard for the arm', comment: '', reason: null,
      decidedAt: at + 60_000, engineVersion: '1.0.0', evidenceSha256: 'a'.repeat(64), signatureSha256: 'b'.repeat(64) },
  });

export const standard = (over: Record<string, unknown> = {}) =>
  standardSchema.parse({
    id: 'std-1', labId: LAB, recipe: { id: 'recipe-arm', version: 1, name: 'Arm shaker, burst random' }, scope, purpose: 'Shaker standard',
    effectiveAt: at, reviewDueAt: at + 365 * 86_400_000, status: 'active', supersedes: null, supersededBy: null, ended: null,
    signature: { reviewer: { id: 'user-reviewer', displayName: 'Dana Whitcombe' }, signer, rule, meaning: 'Approved as the lab standard for the arm', comment: '', signedAt: at, engineVersion: '1.0.0', evidenceSha256: 'a'.repeat(64), signatureSha256: 'b'.repeat(64) },
    submissionId: 'sub-1', evidenceStudyIds: ['study-1'],
    ...over,
  });

export const auditEvent = (id: number, action: string) =>
  auditEventSchema.parse({ id, labId: LAB, actor: { userId: 'user-analyst', displayName: 'Tomas Lindqvist', email: 'analyst@harborridge.test' }, action, targetType: 'study', targetId: 'study-1', before: null, after: { status: 'finished' }, at: at + id, prevHash: id > 1 ? 'c'.repeat(64) : null, hash: 'd'.repeat(64) });

export const page = <T>(items: T[]) => ({ items, total: items.length, limit: 50, offset: 0 });

type Answer = { status: number; body?: unknown };
type Handler = Answer | ((request: { url: string; body: unknown }) => Answer);
export type Call = { method: string; url: string; path: string; query: URLSearchParams; body: unknown };

/** A fake server behind fetch, matched on method and path (query ignored). */
export function installEvidenceApi(routes: Record<string, Handler>) {
  const calls: Call[] = [];
  globalThis.fetch = jest.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const method = (init.method ?? 'GET').toUpperCase();
    const url = String(input);
    const [path, query = ''] = url.split('?');
    const body = typeof init.body === 'string' ? JSON.parse(init.body) : undefined;
    calls.push({ method, url, path, query: new URLSearchParams(query), body });
    const handler = routes[`${method} ${path}`];
    const answer: Answer = handler ? (typeof handler === 'function' ? handler({ url, body }) : handler) : { status: 404, body: { error: { code: 'not_found', message: `No route ${method} ${path}` } } };
    const text = answer.body === undefined ? '' : JSON.stringify(answer.body);
    return { ok: answer.status >= 200 && answer.status < 300, status: answer.status, text: async () => text };
  }) as unknown as typeof fetch;
  return { calls, called: (method: string, path: string) => calls.filter((c) => c.method === method && c.path === path) };
}

export const session = (me: MeResponse) => ({ 'GET /api/v1/auth/session': { status: 200, body: { me } } });
export const ok = (body: unknown) => ({ status: 200, body });
