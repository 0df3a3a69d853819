/**
 * The `plumbline` CLI run as a child process (`node server/cli/plumbline.js ...`), as a lab would
 * run it: exit statuses, stderr messages, files written whole or not at all, and numbers checked
 * against sources outside the project (analytic FRFs, Harris's window table).
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { createRandom } from '@/shared/engine/random';
import { formatCsv, parseNumericCsv } from '@/server/cli/csv';

// Child processes on a shared two-core machine: allow more than jest's default 5 s per test.
jest.setTimeout(60_000);

const ROOT = resolve(__dirname, '..', '..');
const BIN = join(ROOT, 'server', 'cli', 'plumbline.js');

interface Run {
  status: number | null;
  stdout: string;
  stderr: string;
}

function plumbline(...args: string[]): Run {
  return plumblineIn(ROOT, ...args);
}

function plumblineIn(cwd: string, ...args: string[]): Run {
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: 'utf8', timeout: 60_000 });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** The same, asynchronously, so that independent runs can share the two cores. */
function plumblineAsync(...args: string[]): Promise<Run> {
  return new Promise((done, fail) => {
    const child = spawn(process.execPath, [BIN, ...args], { cwd: ROOT });
    let stdout = '';
    let stderr = '';
    child.stdout.setEncoding('utf8').on('data', (chunk: string) => (stdout += chunk));
    child.stderr.setEncoding('utf8').on('data', (chunk: string) => (stderr += chunk));
    child.on('error', fail);
    child.on('close', (status) => done({ status, stdout, stderr }));
  });
}

let dir: string;
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'plumbline-cli-'));
});
afterAll(() => {
  rmSync(dir, { recursive: true, force: true });
});
const file = (name: string) => join(dir, name);

/** No temporary files left behind in the output folder after a run. */
function expectNoTemporaries(): void {
  expect(readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
}

/**
 * A record through a two-tap FIR filter, y[n] = 0.5·x[n] + 0.25·x[n−1], whose exact FRF is
 * H(f) = 0.5 + 0.25·exp(−2πi f/fs) (analytic: the DTFT of the impulse response [0.5, 0.25]).
 */
const FS = 1000;
function writeFirRecord(path: string, samples: number): void {
  const random = createRandom(7, 'cli-test');
  const x = random.fillGaussian(new Float64Array(samples), 1);
  const y = new Float64Array(samples);
  for (let i = 0; i < samples; i++) y[i] = 0.5 * x[i]! + 0.25 * (i > 0 ? x[i - 1]! : 0);
  const t = x.map((_, i) => i / FS);
  writeFileSync(path, formatCsv(['time_s', 'force', 'response'], [t, x, y]));
}
function firExact(f: Float64Array): { re: Float64Array; im: Float64Array } {
  const re = f.map((v) => 0.5 + 0.25 * Math.cos((2 * Math.PI * v) / FS));
  const im = f.map((v) => -0.25 * Math.sin((2 * Math.PI * v) / FS));
  return { re, im };
}

describe('CSV number format', () => {
  it('writes every double so that it reads back bit for bit (shortest round-trip text)', () => {
    const random = createRandom(3, 'csv');
    const values = new Float64Array(2000).map(() => (random.uniform() - 0.5) * 10 ** Math.floor(random.uniform() * 40 - 20));
    values[0] = 0.1 + 0.2; // 0.30000000000000004 needs 17 significant digits
    values[1] = Number.MIN_VALUE;
    values[2] = -Number.MAX_VALUE;
    const table = parseNumericCsv(formatCsv(['v'], [values]), 'test');
    expect(Array.from(table.data.v!)).toEqual(Array.from(values));
  });
});

describe('plumbline --help', () => {
  it('lists the commands, and each command documents its options with units', () => {
    const overview = plumbline('--help');
    expect(overview.status).toBe(0);
    for (const name of ['estimate', 'simulate', 'verify', 'score', 'windows', 'advise']) {
      expect(overview.stdout).toContain(name);
    }
    const estimate = plumbline('estimate', '--help');
    expect(estimate.status).toBe(0);
    for (const option of ['--input', '--fs', '--block', '--window', '--overlap', '--detrend', '--averages', '--scaling', '--estimator', '--format', '--output', 'Hz']) {
      expect(estimate.stdout).toContain(option);
    }
  });

  it('runs from any working folder (the import alias is resolved from the repository)', () => {
    const r = plumblineIn(dir, 'windows', '--block', '64', '--format', 'json');
    expect(r.status).toBe(0);
    expect((JSON.parse(r.stdout) as { windows: unknown[] }).windows).toHaveLength(6);
  });

  it('rejects an unknown command with status 2', () => {
    const r = plumbline('frobnicate');
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('unknown command');
  });
});

describe('plumbline windows', () => {
  it('gives the window figures of F. J. Harris, Proc. IEEE 66(1), 1978, Table I', () => {
    const r = plumbline('windows', '--block', '1024', '--format', 'json');
    expect(r.status).toBe(0);
    const { windows } = JSON.parse(r.stdout) as { windows: { window: string; enbwBins: number; scallopingLossDb: number; coherentGain: number; overlapCorrelation50Percent: number }[] };
    const by = Object.fromEntries(windows.map((w) => [w.window, w]));
    // Harris 1978 Table I (values quoted from memory, docs/engine.md): ENBW 1.00 / 1.50 / 2.00 bins,
    // scalloping loss 3.92 / 1.42 / 0.83 dB, coherent gain 1.00 / 0.50 / 0.36, overlap
    // correlation at 50 %: 50.0 / 16.7 / 3.8 % (rectangular, Hann, Blackman-Harris 4-term).
    expect(by.rectangular!.enbwBins).toBeCloseTo(1.0, 2);
    expect(by.hann!.enbwBins).toBeCloseTo(1.5, 2);
    expect(by['blackman-harris']!.enbwBins).toBeCloseTo(2.0, 1);
    expect(by.rectangular!.scallopingLossDb).toBeCloseTo(3.92, 1);
    expect(by.hann!.scallopingLossDb).toBeCloseTo(1.42, 1);
    expect(by['blackman-harris']!.scallopingLossDb).toBeCloseTo(0.83, 1);
    expect(by.hann!.coherentGain).toBeCloseTo(0.5, 3);
    expect(by.hann!.overlapCorrelation50Percent).toBeCloseTo(16.7, 0);
    expect(by['blackman-harris']!.overlapCorrelation50Percent).toBeCloseTo(3.8, 0);
  });
});

describe('plumbline estimate and score on an analytic FIR record', () => {
  const record = () => file('fir.csv');
  beforeAll(() => writeFirRecord(record(), 16384));

  it('estimates H1 of y = 0.5·x[n] + 0.25·x[n−1] and scores it against the analytic FRF', () => {
    const frf = file('fir-frf.csv');
    const r = plumbline('estimate', '--input', record(), '--x', 'force', '--y', 'response', '--block', '256',
      '--window', 'hann', '--overlap', '0.5', '--detrend', 'none', '--output', frf);
    expect(r.status).toBe(0);
    const est = parseNumericCsv(readFileSync(frf, 'utf8'), 'frf');
    expect(est.columns.slice(0, 14)).toEqual(['frequency_hz', 'gxx', 'gyy', 'gyx_re', 'gyx_im', 'h1_re', 'h1_im',
      'h2_re', 'h2_im', 'hv_re', 'hv_im', 'coherence', 'h1_mag_random_error', 'phase_random_error_deg']);
    expect(est.rowCount).toBe(129); // lines 0..N/2
    expect(est.data.frequency_hz![1]).toBeCloseTo(FS / 256, 12);

    // The analytic FRF on the same lines, written as an "exact" file for `score`.
    const f = est.data.frequency_hz!;
    const exact = firExact(f);
    writeFileSync(file('fir-exact.csv'), formatCsv(['frequency_hz', 'h_re', 'h_im'], [f, exact.re, exact.im]));
    const s = plumbline('score', '--exact', file('fir-exact.csv'), '--estimate', frf, '--band', '10,490', '--format', 'json');
    expect(s.status).toBe(0);
    expect(s.stderr).not.toContain('interpolated');
    const summary = JSON.parse(s.stdout) as { maxAbsMagnitudeDb: number; maxAbsPhaseDeg: number; lines: number; interpolatedLines: number };
    // Noise-free FIR: the only error is the one-sample memory reaching across block edges, a
    // bias below 1 % of the 256-sample block; the Hann window keeps it far smaller.
    expect(summary.maxAbsMagnitudeDb).toBeLessThan(0.05);
    expect(summary.maxAbsPhaseDeg).toBeLessThan(0.5);
    expect(summary.interpolatedLines).toBe(0);
    expect(summary.lines).toBe(123); // lines 3..125 lie in 10–490 Hz at 3.90625 Hz spacing
  });

  it('writes JSON with the block count and effective averages, taking fs from time_s', () => {
    const r = plumbline('estimate', '--input', record(), '--x', 'force', '--y', 'response', '--block', '1024',
      '--window', 'rectangular', '--overlap', '0', '--format', 'json');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as { metadata: { sampleRateHz: number; blocks: number; effectiveAverages: number; frequencyResolutionHz: number }; lines: unknown[] };
    expect(out.metadata.sampleRateHz).toBe(FS);
    expect(out.metadata.blocks).toBe(16); // 16384 / 1024, no overlap
    // Without overlap the blocks are independent: n_d = K (P. D. Welch, 1967).
    expect(out.metadata.effectiveAverages).toBeCloseTo(16, 9);
    expect(out.metadata.frequencyResolutionHz).toBeCloseTo(FS / 1024, 12);
    expect(out.lines).toHaveLength(513);
  });

  it('warns and interpolates when the exact lines differ from the estimate lines', () => {
    const frf = file('fir-frf-512.csv');
    expect(plumbline('estimate', '--input', record(), '--x', 'force', '--y', 'response', '--block', '512', '--output', frf).status).toBe(0);
    // Exact FRF on a 1.5 Hz grid: none of the 1.953125 Hz lines but 0 falls on it.
    const f = Float64Array.from({ length: 334 }, (_, k) => k * 1.5);
    const exact = firExact(f);
    writeFileSync(file('fir-exact-coarse.csv'), formatCsv(['frequency_hz', 'h_re', 'h_im'], [f, exact.re, exact.im]));
    const s = plumbline('score', '--exact', file('fir-exact-coarse.csv'), '--estimate', frf, '--band', '5,495', '--format', 'json');
    expect(s.status).toBe(0);
    expect(s.stderr).toContain('interpolated');
    const summary = JSON.parse(s.stdout) as { maxAbsMagnitudeDb: number; interpolatedLines: number; lines: number };
    // Every line but two is interpolated: 187.5 and 375 Hz lie on both grids (96·125/64 = 125·1.5).
    expect(summary.interpolatedLines).toBe(summary.lines - 2);
    // The FIR FRF is smooth: linear interpolation over 1.5 Hz adds little (|H''|·h²/8 ≪ 0.01 dB).
    expect(summary.maxAbsMagnitudeDb).toBeLessThan(0.05);
  });
});

describe('bad input: status 2, a message naming the problem, no output file', () => {
  beforeAll(() => writeFirRecord(file('small.csv'), 4096));

  const cases: [string, string[], RegExp][] = [
    ['overlap outside [0, 1)', ['--overlap', '1.2'], /overlap=1\.2/],
    ['block not a power of two', ['--block', '1000'], /block=1000 must be a power of two/],
    ['unknown window', ['--window', 'triangle'], /window=triangle must be one of/],
    ['missing column', ['--x', 'nonesuch'], /no column "nonesuch"/],
  ];
  it('estimate: each bad option is refused with its own message', async () => {
    const runs = await Promise.all(
      cases.map(([, extra], i) =>
        plumblineAsync('estimate', '--input', file('small.csv'), '--x', 'force', '--y', 'response', ...extra, '--output', file(`bad-${i}.csv`)),
      ),
    );
    runs.forEach((r, i) => {
      const [label, , message] = cases[i]!;
      expect({ label, status: r.status, stdout: r.stdout }).toEqual({ label, status: 2, stdout: '' });
      expect(r.stderr).toMatch(message);
      expect(existsSync(file(`bad-${i}.csv`))).toBe(false);
    });
    expectNoTemporaries();
  });

  it('a cell that is not a number names its row and column', () => {
    writeFileSync(file('broken.csv'), 'time_s,force,response\n0,1,2\n0.001,abc,3\n');
    const out = file('broken-out.csv');
    const r = plumbline('estimate', '--input', file('broken.csv'), '--x', 'force', '--y', 'response', '--block', '8', '--output', out);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/row 3, column "force": "abc" is not a finite number/);
    expect(existsSync(out)).toBe(false);
  });
});

describe('plumbline simulate → estimate → score', () => {
  it('round-trips a periodic record to rounding-level errors (exact synthesis, full-precision CSV)', async () => {
    const signals = file('periodic.csv');
    const exact = file('periodic-exact.csv');
    const sim = plumbline('simulate', '--scenario', 'arm-periodic-excitation', '--seed', '3', '--output', signals, '--exact', exact, '--block', '1024');
    expect(sim.status).toBe(0);
    expect(sim.stdout).toContain('32768 samples at 4096 Hz');
    const signalTable = parseNumericCsv(readFileSync(signals, 'utf8'), 'signals');
    expect(signalTable.columns).toEqual(['time_s', 'input', 'output']);
    expect(signalTable.rowCount).toBe(32768);
    const exactTable = parseNumericCsv(readFileSync(exact, 'utf8'), 'exact');
    expect(exactTable.columns).toEqual(['frequency_hz', 'h_re', 'h_im']);
    expect(exactTable.rowCount).toBe(513); // 0 … fs/2 at fs/1024

    const frf = file('periodic-frf.csv');
    const est = plumbline('estimate', '--input', signals, '--block', '1024', '--window', 'rectangular', '--overlap', '0',
      '--detrend', 'none', '--output', frf);
    expect(est.status).toBe(0);
    const [byFile, byScenario] = await Promise.all([
      plumblineAsync('score', '--exact', exact, '--estimate', frf, '--band', '200,1200', '--format', 'json'),
      plumblineAsync('score', '--scenario', 'arm-periodic-excitation', '--estimate', frf, '--band', '200,1200', '--format', 'json'),
    ]);
    for (const s of [byFile, byScenario]) {
      expect(s.status).toBe(0);
      const summary = JSON.parse(s.stdout) as { maxAbsMagnitudeDb: number; maxAbsPhaseDeg: number; maxComplexRelative: number; interpolatedLines: number; lines: number };
      // The block is one period of the steady-state response: the DFT is exact at every line
      // (leakage-free periodic excitation), so only rounding remains.
      expect(summary.maxAbsMagnitudeDb).toBeLessThan(1e-9);
      expect(summary.maxAbsPhaseDeg).toBeLessThan(1e-8);
      expect(summary.maxComplexRelative).toBeLessThan(1e-10);
      expect(summary.interpolatedLines).toBe(0);
      expect(summary.lines).toBe(251); // 200 … 1200 Hz at 4 Hz
    }
    const modes = (JSON.parse(byScenario.stdout) as { modes: { status: string }[] }).modes;
    expect(modes).toHaveLength(2);
    // 4 Hz lines against the 3.4 Hz half-power bandwidth at 340 Hz: too coarse for the method.
    expect(modes[0]!.status).toBe('not-resolvable');
    expect(modes[1]!.status).toBe('resolved');
  });

  it('gives the same samples for the same seed, bit for bit, and other samples for another seed', async () => {
    // A small scenario of its own (2 s at 512 Hz) keeps the three runs quick.
    const small = JSON.parse(readFileSync(join(ROOT, 'scenarios', 'frame-output-noise.json'), 'utf8')) as { acquisition: { durationS: number } };
    small.acquisition.durationS = 2;
    writeFileSync(file('small-scenario.json'), JSON.stringify(small));
    const [a, b, c] = await Promise.all(
      [['1', 'seed-a.csv'], ['1', 'seed-b.csv'], ['2', 'seed-c.csv']].map(([seed, name]) =>
        plumblineAsync('simulate', '--scenario', file('small-scenario.json'), '--seed', seed!, '--output', file(name!)),
      ),
    );
    expect([a.status, b.status, c.status]).toEqual([0, 0, 0]);
    const text = (name: string) => readFileSync(file(name), 'utf8');
    expect(parseNumericCsv(text('seed-a.csv'), 'a').rowCount).toBe(1024);
    expect(text('seed-a.csv')).toBe(text('seed-b.csv'));
    expect(text('seed-a.csv')).not.toBe(text('seed-c.csv'));
  });

  it('refuses a bad scenario with status 2, naming the field, and writes nothing', async () => {
    const broken = JSON.parse(readFileSync(join(ROOT, 'scenarios', 'frame-output-noise.json'), 'utf8')) as { acquisition: { sampleRateHz: number } };
    broken.acquisition.sampleRateHz = -512;
    writeFileSync(file('broken-scenario.json'), JSON.stringify(broken));
    writeFileSync(file('not-json.json'), '{ "name": ');
    const runs = await Promise.all([
      plumblineAsync('simulate', '--scenario', file('broken-scenario.json'), '--output', file('never-1.csv'), '--exact', file('never-2.csv')),
      plumblineAsync('simulate', '--scenario', file('not-json.json'), '--output', file('never-3.csv')),
      plumblineAsync('simulate', '--scenario', 'no-such-scenario', '--output', file('never-4.csv')),
      plumblineAsync('simulate', '--scenario', 'frame-output-noise', '--seed', '1.5', '--output', file('never-5.csv')),
    ]);
    expect(runs.map((r) => r.status)).toEqual([2, 2, 2, 2]);
    expect(runs[0]!.stderr).toContain('acquisition.sampleRateHz');
    expect(runs[1]!.stderr).toContain('is not valid JSON');
    expect(runs[2]!.stderr).toContain('no built-in of that name');
    expect(runs[3]!.stderr).toContain('--seed=1.5 must be a whole number');
    for (let i = 1; i <= 5; i++) expect(existsSync(file(`never-${i}.csv`))).toBe(false);
    expectNoTemporaries();
  });
});

describe('plumbline verify', () => {
  it('passes a leakage-free recipe on its scenario and fails it on random excitation with a delay (status 1)', async () => {
    const [pass, mixed] = await Promise.all([
      plumblineAsync('verify', '--recipe', 'arm-burst-random-rectangular', '--scenario', 'arm-burst-random', '--seeds', '2'),
      plumblineAsync('verify', '--recipe', 'arm-burst-random-rectangular', '--scenario', 'arm-burst-random', 'arm-channel-delay',
        '--seeds', '2', '--format', 'json'),
    ]);
    expect(pass.status).toBe(0);
    expect(pass.stdout).toMatch(/PASS\s+Arm, burst random excitation/);
    expect(pass.stdout).toMatch(/PASS\s+Magnitude bias \|mean error\|\s+[\d.e-]+ dB\s+≤ 0\.5 dB\s+[\d.]+ Hz/);
    expect(pass.stdout).not.toContain('FAIL');

    expect(mixed.status).toBe(1);
    const study = JSON.parse(mixed.stdout) as { pass: boolean; seedRule: { seedsPerScenario: number }; scenarios: { name: string; pass: boolean; seeds: number[]; judged: { criteria: { id: string; pass: boolean; observed: number; unit: string; worstLineHz: number }[] } }[] };
    expect(study.pass).toBe(false);
    expect(study.seedRule.seedsPerScenario).toBe(2);
    expect(study.scenarios.map((s) => s.pass)).toEqual([true, false]);
    // Seeds follow the documented rule: base 1, stride 1 000 000 per scenario.
    expect(study.scenarios[1]!.seeds).toEqual([1_000_001, 1_000_002]);
    const coherence = study.scenarios[1]!.judged.criteria.find((c) => c.id === 'min-coherence')!;
    // That scenario is continuous random excitation: rectangular blocks leak the resonances into
    // the anti-resonance, and the 12.5 ms delay costs a further (1 − τ/T)² (Bendat & Piersol), so
    // the recipe's 0.95 coherence floor fails.
    expect(coherence.pass).toBe(false);
    expect(coherence.observed).toBeLessThan(0.95);
    expect(coherence.worstLineHz).toBeGreaterThanOrEqual(200);
  });
});

describe('plumbline advise', () => {
  it('drafts a recipe that parses as a recipe, with the resolution rule Δf ≤ B_r/4', () => {
    const recipePath = file('advised.json');
    const r = plumbline('advise', '--scenario', 'frame-output-noise', '--target-db', '1', '--format', 'json', '--recipe-out', recipePath);
    expect(r.status).toBe(0);
    const advice = JSON.parse(r.stdout) as { frequencyResolutionHz: number; governingMode: { halfPowerBandwidthHz: number; naturalFrequencyHz: number } };
    expect(advice.governingMode.naturalFrequencyHz).toBe(46);
    // Common practice: a resolution no coarser than a quarter of the half-power bandwidth.
    expect(advice.frequencyResolutionHz).toBeLessThanOrEqual(advice.governingMode.halfPowerBandwidthHz / 4);
    const recipe = JSON.parse(readFileSync(recipePath, 'utf8')) as { tolerances: { magnitudeDb: number }; window: string };
    expect(recipe.tolerances.magnitudeDb).toBe(1);
    expect(recipe.window).toBe('hann');
    const bad = plumbline('advise', '--scenario', 'frame-output-noise', '--target-db', '0', '--recipe-out', file('advised-bad.json'));
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain('--target-db=0');
    expect(existsSync(file('advised-bad.json'))).toBe(false);
  });
});
