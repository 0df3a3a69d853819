/**
 * One controlled report per standard: made twice it keeps its id, revision and hash (JSON and
 * PDF alike); retiring the standard changes its content and appends revision 2, naming what
 * changed; the stored revisions and the audit trail say the same. The standard and the review's
 * evidence carry the signed recipe version's settings (Δf at the evidence's 512 Hz: 0.25 Hz).
 * Retiring without a reason is a 400 whose message is the plain sentence, naming the reason field
 * in its details; nothing is retired.
 */
import { approvedStandard, createWork, frameRecipe, signInAll, type Agents, type WorkIds } from './approval-fixtures';
import { startTestServer, type TestServer } from './helpers';

let t: TestServer;
let as: Agents;
let w: WorkIds;
let standardId: string;
let submissionId: string;

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
  w = await createWork(t, as.analyst);
  ({ standardId, submissionId } = await approvedStandard(as, w));
}, 60_000);
afterAll(() => t.close());

const reportOf = (agent = as.auditor) => agent.get(`${w.lab}/standards/${standardId}/report`).expect(200);

describe('the settings of the signed version', () => {
  it('are on the standard and on the review, with Δf at the evidence sample rate', async () => {
    const standard = (await as.auditor.get(`${w.lab}/standards/${standardId}`).expect(200)).body;
    const evidence = (await as.auditor.get(`${w.lab}/reviews/${submissionId}/evidence`).expect(200)).body;
    for (const settings of [standard.settings, evidence.settings]) {
      expect(settings.recipe).toEqual({ id: w.recipe, version: 1, name: 'Hann 2048, H1, frames' });
      const row = (id: string) => settings.rows.find((r: { id: string }) => r.id === id);
      expect(row('line-spacing-512')).toMatchObject({ value: '0.25', unit: 'Hz' }); // 512 Hz / 2048
      expect(row('window')).toMatchObject({ value: 'Hann' });
      expect(row('overlap')).toMatchObject({ value: '50', unit: '%' });
      expect(row('magnitude-p95')).toMatchObject({ value: '≤ 1.5', unit: 'dB', group: 'criteria' });
    }
  });
});

describe("a standard's controlled report", () => {
  let first: { report: { id: string; sha256: string; revision: number; revisionId: string; revisions: unknown[] } };

  it('keeps its id, revision and hash when made again, by anyone, and the PDF carries the same', async () => {
    first = (await reportOf()).body;
    expect(first.report.revision).toBe(1);
    const again = (await reportOf(as.analyst)).body;
    expect(again.report).toMatchObject({ id: first.report.id, revision: 1, sha256: first.report.sha256, revisionId: first.report.revisionId });
    const pdf = await as.auditor.get(`${w.lab}/standards/${standardId}/report.pdf`).expect(200);
    expect(pdf.headers['x-report-id']).toBe(first.report.id);
    expect(pdf.headers['x-report-sha256']).toBe(first.report.sha256);
    expect(pdf.headers['x-report-revision']).toBe('1');
    const rows = await t.db('reports').where({ kind: 'standard', target_id: standardId });
    expect(rows).toHaveLength(1);
  });

  it('gets revision 2, naming what changed, when the standard is retired', async () => {
    await as.admin.post(`${w.lab}/standards/${standardId}/retire`).send({ reason: 'The frame programme has ended' }).expect(200);
    const after = (await reportOf()).body;
    expect(after.content.standard.status).toBe('retired');
    expect(after.report).toMatchObject({ id: first.report.id, revision: 2 });
    expect(after.report.sha256).not.toBe(first.report.sha256);
    expect(after.report.changes).toEqual(expect.arrayContaining(['recipe version state: approved → retired', 'standard status: active → retired']));
    expect(after.report.revisions.map((r: { revision: number; sha256: string }) => [r.revision, r.sha256])).toEqual([[1, first.report.sha256], [2, after.report.sha256]]);
    // A filed copy of revision 1 is still found by its revision id, as revision 1.
    const filed = (await as.auditor.get(`${w.lab}/reports/${first.report.revisionId}`).expect(200)).body;
    expect(filed).toMatchObject({ id: first.report.id, revision: 1, sha256: first.report.sha256 });
    const stored = await t.db('reports').where({ kind: 'standard', target_id: standardId }).orderBy('revision');
    expect(stored.map((r: { revision: number }) => r.revision)).toEqual([1, 2]);
    expect(JSON.parse(stored[1].content_json).standard.status).toBe('retired');
    const audit = await t.db('audit_events').where({ action: 'reports.revise', target_id: first.report.id });
    expect(audit).toHaveLength(1);
    // And made again, it stays at revision 2.
    expect((await reportOf(as.reviewer)).body.report).toMatchObject({ revision: 2, sha256: after.report.sha256 });
  });

  it('shows the retired standard on the review as well', async () => {
    const sub = (await as.analyst.get(`${w.lab}/reviews/${submissionId}`).expect(200)).body;
    expect(sub).toMatchObject({ standardId, standardStatus: 'retired' });
  });
});

describe('retiring needs a reason', () => {
  let other: string;

  beforeAll(async () => {
    other = (await approvedStandard(as, await createWork(t, as.analyst, frameRecipe('Frame recipe for the retire checks')))).standardId;
  }, 60_000);

  it.each([
    ['an empty reason', { reason: '' }],
    ['a reason of blanks', { reason: '            ' }],
    ['a short reason', { reason: 'old' }],
    ['no reason at all', {}],
  ])('%s is refused in plain words naming the field, and nothing is retired', async (_what, body) => {
    const res = await as.admin.post(`${w.lab}/standards/${other}/retire`).send(body).expect(400);
    const words = 'Give the reason for retiring it (at least 10 characters)';
    expect(res.body.error).toEqual({ code: 'invalid_request', message: words, details: { fields: [{ path: 'reason', message: words }] } });
    expect((await as.admin.get(`${w.lab}/standards/${other}`).expect(200)).body.status).toBe('active');
  });
});
