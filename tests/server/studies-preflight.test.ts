/**
 * The pre-flight check at the API: a study whose recipe cannot run on one of its scenarios is
 * refused with 422 in plain words (scenario, setting, fix) and leaves nothing behind — no study
 * row, no audit entry, no mail; a warned pair starts, and its warnings are stored with the study
 * and returned with it. The live check answers the same findings without storing anything.
 * Figures: Nyquist = fs/2 (sampling theorem); 64 s at 512 Hz = 32 768 samples.
 */
import type request from 'supertest';
import { startTestServer, type TestServer } from './helpers';
import { smallRecipe, smallScenario, waitForStudy } from './work-fixtures';

let t: TestServer;
let analyst: request.Agent;
let lab: string;
const ids: Record<string, string> = {};

beforeAll(async () => {
  t = await startTestServer();
  analyst = await t.signIn('analyst');
  lab = `/api/v1/labs/${t.labId}`;
  const post = async (kind: string, definition: unknown) => (await analyst.post(`${lab}/${kind}`).send({ definition }).expect(201)).body.id as string;
  ids.short = await post('scenarios', smallScenario('SDOF 50 Hz, 512 Hz, 8 s'));
  ids.long = await post('scenarios', { ...smallScenario('SDOF 50 Hz, 512 Hz, 64 s'), acquisition: { sampleRateHz: 512, durationS: 64 } });
  ids.wideBand = await post('recipes', { ...smallRecipe('Band to 900 Hz'), band: { lowHz: 30, highHz: 900 } });
  ids.hugeBlock = await post('recipes', { ...smallRecipe('Block of 65 536 samples'), blockLength: 65536 });
  ids.pastForce = await post('recipes', { ...smallRecipe('Band past the force'), band: { lowHz: 10, highHz: 250 } });
}, 30_000);
afterAll(() => t.close());

async function counts() {
  const one = async (table: string) => Number(((await t.db(table).count({ n: '*' }).first()) as { n: number }).n);
  return { studies: await one('studies'), audit: await one('audit_events'), outbox: await one('mail_outbox'), jobs: await one('jobs') };
}

describe('a study that cannot run', () => {
  it('band above Nyquist: 422 naming the scenario, the band and the fix; nothing stored', async () => {
    const before = await counts();
    const res = await analyst
      .post(`${lab}/studies`)
      .send({ name: 'Too wide', recipe: { id: ids.wideBand }, scenarios: [{ id: ids.short }], seeds: 4 })
      .expect(422);
    expect(res.body.error.code).toBe('study_cannot_run');
    expect(res.body.error.message).toBe(
      'The recipe "Band to 900 Hz" cannot run on the scenario "SDOF 50 Hz, 512 Hz, 8 s": The recipe\'s band reaches 900 Hz, above the scenario\'s Nyquist frequency of 256 Hz. Lower the band\'s upper edge to 256 Hz or less, or raise the scenario\'s sample rate above 1800 Hz.',
    );
    expect(res.body.error.details.refusals.map((f: { code: string; setting: string }) => [f.code, f.setting])).toEqual([['band-above-nyquist', 'band']]);
    expect(await counts()).toEqual(before);
  });

  it('a 65 536-sample block on a 32 768-sample record: 422, nothing stored, for any scenario of the study that refuses', async () => {
    const before = await counts();
    const res = await analyst
      .post(`${lab}/studies`)
      .send({ name: 'Too long a block', recipe: { id: ids.hugeBlock }, scenarios: [{ id: ids.long }, { id: ids.short }], seeds: 2 })
      .expect(422);
    expect(res.body.error.message).toMatch(/^The recipe "Block of 65 536 samples" cannot run on the scenario "SDOF 50 Hz, 512 Hz, 64 s": The recipe's block of 65 536 samples \(128 s\) is longer than the scenario's record of 32 768 samples \(64 s\)\./);
    expect(res.body.error.message).toContain('There is 1 more problem to fix first.');
    expect(res.body.error.details.refusals.map((f: { scenario: { name: string } }) => f.scenario.name)).toEqual(['SDOF 50 Hz, 512 Hz, 64 s', 'SDOF 50 Hz, 512 Hz, 8 s']);
    expect(await counts()).toEqual(before);
    expect(t.mail().filter((m) => m.subject.includes('Too long a block'))).toEqual([]);
  });
});

describe('a warned pair', () => {
  it('the live check answers the warnings and stores nothing', async () => {
    const before = await counts();
    const res = await analyst.post(`${lab}/studies/preflight`).send({ recipe: { id: ids.pastForce }, scenarios: [{ id: ids.short }] }).expect(200);
    expect(res.body.refusals).toEqual([]);
    expect(res.body.warnings.map((f: { code: string }) => f.code)).toEqual(['band-outside-excitation']);
    expect(res.body.warnings[0]).toMatchObject({ scenario: { id: ids.short, version: 1, name: 'SDOF 50 Hz, 512 Hz, 8 s' }, severity: 'warning', setting: 'band' });
    expect(await counts()).toEqual(before);
  });

  it('starts, runs, and keeps its warnings with the study', async () => {
    const res = await analyst
      .post(`${lab}/studies`)
      .send({ name: 'Band past the force', recipe: { id: ids.pastForce }, scenarios: [{ id: ids.short }], seeds: 1 })
      .expect(202);
    expect(res.body.warnings.map((f: { code: string }) => f.code)).toEqual(['band-outside-excitation']);
    expect(res.body.warnings[0].message).toContain('the lines in 200–250 Hz carry no force');
    const study = await waitForStudy(analyst, `${lab}/studies/${res.body.id}`);
    expect(study).toMatchObject({ status: 'finished' });
    expect((study as unknown as { warnings: { code: string }[] }).warnings.map((f) => f.code)).toEqual(['band-outside-excitation']);
    const row = await t.db('studies').where({ id: res.body.id }).first();
    expect(JSON.parse(row.preflight_warnings).map((f: { code: string }) => f.code)).toEqual(['band-outside-excitation']);
  }, 60_000);
});
