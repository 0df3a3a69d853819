/**
 * `npm run bench`: runs every tests/bench/*.bench.ts workload and prints the median wall time.
 * Each bench file exports `workloads: { name, run, setup?, repeats? }[]`; `setup` runs once,
 * `run` once untimed (warm-up) and then `repeats` times (default 7) timed.
 *
 *   npm run bench                 a table
 *   npm run bench -- --json       one JSON object per line: { workload, median_ms, runs, ... }
 *   npm run bench -- --only welch only workloads whose name contains "welch"
 *
 * When a python3 with SciPy is found, the reference library's timing of the same work
 * (tests/bench/reference_welch_bench.py) runs in the same invocation and is printed beside ours with the ratio
 * ours ÷ reference. OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE are unset for that child process only.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { performance } from 'node:perf_hooks';

export interface Workload {
  name: string;
  run: () => void;
  setup?: () => void;
  repeats?: number;
}

/** Reference timings that measure the same work as one of our workloads. */
const REFERENCES = [
  {
    workload: 'welch-2ch-2^21-4096-hann50',
    script: resolve(__dirname, 'reference_welch_bench.py'),
    args: ['21', '4096', '7'],
  },
];

interface Row {
  workload: string;
  median_ms: number;
  runs: number;
  reference_median_ms?: number;
  ratio?: number;
  reference_for?: string;
}

async function main(): Promise<void> {
  const argv = process.argv.slice(2);
  const json = argv.includes('--json');
  const onlyAt = argv.indexOf('--only');
  const only = onlyAt >= 0 ? argv[onlyAt + 1] : undefined;
  const files = readdirSync(__dirname).filter((f) => f.endsWith('.bench.ts')).sort();
  const rows: Row[] = [];
  for (const file of files) {
    const mod = (await import(join(__dirname, file))) as { workloads?: Workload[] };
    if (!Array.isArray(mod.workloads)) throw new Error(`${file} exports no workloads array`);
    for (const w of mod.workloads) {
      if (only && !w.name.includes(only)) continue;
      rows.push(measure(w));
      if (!json) process.stderr.write(`  ${w.name}: ${rows[rows.length - 1].median_ms.toFixed(1)} ms\n`);
    }
  }
  const python = findPythonWithScipy();
  for (const ref of REFERENCES) {
    const ours = rows.find((r) => r.workload === ref.workload && r.reference_for === undefined);
    if (!ours) continue;
    if (!python) {
      if (!json) process.stderr.write('  (no python3 with SciPy found: reference timing skipped)\n');
      continue;
    }
    const median = runReference(python, ref.script, ref.args);
    if (median === undefined) continue;
    ours.reference_median_ms = median.median;
    ours.ratio = ours.median_ms / median.median;
    rows.push({ workload: `reference:${ref.workload}`, median_ms: median.median, runs: median.runs, reference_for: ref.workload });
  }
  if (json) {
    for (const r of rows) process.stdout.write(`${JSON.stringify(r)}\n`);
  } else {
    printTable(rows);
  }
}

function measure(w: Workload): Row {
  w.setup?.();
  w.run(); // warm-up: JIT and caches
  const repeats = w.repeats ?? 7;
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    w.run();
    times.push(performance.now() - t0);
  }
  return { workload: w.name, median_ms: round(median(times)), runs: repeats };
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

function round(v: number): number {
  return Math.round(v * 100) / 100;
}

function childEnv(): NodeJS.ProcessEnv {
  const env = { ...process.env };
  delete env.OPENBLAS_CORETYPE;
  delete env.OPENBLAS_L2_SIZE;
  return env;
}

function findPythonWithScipy(): string | undefined {
  for (const candidate of ['python3', '/usr/bin/python3']) {
    const r = spawnSync(candidate, ['-c', 'import scipy, numpy'], { env: childEnv(), encoding: 'utf8' });
    if (r.status === 0) return candidate;
  }
  return undefined;
}

function runReference(python: string, script: string, args: string[]): { median: number; runs: number } | undefined {
  if (!existsSync(script)) {
    process.stderr.write(`  (reference script ${script} not found)\n`);
    return undefined;
  }
  const r = spawnSync(python, [script, ...args], { env: childEnv(), encoding: 'utf8' });
  const m = /median_ms=([\d.]+)/.exec(r.stdout ?? '');
  if (r.status !== 0 || !m) {
    process.stderr.write(`  (reference ${script} failed: ${(r.stderr ?? '').trim().split('\n').pop()})\n`);
    return undefined;
  }
  return { median: Number(m[1]), runs: Number(args[2] ?? 7) };
}

function printTable(rows: Row[]): void {
  const head = ['workload', 'median ms', 'runs', 'SciPy ms', 'ours ÷ SciPy'];
  const body = rows.map((r) => [
    r.workload,
    r.median_ms.toFixed(1),
    String(r.runs),
    r.reference_median_ms === undefined ? '' : r.reference_median_ms.toFixed(1),
    r.ratio === undefined ? '' : r.ratio.toFixed(2),
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...body.map((b) => b[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  process.stdout.write(`${line(head)}\n${widths.map((w) => '-'.repeat(w)).join('  ')}\n`);
  for (const b of body) process.stdout.write(`${line(b)}\n`);
}

main().catch((e: unknown) => {
  process.stderr.write(`${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
  process.exitCode = 1;
});
