/**
 * CSV exports over HTTP: a scenario's signals (the engine's samples, written exactly), its exact
 * FRF (against the textbook SDOF receptance), a study's results and criteria, and the escaping of
 * text cells against formula injection (OWASP "CSV Injection": cells starting with = + - @, tab or
 * carriage return get a leading apostrophe; numbers stay numbers).
 */
import Papa from 'papaparse';
import { formatCsv, formatCsvCell } from '@/server/services/csv-format';
import { parseScenario, simulateScenario } from '@/shared/engine/scenario';
import { createOtherLab, startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { periodicRecipe, periodicScenario, sdofSystem, smallScenario, waitForStudy } from './work-fixtures';
import type request from 'supertest';

let t: TestServer;
let analyst: request.Agent;
let lab: string;
let scenarioId: string;

beforeAll(async () => {
  t = await startTestServer();
  analyst = await t.signIn('analyst');
  lab = `/api/v1/labs/${t.labId}`;
  scenarioId = (await analyst.post(`${lab}/scenarios`).send({ definition: smallScenario('Export scenario') }).expect(201)).body.id;
}, 30_000);
afterAll(() => t.close());

const rows = (text: string) => Papa.parse<string[]>(text.trim(), { skipEmptyLines: true }).data;
const getCsv = (url: string, agent = analyst) =>
  agent
    .get(url)
    .buffer(true)
    .parse((res, cb) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => (text += c));
      res.on('end', () => cb(null, text));
    });

describe('escaping of cells', () => {
  it.each([
    ['=HYPERLINK("http://x.test","go")', `"'=HYPERLINK(""http://x.test"",""go"")"`],
    ['+1+2', "'+1+2"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1:A2)', "'@SUM(A1:A2)"],
    ['\tindented', "'\tindented"],
    ['\rreturn', `"'\rreturn"`],
    ['plain, with a comma', '"plain, with a comma"'],
    ['a "quoted" word', '"a ""quoted"" word"'],
    ['Fan frame = 3 modes', 'Fan frame = 3 modes'],
  ])('text %j is written as %s', (cell, written) => {
    expect(formatCsvCell(cell)).toBe(written);
  });

  it.each([
    [-0.5, '-0.5'],
    [-1e-300, '-1e-300'],
    [0.1 + 0.2, '0.30000000000000004'],
    [NaN, ''],
    [-Infinity, ''],
    [null, ''],
  ])('number %p is written as %j, never escaped', (cell, written) => {
    expect(formatCsvCell(cell)).toBe(written);
  });

  it('ends every row with CRLF (RFC 4180)', () => {
    expect(formatCsv(['a', 'b'], [[1, '=x']])).toBe("a,b\r\n1,'=x\r\n");
  });
});

describe('scenario exports', () => {
  it("writes the engine's signals for the seed, every double exactly", async () => {
    const res = await getCsv(`${lab}/scenarios/${scenarioId}/signals.csv?seed=7`).expect(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe('attachment; filename="export-scenario-v1-seed-7-signals.csv"');
    expect(res.headers['x-sample-rate-hz']).toBe('512');
    const table = rows(res.body as string);
    expect(table[0]).toEqual(['time_s', 'input', 'output']);
    const record = simulateScenario(parseScenario(smallScenario('Export scenario')), 7);
    expect(table).toHaveLength(record.input.length + 1);
    for (let i = 0; i < record.input.length; i++) {
      const [time, input, output] = table[i + 1].map(Number);
      expect(time).toBe(i / 512);
      expect(input).toBe(record.input[i]);
      expect(output).toBe(record.output[i]);
    }
  });

  it('writes the exact FRF: the textbook SDOF receptance 1/(k − mω² + jcω)', async () => {
    const res = await getCsv(`${lab}/scenarios/${scenarioId}/exact.csv?df=0.5`).expect(200);
    expect(res.headers['x-frf-unit']).toBe(encodeURIComponent('m/N'));
    const table = rows(res.body as string);
    expect(table[0]).toEqual(['frequency_hz', 'h_re', 'h_im']);
    expect(table).toHaveLength(1 + 513); // 0 … 256 Hz by 0.5 Hz
    // S. S. Rao, Mechanical Vibrations: m = k/ωn², c = 2ζ·sqrt(k·m).
    const { stiffnessNPerM: k, naturalFrequencyHz: fn, dampingRatio: z } = sdofSystem;
    const m = k / (2 * Math.PI * fn) ** 2;
    const c = 2 * z * Math.sqrt(k * m);
    for (const row of table.slice(1)) {
      const [f, re, im] = row.map(Number);
      const w = 2 * Math.PI * f;
      const dr = k - m * w * w;
      const di = c * w;
      const d = dr * dr + di * di;
      const scale = 1 / Math.sqrt(d);
      expect(Math.abs(re - dr / d)).toBeLessThan(1e-12 * scale);
      expect(Math.abs(im + di / d)).toBeLessThan(1e-12 * scale);
    }
    // At ωn the phase is −90° and |H| = 1/(2ζk) (same source).
    const atFn = table.find((r) => Number(r[0]) === fn)!.map(Number);
    expect(Math.abs(atFn[1])).toBeLessThan(1e-12 / (2 * z * k));
    expect(Math.abs(-atFn[2] - 1 / (2 * z * k)) / (1 / (2 * z * k))).toBeLessThan(1e-12);
  });

  it('uses the record line spacing fs/N by default and refuses too fine a spacing', async () => {
    const res = await getCsv(`${lab}/scenarios/${scenarioId}/exact.csv`).expect(200);
    expect(res.headers['x-line-spacing-hz']).toBe(String(512 / 4096));
    expect(rows(res.body as string)).toHaveLength(1 + 2049);
    const bad = await analyst.get(`${lab}/scenarios/${scenarioId}/exact.csv?df=0.00001`).expect(400);
    expect(bad.body.error.message).toMatch(/^df: /);
    await analyst.get(`${lab}/scenarios/${scenarioId}/signals.csv?seed=-1`).expect(400);
    await analyst.get(`${lab}/scenarios/nope/signals.csv`).expect(404);
  });
});

describe('study exports', () => {
  let studyId: string;
  const hostile = '=HYPERLINK("http://x.test","click")';

  beforeAll(async () => {
    const sc = (await analyst.post(`${lab}/scenarios`).send({ definition: periodicScenario(hostile) }).expect(201)).body.id;
    const sc2 = (await analyst.post(`${lab}/scenarios`).send({ definition: smallScenario('-1+1 noisy, with a comma') }).expect(201)).body.id;
    const rc = (await analyst.post(`${lab}/recipes`).send({ definition: periodicRecipe() }).expect(201)).body.id;
    studyId = (await analyst.post(`${lab}/studies`).send({ name: '@study', recipe: { id: rc }, scenarios: [{ id: sc }, { id: sc2 }], seeds: 2 }).expect(202)).body.id;
    expect((await waitForStudy(analyst, `${lab}/studies/${studyId}`)).status).toBe('finished');
  }, 60_000);

  it('writes one row per scenario and line, names escaped, numbers exact', async () => {
    const res = await getCsv(`${lab}/studies/${studyId}/results.csv`).expect(200);
    const text = res.body as string;
    // The hostile names are written as text, never as a formula.
    expect(text).toContain(`"'=HYPERLINK(""http://x.test"",""click"")",`);
    expect(text).toContain(`"'-1+1 noisy, with a comma",`);
    const table = rows(text);
    expect(table[0].slice(0, 6)).toEqual(['scenario', 'scenario_id', 'scenario_version', 'frequency_hz', 'mean_magnitude_db', 'std_magnitude_db']);
    const results = (await analyst.get(`${lab}/studies/${studyId}/results`).expect(200)).body;
    expect(table).toHaveLength(1 + 71 * 2);
    const col = table[0].indexOf('mean_magnitude_db');
    results.scenarios.forEach((s: { curves: Record<string, (number | null)[]> }, j: number) => {
      s.curves.frequenciesHz.forEach((f, i) => {
        const row = table[1 + j * 71 + i];
        expect(Number(row[3])).toBe(f);
        const v = s.curves.meanMagnitudeDb[i];
        expect(row[col]).toBe(v === null ? '' : String(v));
      });
    });
    // Negative numbers are plain numbers: no apostrophe in a numeric column.
    const negatives = table.slice(1).filter((r) => r[col].startsWith('-'));
    expect(negatives.length).toBeGreaterThan(0);
    expect(table.slice(1).some((r) => r[col].startsWith("'"))).toBe(false);
  });

  it('writes the criteria with their verdicts', async () => {
    const res = await getCsv(`${lab}/studies/${studyId}/criteria.csv`).expect(200);
    const table = rows(res.body as string);
    expect(table[0]).toEqual(['scenario', 'criterion', 'label', 'limit', 'observed', 'unit', 'verdict', 'worst_line_hz', 'note']);
    expect(table[1].slice(0, 2)).toEqual([`'${hostile}`, 'magnitude-bias']);
    expect(table[1][6]).toBe('pass');
  });

  it('lets every role of the lab export and nobody from another lab', async () => {
    for (const role of ['reviewer', 'auditor', 'admin'] as const) {
      const a = await t.signIn(role);
      await getCsv(`${lab}/studies/${studyId}/criteria.csv`, a).expect(200);
    }
    const other = await createOtherLab(t.db, 'Millbrook Shaker Lab');
    const outsider = await t.signIn(other.emails.analyst, TEST_PASSWORD);
    await outsider.get(`${lab}/studies/${studyId}/results.csv`).expect(404);
    await outsider.get(`/api/v1/labs/${other.labId}/studies/${studyId}/results.csv`).expect(404);
    await outsider.get(`/api/v1/labs/${other.labId}/scenarios/${scenarioId}/signals.csv`).expect(404);
  });
});
