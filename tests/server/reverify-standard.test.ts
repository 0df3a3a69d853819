/**
 * Re-verification over HTTP: an approved standard's evidence re-run on today's engine and compared
 * line by line with the stored results. Unchanged engine and data: "identical" on every line. A
 * stored value nudged by 1e-14 (relative): "within-tolerance". A stored curve value or criterion
 * altered with raw SQL: "changed", naming the quantity, the frequency and the largest change.
 * Each outcome lands in the audit trail.
 */
import { blobToFloat64, float64ToBlob } from '@/server/db/float-blob';
import { MAX_REVERIFY_RUNS } from '@/server/services/reverify';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { auditSince, createWork, finishedStudy, frameScope, lastAuditId, signInAll, type Agents, type WorkIds } from './approval-fixtures';

let t: TestServer;
let as: Agents;
let w: WorkIds;
let studyId: string;
let standardId: string;
let url: string;

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
  w = await createWork(t, as.analyst);
  studyId = await finishedStudy(as.analyst, w, 1);
  const sub = await as.analyst.post(`${w.lab}/reviews`).send({ recipe: { id: w.recipe, version: 1 }, studyIds: [studyId], scope: frameScope }).expect(201);
  const ok = await as.reviewer.post(`${w.lab}/reviews/${sub.body.id}/decision`).send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames' }).expect(200);
  standardId = ok.body.standardId;
  url = `${w.lab}/standards/${standardId}/reverify`;
}, 60_000);
afterAll(() => t.close());

/** The stored curve of the first scenario, and a function that writes it back changed. */
async function storedCurve(kind: string) {
  const scenarioId = w.scenarios[0]!;
  const where = { study_id: studyId, scenario_id: scenarioId, kind };
  const values = blobToFloat64((await t.db('result_curves').where(where).first('data')).data);
  return {
    values,
    write: (v: Float64Array) => t.db('result_curves').where(where).update({ data: float64ToBlob(v) }),
  };
}

describe('re-verification', () => {
  it('is for analysts and the admin; reviewers and auditors are refused', async () => {
    for (const role of ['reviewer', 'auditor'] as const) expect((await as[role].post(url).expect(403)).body.error.code).toBe('forbidden');
    await as.analyst.post(`${w.lab}/standards/no-such-standard/reverify`).expect(404);
  });

  it('reports "identical" on every line for an unchanged engine and unchanged data', async () => {
    const before = await lastAuditId(t);
    const res = await as.analyst.post(url).expect(200);
    expect(res.body).toMatchObject({ standardId, engineVersion: ENGINE_VERSION, storedEngineVersions: [ENGINE_VERSION], verdict: 'identical', tolerance: 1e-12, runs: 4, largestChange: null });
    const curves = await t.db('result_curves').where({ study_id: studyId }).count({ n: '*' }).first();
    // One line per stored curve, plus pass, criteria, modes and figures for each of the two scenarios.
    expect(res.body.lines).toHaveLength(Number(curves!.n) + 2 * 4);
    expect(res.body.lines.every((l: { verdict: string; maxDifference: number }) => l.verdict === 'identical' && l.maxDifference === 0)).toBe(true);
    const mean = res.body.lines.find((l: { quantity: string; scenario: string }) => l.quantity === 'meanMagnitudeDb' && l.scenario === 'SDOF 50 Hz at 2 % damping');
    expect(mean.values).toBe((await storedCurve('meanMagnitudeDb')).values.length);
    const events = (await auditSince(t, before)).filter((e) => e.action === 'standards.reverify');
    expect(events).toHaveLength(1);
    expect(JSON.parse(events[0]!.after_json!)).toMatchObject({ verdict: 'identical', engineVersion: ENGINE_VERSION, runs: 4, changedLines: 0, largestChange: null });
  }, 30_000);

  it('reports "within-tolerance" when a stored value differs by 1e-14 of itself', async () => {
    const curve = await storedCurve('meanCoherence');
    const nudged = Float64Array.from(curve.values);
    nudged[7] = nudged[7]! * (1 + 1e-14);
    expect(nudged[7]).not.toBe(curve.values[7]);
    await curve.write(nudged);
    try {
      const res = await as.admin.post(url).expect(200);
      expect(res.body.verdict).toBe('within-tolerance');
      const line = res.body.lines.find((l: { verdict: string }) => l.verdict !== 'identical');
      expect(line).toMatchObject({ quantity: 'meanCoherence', scenario: 'SDOF 50 Hz at 2 % damping', verdict: 'within-tolerance' });
      expect(line.maxDifference).toBeCloseTo(Math.abs(nudged[7]! - curve.values[7]!), 20);
    } finally {
      await curve.write(curve.values);
    }
  }, 30_000);

  it('reports "changed" with the largest change when a stored curve value is altered', async () => {
    const curve = await storedCurve('meanMagnitudeDb');
    const freqs = (await storedCurve('frequenciesHz')).values;
    const altered = Float64Array.from(curve.values);
    altered[40] = altered[40]! + 0.05;
    altered[90] = altered[90]! - 0.002;
    await curve.write(altered);
    const before = await lastAuditId(t);
    try {
      const res = await as.analyst.post(url).expect(200);
      expect(res.body.verdict).toBe('changed');
      expect(res.body.largestChange).toMatchObject({ studyId, scenario: 'SDOF 50 Hz at 2 % damping', quantity: 'meanMagnitudeDb', frequencyHz: freqs[40], stored: altered[40], recomputed: curve.values[40] });
      expect(res.body.largestChange.difference).toBeCloseTo(0.05, 12);
      const changed = res.body.lines.filter((l: { verdict: string }) => l.verdict !== 'identical');
      expect(changed).toEqual([expect.objectContaining({ quantity: 'meanMagnitudeDb', verdict: 'changed', atHz: freqs[40] })]);
      const event = (await auditSince(t, before)).find((e) => e.action === 'standards.reverify')!;
      expect(JSON.parse(event.after_json!)).toMatchObject({ verdict: 'changed', changedLines: 1, largestChange: { quantity: 'meanMagnitudeDb' } });
    } finally {
      await curve.write(curve.values);
    }
  }, 30_000);

  it('reports "changed" when a stored criterion is altered, naming the field', async () => {
    const row = await t.db('studies').where({ id: studyId }).first('summary');
    const summary = JSON.parse(row.summary);
    const original = summary.scenarios[1].judged.criteria[0].observed as number;
    summary.scenarios[1].judged.criteria[0].observed = original * 2;
    await t.db('studies').where({ id: studyId }).update({ summary: JSON.stringify(summary) });
    try {
      const res = await as.analyst.post(url).expect(200);
      expect(res.body.verdict).toBe('changed');
      expect(res.body.largestChange).toMatchObject({ scenario: 'SDOF 50 Hz at 1 % damping', quantity: 'criteria.0.observed', stored: original * 2, recomputed: original, frequencyHz: null });
      expect(res.body.largestChange.difference).toBeCloseTo(original, 12);
    } finally {
      await t.db('studies').where({ id: studyId }).update({ summary: row.summary });
    }
    expect((await as.analyst.post(url).expect(200)).body.verdict).toBe('identical');
  }, 30_000);

  it(`refuses evidence of more than ${MAX_REVERIFY_RUNS} runs instead of blocking the server`, async () => {
    await t.db('studies').where({ id: studyId }).update({ seeds: 201 });
    try {
      const res = await as.analyst.post(url).expect(422);
      expect(res.body.error).toMatchObject({ code: 'too_large_to_reverify', message: expect.stringContaining(`holds 402 runs; re-verification in the request is limited to ${MAX_REVERIFY_RUNS}`) });
    } finally {
      await t.db('studies').where({ id: studyId }).update({ seeds: 2 });
    }
  });

  it('leaves the audit chain verifying', async () => {
    expect((await as.auditor.get(`/api/v1/labs/${t.labId}/audit/verify`).expect(200)).body.ok).toBe(true);
  });
});
