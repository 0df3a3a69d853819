/**
 * `plumbline sweep` run as a child process. Hand-computed references: the measurement time of
 * n blocks of N samples at overlap o, (n − 1)(1 − o)N/fs + N/fs (Welch's segmentation, P. D. Welch,
 * IEEE Trans. Audio Electroacoust. AU-15(2), 1967); and the coherence of a channel with noise of
 * the signal's own power, γ² = S/(S + N) ≤ 1/2 where the SNR is 0 dB (Bendat & Piersol, Random Data,
 * ch. 9), so a 0.99 coherence limit cannot pass on it.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { hannRecipe, sdofRandomScenario } from './study-helpers';

const ROOT = resolve(__dirname, '..', '..');
const BIN = join(ROOT, 'server', 'cli', 'plumbline.js');

function plumbline(...args: string[]): Promise<{ status: number | null; stdout: string; stderr: string }> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [BIN, 'sweep', ...args], { cwd: ROOT });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (c: string) => (stdout += c));
    child.stderr.setEncoding('utf8').on('data', (c: string) => (stderr += c));
    child.on('error', fail);
    child.on('close', (status) => done({ status, stdout, stderr }));
  });
}

let dir: string;
let loose: string;
let strict: string;
let scenario: string;
let noisy: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'plumbline-sweep-'));
  const write = (name: string, value: unknown) => {
    writeFileSync(join(dir, name), JSON.stringify(value));
    return join(dir, name);
  };
  loose = write('loose.json', hannRecipe({ averages: 4, tolerances: { magnitudeDb: 40 } }));
  strict = write('strict.json', hannRecipe({ averages: 4, tolerances: { minCoherence: 0.99 } }));
  scenario = write('scenario.json', sdofRandomScenario({ durationS: 16, snrDb: 30 }));
  noisy = write('noisy.json', sdofRandomScenario({ durationS: 16, snrDb: 0 }));
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

it('prints every point and names the shortest passing record (JSON)', async () => {
  const r = await plumbline('--recipe', loose, '--scenario', scenario, '--vary', 'blockLength=512,256', '--seeds', '2', '--format', 'json');
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  const out = JSON.parse(r.stdout);
  expect(out.seeds).toEqual([1, 2]);
  // 4 averages at 50 %: 2.5·N/256 s.
  expect(out.points.map((p: { measurementTimeS: number }) => p.measurementTimeS)).toEqual([5, 2.5]);
  expect(out.points[1].criteria.map((c: { id: string }) => c.id)).toEqual(['magnitude-bias', 'magnitude-p95']);
  expect(out.points[1].perSeed['magnitude-p95']).toHaveLength(2);
  expect(out.cheapestPassing).toEqual({ index: 1, points: [1], settings: { blockLength: 256 }, measurementTimeS: 2.5 });
}, 60_000);

it('says null and "No point" when nothing passes, and reads a table', async () => {
  const [json, table] = await Promise.all([
    plumbline('--recipe', strict, '--scenario', noisy, '--vary', 'window=hann,rectangular', '--seeds', '1', '--format', 'json'),
    plumbline('--recipe', strict, '--scenario', noisy, '--vary', 'window=hann,rectangular', '--seeds', '1'),
  ]);
  expect(json.status).toBe(0);
  const out = JSON.parse(json.stdout);
  expect(out.cheapestPassing).toBeNull();
  expect(out.points.every((p: { criteria: { observed: number }[] }) => p.criteria[0].observed < 0.99)).toBe(true);
  expect(table.stdout).toMatch(/window\s+record\s+result\s+min-coherence \(≥ 0\.99\)/);
  expect(table.stdout).toContain('No point of this sweep passes every criterion.');
}, 60_000);

it.each([
  [['--scenario', 'y', '--vary', 'blockLength=256'], '--recipe is required'],
  [['--recipe', 'x', '--scenario', 'y'], 'no such file'],
  [['--vary', 'colour=1,2'], '"colour" is not a setting a sweep can vary'],
  [['--vary', 'overlap=0.5,half'], '--vary overlap=half must be a finite number'],
  [['--vary', 'blockLength=1000'], 'grid point blockLength=1000 cannot be processed: blockLength=1000 must be a power of two'],
  [['--vary', 'overlap=0,0.5', '--vary', 'delayS=0,0.01', '--vary', 'outputSnrDb=1'], 'vary=3 must name one or two settings'],
])('bad input %j exits 2 with plain words', async (args, message) => {
  const full = args[0] === '--vary' ? ['--recipe', loose, '--scenario', scenario, ...args] : args;
  const r = await plumbline(...full);
  expect(r.status).toBe(2);
  expect(r.stdout).toBe('');
  expect(r.stderr).toContain(message);
});
