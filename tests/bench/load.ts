/**
 * `npm run load [-- --seconds 20 --workers 2 --connections 5 --json]`: a bounded load run against a real server on 127.0.0.1.
 * The server runs as its own process (so the load generator does not share its event loop) on a
 * temp DATA_DIR with the demo lab; simulated users of every role sign in; one large study keeps
 * both study workers busy for the whole window; then autocannon sends, for a fixed time,
 *   reads  — study, scenario, recipe and upload lists, one study's results, runs and progress
 *            (one connection per simulated user by default, each sending its next request as soon
 *            as the last is answered), and
 *   starts — small studies started by the analysts at a fixed low rate,
 * and prints requests/s, p50/p97.5/p99 latency, errors and non-2xx answers of each. The goal set
 * for the product: no errors and reads' p99 under 100 ms during the full-load study. This is a
 * measurement, not a test: it never fails on speed. Only 127.0.0.1 is ever targeted.
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { DEMO_USERS } from '@/server/seed/demo-lab';
import { smallRecipe, smallScenario } from '@/tests/server/work-fixtures';

// autocannon 9 ships no types; the part used here.
interface CannonResult {
  requests: { average: number; total: number };
  latency: { p50: number; p97_5: number; p99: number; max: number; average: number };
  errors: number;
  timeouts: number;
  non2xx: number;
  duration: number;
}
const autocannon = require('autocannon') as (opts: Record<string, unknown>) => Promise<CannonResult>;

const HOST = '127.0.0.1';
const PASSWORD = 'load-run-demo-password-2026';
const args = process.argv.slice(2);
const seconds = Number(args[args.indexOf('--seconds') + 1]) || 20;
const asJson = args.includes('--json');
const workers = Number(args[args.indexOf('--workers') + 1]) || 2;
/** Read connections; by default one per simulated user (the five demo users), each reading in turn. */
const connections = Number(args[args.indexOf('--connections') + 1]) || DEMO_USERS.length;

function startServer(dataDir: string): Promise<{ url: string; stop(): Promise<void> }> {
  const root = path.resolve(__dirname, '../..');
  const proc = spawn(process.execPath, ['--require', 'tsx/cjs', 'server/main.ts'], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'test', HOST, PORT: '0', FAKE_SMTP_PORT: '0', DATA_DIR: dataDir, WEB_DIR: path.join(dataDir, 'web'), LOG_LEVEL: 'warn', DEMO_PASSWORD: PASSWORD, STUDY_WORKERS: String(workers) },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const exited = new Promise<void>((r) => proc.once('exit', () => r()));
  return new Promise((resolve, reject) => {
    let out = '';
    proc.stdout!.on('data', (c: Buffer) => {
      out += c.toString();
      const m = /running at (http:\/\/127\.0\.0\.1:\d+)/.exec(out);
      if (m) resolve({ url: m[1]!, stop: async () => (proc.kill('SIGTERM'), exited) });
    });
    proc.once('exit', (code) => reject(new Error(`server exited (${code}):\n${out}`)));
  });
}

async function api(url: string, method: string, p: string, cookie: string, body?: unknown) {
  const res = await fetch(`${url}${p}`, { method, headers: { cookie, 'content-type': 'application/json' }, body: body ? JSON.stringify(body) : undefined });
  const json = await res.json().catch(() => null);
  if (!res.ok) throw new Error(`${method} ${p}: ${res.status} ${JSON.stringify(json)}`);
  return { json, res };
}

async function signIn(url: string, email: string): Promise<string> {
  const res = await fetch(`${url}/api/v1/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email, password: PASSWORD }) });
  if (!res.ok) throw new Error(`sign-in ${email}: ${res.status}`);
  return (res.headers.get('set-cookie') ?? '').split(';')[0]!;
}

async function main() {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-load-'));
  const server = await startServer(dataDir);
  try {
    if (new URL(server.url).hostname !== HOST) throw new Error(`refusing to load ${server.url}: 127.0.0.1 only`);
    const cookies = await Promise.all(DEMO_USERS.map((u) => signIn(server.url, u.email)));
    const analysts = DEMO_USERS.map((u, i) => ({ u, c: cookies[i]! })).filter((x) => x.u.role === 'analyst').map((x) => x.c);
    const me = (await api(server.url, 'GET', '/api/v1/me', analysts[0]!)).json;
    const labId: string = me?.memberships?.[0]?.labId;
    if (!labId) throw new Error(`no lab in /me: ${JSON.stringify(me)}`);
    const lab = `/api/v1/labs/${labId}`;
    const a = analysts[0]!;
    const scenario = (await api(server.url, 'POST', `${lab}/scenarios`, a, { definition: smallScenario('Load: small record') })).json.id;
    const large = (await api(server.url, 'POST', `${lab}/scenarios`, a, { definition: { ...smallScenario('Load: long record', 20), acquisition: { sampleRateHz: 512, durationS: 128 } } })).json.id;
    const recipe = (await api(server.url, 'POST', `${lab}/recipes`, a, { definition: smallRecipe('Load recipe') })).json.id;
    const small = { recipe: { id: recipe }, scenarios: [{ id: scenario }], seeds: 2, baseSeed: 1 };
    // One finished study whose results are read during the run.
    const done = (await api(server.url, 'POST', `${lab}/studies`, a, { name: 'Load: read target', ...small })).json.id;
    for (let i = 0; ; i++) {
      const s = (await api(server.url, 'GET', `${lab}/studies/${done}`, a)).json;
      if (s.status === 'finished') break;
      if (i > 600) throw new Error(`read-target study still ${s.status}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    // The large study: enough runs to keep both workers busy past the window.
    const big = (await api(server.url, 'POST', `${lab}/studies`, a, { name: 'Load: full-load study', recipe: { id: recipe }, scenarios: [{ id: large }, { id: scenario }], seeds: 500, baseSeed: 9 })).json.id;

    const readPaths = [`${lab}/studies`, `${lab}/scenarios`, `${lab}/recipes`, `${lab}/uploads`, `${lab}/studies/${done}/results`, `${lab}/studies/${done}/runs`, `${lab}/studies/${big}`];
    const readers = cookies.flatMap((cookie) => readPaths.map((p) => ({ method: 'GET', path: p, headers: { cookie } })));
    const starts = analysts.map((cookie) => ({ method: 'POST', path: `${lab}/studies`, headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify({ name: 'Load: small start', ...small }) }));

    const before = (await api(server.url, 'GET', `${lab}/studies/${big}`, a)).json.progress;
    const [reads, writes] = await Promise.all([
      autocannon({ url: server.url, connections, duration: seconds, requests: readers }),
      autocannon({ url: server.url, connections: 2, overallRate: 2, duration: seconds, requests: starts }),
    ]);
    const after = (await api(server.url, 'GET', `${lab}/studies/${big}`, a)).json;
    // Each read alone (one at a time, 15 times) while the large study still runs: which one is slow.
    const perPath: Record<string, number> = {};
    for (const p of readPaths) {
      const times: number[] = [];
      for (let i = 0; i < 15; i++) {
        const t0 = performance.now();
        await api(server.url, 'GET', p, a);
        times.push(performance.now() - t0);
      }
      times.sort((x, y) => x - y);
      perPath[p.replace(lab, '').replace(done, ':finished').replace(big, ':large')] = Math.round(times[7]! * 10) / 10;
    }

    const row = (name: string, r: CannonResult) => ({
      name,
      requestsPerSecond: Math.round(r.requests.average * 10) / 10,
      requests: r.requests.total,
      p50Ms: r.latency.p50,
      p97_5Ms: r.latency.p97_5,
      p99Ms: r.latency.p99,
      maxMs: r.latency.max,
      errors: r.errors,
      timeouts: r.timeouts,
      non2xx: r.non2xx,
    });
    const report = {
      seconds,
      studyWorkers: workers,
      readConnections: connections,
      loadAverage: os.loadavg().map((x) => Math.round(x * 100) / 100),
      host: HOST,
      cpus: os.cpus().length,
      node: process.version,
      largeStudy: { status: after.status, runsDuringWindow: after.progress.done - before.done, done: after.progress.done, total: after.progress.total },
      reads: row('reads', reads),
      starts: row('small study starts', writes),
      medianMsAlone: perPath,
      goal: { noErrors: reads.errors + reads.timeouts + reads.non2xx + writes.errors + writes.timeouts + writes.non2xx === 0, readsP99Under100Ms: reads.latency.p99 < 100 },
    };
    if (asJson) console.log(JSON.stringify(report, null, 2));
    else {
      console.log(`Load on ${server.url}, ${seconds} s, ${workers} study workers, ${connections} read connections, ${report.cpus} CPUs (load average ${report.loadAverage.join(' ')}), Node ${report.node}`);
      console.log(`Large study ${report.largeStudy.status}: ${report.largeStudy.runsDuringWindow} runs stored during the window (${report.largeStudy.done}/${report.largeStudy.total})`);
      console.table([report.reads, report.starts]);
      console.log('Median of each read alone during the study (ms):', perPath);
      console.log(`Goal: no errors ${report.goal.noErrors ? 'met' : 'NOT met'}; reads p99 < 100 ms ${report.goal.readsP99Under100Ms ? 'met' : 'NOT met'}`);
    }
  } finally {
    await server.stop();
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
