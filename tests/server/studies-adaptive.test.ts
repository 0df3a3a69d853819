/**
 * Adaptive studies over HTTP (JCGM 101:2008 §7.9): the option is stored with the study, the
 * scheduler runs batches of seeds in the seed rule's order until each scenario's criteria are
 * stable (or the maximum), the results say how many seeds each scenario took and why it stopped,
 * and every criterion carries its decision rule, Monte Carlo uncertainty and false-accept
 * probability. The same study definition run twice gives the same seeds and the same figures.
 */
import { startTestServer, type TestServer } from './helpers';
import { smallRecipe, smallScenario, waitForStudy } from './work-fixtures';
import type request from 'supertest';

let t: TestServer;
let analyst: request.Agent;
let lab: string;
const ids: Record<string, string> = {};

beforeAll(async () => {
  t = await startTestServer();
  analyst = await t.signIn('analyst');
  lab = `/api/v1/labs/${t.labId}`;
  const post = async (kind: string, definition: unknown) => (await analyst.post(`${lab}/${kind}`).send({ definition }).expect(201)).body.id as string;
  ids.noisy = await post('scenarios', smallScenario());
  // Limits of one significant digit (10 dB, 20°, 0.5): δ = 5 dB, 5°, 0.05 at n_dig = 1.
  const base = smallRecipe('Hann 256, guard band on magnitude');
  ids.recipe = await post('recipes', { ...base, tolerances: { ...base.tolerances, magnitudeDb: 10 }, decisionRules: { 'magnitude-p95': { kind: 'guard-band', factor: 1 } } });
}, 30_000);
afterAll(() => t.close());

async function runAdaptive(name: string, significantDigits: number) {
  const res = await analyst
    .post(`${lab}/studies`)
    .send({ name, recipe: { id: ids.recipe }, scenarios: [{ id: ids.noisy }], seeds: 12, adaptive: { batchSize: 3, significantDigits } })
    .expect(202);
  expect(res.body.adaptive).toEqual({ batchSize: 3, significantDigits });
  const done = await waitForStudy(analyst, `${lab}/studies/${res.body.id}`);
  expect(done.status).toBe('finished');
  const results = (await analyst.get(`${lab}/studies/${res.body.id}/results`).expect(200)).body;
  const runs = (await analyst.get(`${lab}/studies/${res.body.id}/runs`).expect(200)).body.items as { seedIndex: number; seed: number }[];
  return { study: done, results, runs };
}

describe('adaptive studies', () => {
  it('stops a loose tolerance early as stable, in whole batches, with the seeds of the rule', async () => {
    const { study, results, runs } = await runAdaptive('Adaptive, one digit', 1);
    const s = results.scenarios[0];
    expect(s.adaptive.stop).toBe('stable');
    expect(s.adaptive.seedsUsed).toBe(s.seeds);
    expect(s.seeds % 3).toBe(0);
    expect(s.seeds).toBeGreaterThanOrEqual(6);
    expect(s.seeds).toBeLessThan(12);
    expect(runs.map((r) => r.seed)).toEqual(Array.from({ length: s.seeds }, (_, i) => 1 + i));
    expect((study.progress as { total: number }).total).toBe(s.seeds);
    for (const c of s.adaptive.criteria) expect(2 * c.batchMeanSd).toBeLessThan(c.tolerance);
  }, 120_000);

  it('runs a tight tolerance to the maximum and says so; criteria carry rule, u, U, w and risk', async () => {
    const { results } = await runAdaptive('Adaptive, four digits', 4);
    const s = results.scenarios[0];
    expect(s.adaptive).toMatchObject({ stop: 'max-seeds', seedsUsed: 12 });
    const p95 = s.criteria.find((c: { id: string }) => c.id === 'magnitude-p95');
    expect(p95.rule).toEqual({ kind: 'guard-band', factor: 1 });
    expect(p95.uncertainty).toBeGreaterThan(0);
    expect(p95.expandedUncertainty).toBeCloseTo(2 * p95.uncertainty, 12);
    expect(p95.guardBand).toBeCloseTo(p95.expandedUncertainty, 12);
    expect(p95.acceptanceLimit).toBeCloseTo(p95.limit - p95.guardBand, 12);
    expect(p95.pass).toBe(p95.decision === 'pass');
    const bias = s.criteria.find((c: { id: string }) => c.id === 'magnitude-bias');
    expect(bias.rule).toEqual({ kind: 'simple' });
    expect(bias.guardBand).toBe(0);
    expect(s.figures.overallCoverageSe).toBeGreaterThan(0);
    expect(s.curves.meanMagnitudeDbSe).toHaveLength(s.curves.frequenciesHz.length);
  }, 120_000);

  it('refuses a batch larger than the maximum', async () => {
    await analyst
      .post(`${lab}/studies`)
      .send({ name: 'x', recipe: { id: ids.recipe }, scenarios: [{ id: ids.noisy }], seeds: 4, adaptive: { batchSize: 5, significantDigits: 2 } })
      .expect(400);
  });
});
