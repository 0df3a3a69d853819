/**
 * Validation reports over HTTP: the JSON of the printable page (contents, exact FRF against the
 * textbook SDOF receptance, PASS/FAIL in words, the brief's cautions), the report registry (its id
 * and the sha256 of the canonical content, stable while the data are), and the PDF made on the
 * server — parsed back with pdf-parse to find the key figures, with the shipped fonts embedded and
 * the plots drawn as vector paths — for a study and for an approved standard, whose report also
 * says whether the stored evidence still hashes to the signed value.
 */
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import zlib from 'node:zlib';
import type request from 'supertest';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { createOtherLab, startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { auditSince, createWork, finishedStudy, frameScope, lastAuditId, signInAll, type Agents, type WorkIds } from './approval-fixtures';

let t: TestServer;
let as: Agents;
let w: WorkIds;
let studyId: string;
let standardId: string;
let auditStart: number;

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
  w = await createWork(t, as.analyst);
  studyId = await finishedStudy(as.analyst, w, 1, { seeds: 3, name: 'Frame evidence, three seeds' });
  const sub = await as.analyst.post(`${w.lab}/reviews`).send({ recipe: { id: w.recipe, version: 1 }, studyIds: [studyId], scope: frameScope, purpose: 'Qualify the lab method for single-mode frames.' }).expect(201);
  const ok = await as.reviewer
    .post(`${w.lab}/reviews/${sub.body.id}/decision`)
    .send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames, 30–80 Hz', comment: 'Read in full.' })
    .expect(200);
  standardId = ok.body.standardId;
  auditStart = await lastAuditId(t);
}, 60_000);
afterAll(() => t.close());

/** JSON with object keys sorted at every level: written here, independently of the server's. */
function sortedJson(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(sortedJson).join(',')}]`;
  if (v && typeof v === 'object') {
    const entries = Object.entries(v as Record<string, unknown>).filter(([, x]) => x !== undefined).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, x]) => `${JSON.stringify(k)}:${sortedJson(x)}`).join(',')}}`;
  }
  return JSON.stringify(v);
}
const sha256 = (s: string | Buffer) => createHash('sha256').update(s).digest('hex');
const pdfOf = (agent: request.Agent, url: string) =>
  agent.get(url).buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on('data', (c: Buffer) => chunks.push(c));
    res.on('end', () => cb(null, Buffer.concat(chunks)));
  });
/**
 * The text of a PDF, read back by pdf-parse. pdf-parse (pdf.js) loads its worker with a dynamic
 * import, which jest's CommonJS runtime refuses, so it runs in a plain node process.
 */
const PARSE = `const { PDFParse } = require('pdf-parse');
const p = new PDFParse({ data: new Uint8Array(require('fs').readFileSync(process.argv[1])) });
p.getText().then((r) => { process.stdout.write(JSON.stringify({ text: r.text, pages: r.total })); return p.destroy(); });`;
async function textOf(pdf: Buffer): Promise<{ text: string; pages: number }> {
  const file = path.join(os.tmpdir(), `plumbline-report-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, pdf);
  try {
    const { stdout } = await promisify(execFile)(process.execPath, ['-e', PARSE, file], { cwd: path.resolve(__dirname, '../..'), maxBuffer: 64 << 20 });
    const r = JSON.parse(stdout) as { text: string; pages: number };
    return { text: r.text.replace(/\s+/g, ' '), pages: r.pages };
  } finally {
    fs.rmSync(file, { force: true });
  }
}
/** Every content stream of the PDF, inflated. */
function contentStreams(pdf: Buffer): string {
  const raw = pdf.toString('latin1');
  const out: string[] = [];
  for (const m of raw.matchAll(/\/FlateDecode[^]*?>>\s*stream\r?\n/g)) {
    const start = m.index! + m[0].length;
    const end = raw.indexOf('endstream', start);
    try {
      out.push(zlib.inflateSync(pdf.subarray(start, end)).toString('latin1'));
    } catch {
      // a font or image stream that is not plain deflate text: not a page's content
    }
  }
  return out.join('\n');
}

describe("a study's report (JSON for the printable page)", () => {
  let body: { report: Record<string, unknown>; content: Record<string, any> }; // eslint-disable-line @typescript-eslint/no-explicit-any

  beforeAll(async () => {
    body = (await as.auditor.get(`${w.lab}/reports/study/${studyId}`).expect(200)).body;
  });

  it('holds scope and purpose, the recipe, the scenarios with seeds, the criteria and the signature', () => {
    const c = body.content;
    expect(c).toMatchObject({ kind: 'study', title: 'Validation report: study "Frame evidence, three seeds"', scope: frameScope, engineVersion: ENGINE_VERSION });
    expect(c.purpose).toMatch(/^Qualify the lab method for single-mode frames\.\n\nShows how the processing recipe "Hann 2048, H1, frames" version 1/);
    expect(c.recipe).toMatchObject({ id: w.recipe, version: 1, state: 'approved', author: { displayName: 'Tomas Lindqvist' }, definition: { blockLength: 2048 } });
    const [study] = c.studies;
    expect(study).toMatchObject({ id: studyId, seedsPerScenario: 3, baseSeed: 1, pass: true, engineVersion: ENGINE_VERSION });
    expect(study.scenarios.map((s: { seeds: string }) => s.seeds)).toEqual(['seeds 1–3 (3 seeds)', 'seeds 1000001–1000003 (3 seeds)']); // seed rule: base + position·1e6 + run
    expect(study.scenarios[0]).toMatchObject({ system: 'single degree of freedom; receptance in m/N; 1 mode(s): 50 Hz at 2 %', excitation: 'random, 0–200 Hz, 1 N RMS', errorSources: ['noise on the response channel: SNR 60 dB'], verdict: 'PASS' });
    expect(study.scenarios[0].criteria.map((x: { verdict: string }) => x.verdict)).toEqual(['PASS', 'PASS', 'PASS', 'PASS']);
    expect(c.settings.recipe).toEqual({ id: w.recipe, version: 1, name: 'Hann 2048, H1, frames' });
    expect(c.settings.rows).toContainEqual(expect.objectContaining({ group: 'criteria', label: 'Coherence, 5th percentile over seeds, worst line', value: '≥ 0.5', unit: '' }));
    expect(c.settings.rows).toContainEqual(expect.objectContaining({ id: 'block-length', value: '2048', unit: 'samples' }));
    expect(c.signature).toMatchObject({ reviewer: { displayName: 'Dana Whitcombe' }, meaning: 'Approved as lab standard for single-mode frames, 30–80 Hz', comment: 'Read in full.' });
    expect(c.reproducibility).toContain(`on engine version ${ENGINE_VERSION}`);
    // The cautions of the product brief, word for word.
    expect(c.cautions).toEqual([
      "Synthetic verification checks the processing, not the transducers, the fixture or the test set-up: it does not replace calibration, the lab's accredited procedures or engineering judgement.",
      "Shaker and impact testing involve moving masses and high forces; follow the lab's safety rules and local codes.",
      "Approval in Plumbline records the lab's decision; responsibility stays with the lab's licensed or authorised staff.",
    ]);
  });

  it('plots the exact FRF as the textbook SDOF receptance, and an estimate within the tolerance of it', () => {
    // |H(f)| = 1/sqrt((k − mω²)² + (cω)²), m = k/ωn², c = 2ζ·sqrt(k·m) (S. S. Rao, Mechanical Vibrations).
    const k = 1e4;
    const wn = 2 * Math.PI * 50;
    const m = k / wn ** 2;
    for (const [i, zeta] of [0.02, 0.01].entries()) {
      const plot = body.content.studies[0].scenarios[i].plot;
      const c = 2 * zeta * Math.sqrt(k * m);
      expect(plot.unit).toBe('m/N');
      expect(plot.frequenciesHz.length).toBe(plot.exactMagnitude.length);
      expect(plot.frequenciesHz.length).toBeGreaterThan(100);
      plot.frequenciesHz.forEach((f: number, j: number) => {
        const w2 = 2 * Math.PI * f;
        const textbook = 1 / Math.hypot(k - m * w2 * w2, c * w2);
        expect(Math.abs(plot.exactMagnitude[j] / textbook - 1)).toBeLessThan(1e-9);
        // Rebuilt from the mean error: within the recipe's 1.5 dB, as the magnitude-bias criterion passed.
        expect(Math.abs(20 * Math.log10(plot.estimatedMagnitude[j] / plot.exactMagnitude[j]))).toBeLessThanOrEqual(1.5);
      });
      expect(plot.toleranceDb).toBe(1.5);
    }
  });

  it('is registered under the sha256 of its canonical content, and keeps its id while the data stay', async () => {
    expect(body.report).toMatchObject({ kind: 'study', targetId: studyId, labId: t.labId, createdBy: { displayName: 'Felix Aranda' } });
    expect(body.report.sha256).toBe(sha256(sortedJson(body.content)));
    const again = await as.analyst.get(`${w.lab}/reports/study/${studyId}`).expect(200);
    expect(again.body.report).toEqual(body.report);
    expect((await as.reviewer.get(`${w.lab}/reports/${body.report.id}`).expect(200)).body).toEqual(body.report);
    const created = (await auditSince(t, auditStart)).filter((e) => e.action === 'reports.create' && e.target_id === body.report.id);
    expect(created).toHaveLength(1);
  });

  it('is not visible from another lab, and unknown targets are 404', async () => {
    const other = await createOtherLab(t.db);
    const outsider = await t.signIn(other.emails.admin);
    await outsider.get(`${w.lab}/reports/study/${studyId}`).expect(404);
    await outsider.get(`/api/v1/labs/${other.labId}/reports/study/${studyId}`).expect(404);
    await as.admin.get(`${w.lab}/reports/study/no-such-study`).expect(404);
    await as.admin.get(`${w.lab}/reports/no-such-report`).expect(404);
  });
});

describe("a study's report as PDF", () => {
  let pdf: Buffer;
  let text: string;
  let pages: number;
  let json: { report: { id: string; sha256: string }; content: Record<string, any>; trail: { events: number; head: string; checkpointAt: number } }; // eslint-disable-line @typescript-eslint/no-explicit-any

  beforeAll(async () => {
    json = (await as.auditor.get(`${w.lab}/reports/study/${studyId}`).expect(200)).body;
    const res = await pdfOf(as.auditor, `${w.lab}/reports/study/${studyId}.pdf`).expect(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toMatch(new RegExp(`^attachment; filename="?plumbline-study-report-${json.report.id}-revision-1\\.pdf"?$`));
    expect(res.headers['x-report-id']).toBe(json.report.id);
    pdf = res.body as Buffer;
    ({ text, pages } = await textOf(pdf));
  }, 30_000);

  it('is a PDF whose text holds the report id and hash, the recipe, each scenario and the verdicts', () => {
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(pages).toBeGreaterThanOrEqual(3);
    for (const s of [json.report.id, json.report.sha256, 'Hann 2048, H1, frames', 'SDOF 50 Hz at 2 % damping', 'SDOF 50 Hz at 1 % damping', 'seeds 1000001–1000003 (3 seeds)', 'Scope and purpose', 'Single-mode test frame', 'Reproducibility', 'Cautions', 'engine version']) {
      expect(text).toContain(s);
    }
    expect(text.match(/\bPASS\b/g)!.length).toBeGreaterThanOrEqual(8); // 4 criteria × 2 scenarios, in words
    expect(text).not.toMatch(/\bFAIL\b/);
  });

  it('prints the audit trail as its newest checkpoint stood: events, head and time', async () => {
    const chain = await t.db('audit_events').where({ lab_id: t.labId }).orderBy('id').pluck('hash');
    expect(chain[json.trail.events - 1]).toBe(json.trail.head);
    const at = new Date(json.trail.checkpointAt).toISOString().slice(0, 19).replace('T', ' ');
    expect(text.replace(/\s+/g, ' ')).toContain(`audit trail ${json.trail.events} events, head ${json.trail.head}, checkpoint ${at} UTC`);
  });

  it('prints the observed figure of every criterion as the JSON holds it', () => {
    for (const scenario of json.content.studies[0].scenarios) {
      for (const c of scenario.criteria) expect(text).toContain(`${Number(c.observed.toPrecision(4))} ${c.unit}`.trim());
    }
  });

  it('prints the signature block and the cautions', () => {
    const sig = json.content.signature;
    for (const s of ['Dana Whitcombe', sig.meaning, sig.signatureSha256, sig.evidenceSha256, 'Read in full.']) expect(text).toContain(s);
    // Who signed, beyond the name: the e-mail, how the account came to the lab, and the rule.
    for (const s of ['signer e-mail reviewer@harborridge.test', 'signer in this lab added by the operator', 'independence rule No one may decide a review']) expect(text).toContain(s);
    expect(text).toContain('Synthetic verification checks the processing, not the transducers');
    expect(text).toContain('follow the lab\'s safety rules and local codes');
    expect(text).toContain('responsibility stays with the lab\'s licensed or authorised staff');
  });

  it('embeds the shipped fonts and draws the plots as vector paths', () => {
    const raw = pdf.toString('latin1');
    for (const font of ['AtkinsonHyperlegibleNext-Regular', 'AtkinsonHyperlegibleNext-Bold', 'IBMPlexMono-Regular']) expect(raw).toMatch(new RegExp(`/FontName /[A-Z]{6}\\+${font}`));
    const ops = contentStreams(pdf);
    const lineTos = (ops.match(/ l\n/g) ?? []).length;
    const points = json.content.studies[0].scenarios.reduce((n: number, s: { plot: { frequenciesHz: unknown[] } }) => n + s.plot.frequenciesHz.length, 0);
    // Five plots per scenario, most with two curves: far more line segments than one curve's points.
    expect(lineTos).toBeGreaterThan(5 * points);
  });

  it('records each PDF download as an export', async () => {
    const exports = (await auditSince(t, auditStart)).filter((e) => e.action === 'reports.export' && e.target_id === json.report.id);
    expect(exports.length).toBeGreaterThanOrEqual(1);
    expect(JSON.parse(exports[0]!.after_json!)).toMatchObject({ kind: 'study', targetId: studyId, format: 'pdf', bytes: pdf.length });
  });
});

describe("an approved standard's report", () => {
  it('holds the standard, its signature and an evidence check that matches; the PDF says so', async () => {
    const res = await as.auditor.get(`${w.lab}/standards/${standardId}/report`).expect(200);
    const c = res.body.content;
    expect(c).toMatchObject({ kind: 'standard', standard: { id: standardId, status: 'active', supersedes: null }, evidenceCheck: { matchesSignature: true } });
    expect(c.evidenceCheck.recomputedSha256).toBe(c.signature.evidenceSha256);
    const pdf = await pdfOf(as.auditor, `${w.lab}/standards/${standardId}/report.pdf`).expect(200);
    const { text } = await textOf(pdf.body as Buffer);
    for (const s of [res.body.report.id, 'The standard', standardId, 'matches the signed evidence', 'review due']) expect(text).toContain(s);
  }, 30_000);

  it('finds stored evidence altered after signing, in a new revision of the same report', async () => {
    const before = (await as.auditor.get(`${w.lab}/standards/${standardId}/report`).expect(200)).body;
    const summary = JSON.parse((await t.db('studies').where({ id: studyId }).first('summary')).summary);
    summary.scenarios[0].judged.criteria[0].observed = 0.001;
    await t.db('studies').where({ id: studyId }).update({ summary: JSON.stringify(summary) });
    const after = (await as.auditor.get(`${w.lab}/standards/${standardId}/report`).expect(200)).body;
    expect(after.content.evidenceCheck.matchesSignature).toBe(false);
    expect(after.report.id).toBe(before.report.id);
    expect(after.report.revision).toBe(before.report.revision + 1);
    expect(after.report.sha256).not.toBe(before.report.sha256);
    expect(after.report.changes).toContain('evidence check: matches the signature → does not match the signature');
    const { text } = await textOf((await pdfOf(as.auditor, `${w.lab}/standards/${standardId}/report.pdf`).expect(200)).body as Buffer);
    expect(text).toContain('DOES NOT match the signed evidence');
  }, 30_000);
});
