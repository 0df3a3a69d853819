/**
 * Uploads over HTTP (multipart) against a real SQLite file and DATA_DIR: a lab's time data run
 * through a recipe, an FRF scored against a scenario's exact FRF, and bad files refused with the
 * line and column of the problem, leaving no row and no file behind.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { createOtherLab, startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { sdofSystem, smallRecipe, smallScenario } from './work-fixtures';
import type request from 'supertest';

let t: TestServer;
let analyst: request.Agent;
let lab: string;
let recipeId: string;
let scenarioId: string;

beforeAll(async () => {
  t = await startTestServer();
  analyst = await t.signIn('analyst');
  lab = `/api/v1/labs/${t.labId}`;
  recipeId = (await analyst.post(`${lab}/recipes`).send({ definition: smallRecipe('Upload recipe') }).expect(201)).body.id;
  scenarioId = (await analyst.post(`${lab}/scenarios`).send({ definition: smallScenario('Upload scenario') }).expect(201)).body.id;
}, 30_000);
afterAll(() => t.close());

const uploadsDir = () => path.join(t.config.dataDir, 'uploads');
const storedFiles = () => (fs.existsSync(uploadsDir()) ? fs.readdirSync(uploadsDir()).filter((f) => f !== 'incoming').sort() : []);
const incomingFiles = () => (fs.existsSync(path.join(uploadsDir(), 'incoming')) ? fs.readdirSync(path.join(uploadsDir(), 'incoming')) : []);
const rowCount = async () => Number((await t.db('uploads').count({ n: '*' }).first())?.n);

/** Deterministic samples in [−1, 1) (Park & Miller minimal standard generator, CACM 31(10), 1988). */
function samples(n: number, seed = 12345): number[] {
  const out: number[] = [];
  let s = seed;
  for (let i = 0; i < n; i++) {
    s = (s * 16807) % 2147483647;
    out.push((2 * s) / 2147483647 - 1);
  }
  return out;
}

function timeCsv(n = 4096, fs = 512, gain = 2): string {
  const x = samples(n);
  return ['time_s,input,output', ...x.map((v, i) => `${i / fs},${v},${gain * v}`)].join('\n') + '\n';
}

const upload = (fields: Record<string, string>, content: string | Buffer | null, name = 'record.csv') => {
  const req = analyst.post(`${lab}/uploads`);
  for (const [k, v] of Object.entries(fields)) req.field(k, v);
  if (content !== null) req.attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), name);
  return req;
};

/** SDOF receptance 1/(k − mω² + jcω), m = k/ωn², c = 2ζ·sqrt(k·m) (S. S. Rao, Mechanical Vibrations). */
function sdofReceptance(fHz: number): [number, number] {
  const { stiffnessNPerM: k, naturalFrequencyHz: fn, dampingRatio: z } = sdofSystem;
  const wn = 2 * Math.PI * fn;
  const m = k / (wn * wn);
  const c = 2 * z * Math.sqrt(k * m);
  const w = 2 * Math.PI * fHz;
  const re = k - m * w * w;
  const im = c * w;
  const d = re * re + im * im;
  return [re / d, -im / d];
}

describe('time data', () => {
  it('runs the recipe and gives H = 2, γ² = 1 for output = 2 × input', async () => {
    const csv = timeCsv();
    const res = await upload({ kind: 'time-data', recipeId }, csv).expect(201);
    const r = res.body.result;
    // y = 2x exactly: Gyx = 2·Gxx and Gyy = 4·Gxx, so H1 = H2 = Hv = 2 and γ² = 1 (docs/engine.md:
    // the coherence of x with ±x is 1; the FRF of a pure gain is that gain).
    expect(r).toMatchObject({ kind: 'time-data', sampleRateHz: 512, samples: 4096, blockLength: 256, averages: 31 });
    expect(r.frequenciesHz[0]).toBe(10);
    expect(r.frequenciesHz[r.frequenciesHz.length - 1]).toBe(150);
    for (const h of [r.h1, r.h2, r.hv]) {
      h.re.forEach((v: number) => expect(Math.abs(v - 2)).toBeLessThan(1e-12));
      h.im.forEach((v: number) => expect(Math.abs(v)).toBeLessThan(1e-12));
    }
    r.coherence.forEach((g: number) => expect(Math.abs(g - 1)).toBeLessThan(1e-12));

    // Stored: one row with the file's SHA-256, the file itself under DATA_DIR/uploads, an audit event.
    const row = await t.db('uploads').where({ id: res.body.upload.id }).first();
    expect(row).toMatchObject({ kind: 'time-data', original_name: 'record.csv', size_bytes: Buffer.byteLength(csv), recipe_id: recipeId, recipe_version: 1 });
    expect(row.sha256).toBe(createHash('sha256').update(csv).digest('hex'));
    expect(fs.readFileSync(path.join(uploadsDir(), row.stored_name), 'utf8')).toBe(csv);
    expect(incomingFiles()).toEqual([]);
    expect(await t.db('audit_events').where({ target_id: row.id }).pluck('action')).toEqual(['uploads.create']);

    // Read back: the same result, recomputed from the stored file.
    const again = await analyst.get(`${lab}/uploads/${row.id}/result`).expect(200);
    expect(again.body.result).toEqual(r);
  });

  it('takes chosen columns and a stated sample rate instead of a time column', async () => {
    const x = samples(2048, 99);
    const csv = ['force_n,accel,extra', ...x.map((v) => `${v},${-3 * v},0`)].join('\r\n');
    const res = await upload({ kind: 'time-data', recipeId, inputColumn: 'force_n', outputColumn: 'accel', sampleRateHz: '512' }, csv).expect(201);
    res.body.result.h1.re.forEach((v: number) => expect(Math.abs(v + 3)).toBeLessThan(1e-12));
    expect(res.body.upload.summary).toMatchObject({ columns: { input: 'force_n', output: 'accel', time: null }, sampleRateHz: 512 });
  });

  it.each([
    ['a word among the numbers', () => timeCsv(100).replace(/\n(0\.009765625),([^,\n]+),/, '\n$1,$2x,'), /^line 7, column "input": ".+x" is not a finite number$/],
    ['an empty cell', () => timeCsv(100).replace(/\n(0\.01171875),([^,\n]+),([^\n]+)\n/, '\n$1,$2,\n'), /^line 8, column "output": the cell is empty$/],
    ['a short row', () => timeCsv(100).replace(/\n(0\.01171875),([^,\n]+),([^\n]+)\n/, '\n$1,$2\n'), /^line 8: has 2 cells, the header has 3$/],
    ['no output column', () => timeCsv(300).replace('time_s,input,output', 'time_s,input,response'), /^line 1: no column "output"; the header has "time_s", "input", "response"$/],
    ['an uneven time step', () => timeCsv(300).replace('\n0.01953125,', '\n0.0205,'), /^line 12, column "time_s": the time step changes here/],
    ['no header row', () => timeCsv(300).split('\n').slice(1).join('\n'), /^line 1: the first row must be a header/],
    ['too few rows', () => 'time_s,input,output\n0,1,2\n', /needs at least 8 data rows, found 1/],
    ['a record shorter than the block', () => timeCsv(100), /^recipe: blockLength=256 needs 256 samples per block, more than the record's 100/],
    ['binary content', () => Buffer.from([0x50, 0x4b, 0x03, 0x04, 0x00, 0x00, 0x08, 0x00]), /not a text CSV file/],
    ['an empty file', () => '', /the file is empty/],
  ])('refuses %s (400 naming the problem) and stores nothing', async (_what, content, message) => {
    const before = { rows: await rowCount(), files: storedFiles() };
    const res = await upload({ kind: 'time-data', recipeId }, content()).expect(400);
    expect(res.body.error.message).toMatch(message);
    expect(await rowCount()).toBe(before.rows);
    expect(storedFiles()).toEqual(before.files);
    expect(incomingFiles()).toEqual([]);
  });

  it.each([
    ['no file', {}, null, 400, /attach the CSV file/],
    ['an unknown kind', { kind: 'spectrum' }, 'a,b\n1,2\n', 400, /kind/],
    ['an unknown recipe', { recipeId: 'nope' }, timeCsv(300), 404, /Recipe nope was not found/],
    ['a file that is not CSV', {}, 'GIF89a', 400, /is not a CSV file/],
  ])('refuses %s', async (_what, extra, content, status, message) => {
    const before = await rowCount();
    const fields = { kind: 'time-data', recipeId, ...extra };
    const res = await upload(fields, content, _what === 'a file that is not CSV' ? 'picture.gif' : 'record.csv').expect(status);
    expect(res.body.error.message).toMatch(message);
    expect(await rowCount()).toBe(before);
    expect(incomingFiles()).toEqual([]);
  });

  it('refuses a file over the size limit with 413 and keeps no part of it', async () => {
    const before = { rows: await rowCount(), files: storedFiles() };
    const big = Buffer.alloc(32 * 1024 * 1024 + 10, '1');
    const res = await upload({ kind: 'time-data', recipeId }, big).expect(413);
    expect(res.body.error.code).toBe('file_too_large');
    expect(await rowCount()).toBe(before.rows);
    expect(storedFiles()).toEqual(before.files);
    expect(incomingFiles()).toEqual([]);
  }, 30_000);
});

describe('FRF files', () => {
  const lines = Array.from({ length: 200 }, (_, i) => i + 1);

  it('scores an FRF against the exact one: zero error for the textbook SDOF receptance', async () => {
    const csv = ['frequency_hz,h_re,h_im', ...lines.map((f) => [f, ...sdofReceptance(f)].join(','))].join('\n');
    const res = await upload({ kind: 'frf', scenarioId }, csv, 'lab-frf.csv').expect(201);
    const r = res.body.result;
    expect(r).toMatchObject({ kind: 'frf', unit: 'm/N', format: 're-im' });
    expect(r.frequenciesHz).toEqual(lines);
    expect(r.summary.lines).toBe(200);
    expect(r.summary.maxAbsMagnitudeDb).toBeLessThan(1e-9);
    expect(r.summary.maxAbsPhaseDeg).toBeLessThan(1e-9);
    expect(r.summary.maxComplexRelative).toBeLessThan(1e-10);
    expect(res.body.upload).toMatchObject({ kind: 'frf', scenario: { id: scenarioId, version: 1 }, recipe: null });
  });

  it('reads magnitude (dB) and phase (degrees): 10 % too large is 20·log10(1.1) dB everywhere', async () => {
    const rows = lines.map((f) => {
      const [re, im] = sdofReceptance(f);
      return [f, 20 * Math.log10(1.1 * Math.hypot(re, im)), (Math.atan2(im, re) * 180) / Math.PI].join(',');
    });
    const res = await upload({ kind: 'frf', scenarioId }, ['frequency_hz,magnitude_db,phase_deg', ...rows].join('\n')).expect(201);
    const expected = 20 * Math.log10(1.1); // 0.8278537 dB
    res.body.result.magnitudeErrorDb.forEach((e: number) => expect(Math.abs(e - expected)).toBeLessThan(1e-9));
    res.body.result.phaseErrorDeg.forEach((e: number) => expect(Math.abs(e)).toBeLessThan(1e-9));
    expect(res.body.result.format).toBe('magnitude-phase');
  });

  it.each([
    ['frequencies that fall back', 'frequency_hz,h_re,h_im\n1,1,0\n2,1,0\n2,1,0\n', /^line 4, column "frequency_hz": frequencies must rise/],
    ['a negative frequency', 'frequency_hz,h_re,h_im\n-1,1,0\n', /^line 2, column "frequency_hz": a frequency must not be negative/],
    ['no imaginary part', 'frequency_hz,h_re\n1,1\n', /^line 1: no column "h_im"/],
    ['neither form', 'frequency_hz,gain\n1,1\n', /needs columns h_re and h_im, or magnitude_db and phase_deg/],
  ])('refuses %s and stores nothing', async (_what, csv, message) => {
    const before = { rows: await rowCount(), files: storedFiles() };
    const res = await upload({ kind: 'frf', scenarioId }, csv).expect(400);
    expect(res.body.error.message).toMatch(message);
    expect(await rowCount()).toBe(before.rows);
    expect(storedFiles()).toEqual(before.files);
  });
});

describe('lists, roles and labs', () => {
  it('lists uploads by kind, newest first, and lets only analysts upload', async () => {
    const frf = await analyst.get(`${lab}/uploads?kind=frf`).expect(200);
    expect(frf.body.items.length).toBeGreaterThanOrEqual(2);
    expect(frf.body.items.every((u: { kind: string }) => u.kind === 'frf')).toBe(true);
    const all = await analyst.get(`${lab}/uploads?sort=createdAt&order=desc`).expect(200);
    const times = all.body.items.map((u: { createdAt: number }) => u.createdAt);
    expect([...times].sort((a, b) => b - a)).toEqual(times);
    const auditor = await t.signIn('auditor');
    await auditor.get(`${lab}/uploads/${all.body.items[0].id}`).expect(200);
    await auditor.post(`${lab}/uploads`).field('kind', 'frf').field('scenarioId', scenarioId).attach('file', Buffer.from('frequency_hz,h_re,h_im\n1,1,0\n'), 'x.csv').expect(403);
  });

  it("hides one lab's uploads, recipes and scenarios from another lab", async () => {
    const other = await createOtherLab(t.db, 'Ashgrove Dynamics Lab');
    const outsider = await t.signIn(other.emails.analyst, TEST_PASSWORD);
    const otherLab = `/api/v1/labs/${other.labId}`;
    const mine = (await analyst.get(`${lab}/uploads`).expect(200)).body.items[0].id;
    await outsider.get(`${otherLab}/uploads/${mine}`).expect(404);
    await outsider.get(`${otherLab}/uploads/${mine}/result`).expect(404);
    const res = await outsider.post(`${otherLab}/uploads`).field('kind', 'frf').field('scenarioId', scenarioId).attach('file', Buffer.from('frequency_hz,h_re,h_im\n1,1,0\n'), 'x.csv').expect(404);
    expect(res.body.error.message).toMatch(/Scenario .* was not found/);
    expect((await outsider.get(`${otherLab}/uploads`).expect(200)).body.total).toBe(0);
  });
});
