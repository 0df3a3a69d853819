/**
 * Faults with real processes: the server runs as a child process (`node --require tsx/cjs
 * server/main.ts`) and is killed with SIGKILL in the middle of a study and in the middle of an
 * upload, then restarted on the same DATA_DIR. The study must resume to exactly the numbers of an
 * uninterrupted study, the upload must be whole or absent, and SQLite's `PRAGMA integrity_check`
 * must answer 'ok' after each kill. Then, in-process, a read-only and a full database must give a
 * clear 503 naming the cause and leave the data consistent.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { createDb } from '@/server/db/knex';
import { DEMO_LAB, DEMO_USERS } from '@/server/seed/demo-lab';
import { startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { sessionCookie, smallRecipe, smallScenario, waitForStudy } from './work-fixtures';

const ROOT = path.resolve(__dirname, '../..');
const analystEmail = DEMO_USERS.find((u) => u.role === 'analyst')!.email;

interface Child {
  url: string;
  proc: ChildProcess;
  exited: Promise<void>;
}

/** Starts `server/main.ts` in its own process on DATA_DIR; resolves once it prints its URL. */
function spawnServer(dataDir: string): Promise<Child> {
  const proc = spawn(process.execPath, ['--require', 'tsx/cjs', 'server/main.ts'], {
    cwd: ROOT,
    env: {
      ...process.env,
      NODE_ENV: 'test',
      PORT: '0',
      FAKE_SMTP_PORT: '0',
      DATA_DIR: dataDir,
      WEB_DIR: path.join(dataDir, 'web'),
      LOG_LEVEL: 'warn',
      DEMO_PASSWORD: TEST_PASSWORD,
      STUDY_WORKERS: '1',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const exited = new Promise<void>((resolve) => proc.once('exit', () => resolve()));
  return new Promise((resolve, reject) => {
    let out = '';
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${out}`)), 30_000);
    const onData = (chunk: Buffer) => {
      out += chunk.toString();
      const m = /running at (http:\/\/[^\s]+)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve({ url: m[1]!, proc, exited });
      }
    };
    proc.stdout!.on('data', onData);
    proc.stderr!.on('data', onData);
    proc.once('exit', (code) => reject(new Error(`server exited (${code}) before starting:\n${out}`)));
  });
}

async function kill(child: Child): Promise<void> {
  child.proc.kill('SIGKILL');
  await child.exited;
}

/** SQLite's own consistency check of the file, through a connection of our own. */
async function integrity(file: string): Promise<string> {
  const db = createDb(file);
  try {
    const rows = await db.raw('PRAGMA integrity_check');
    return rows.map((r: { integrity_check: string }) => r.integrity_check).join('; ');
  } finally {
    await db.destroy();
  }
}

async function signIn(url: string) {
  const a = request.agent(url);
  await a.post('/api/v1/auth/sign-in').send({ email: analystEmail, password: TEST_PASSWORD }).expect(200);
  return a;
}

const children: Child[] = [];
const dirs: string[] = [];
afterAll(async () => {
  for (const c of children) if (c.proc.exitCode === null && c.proc.signalCode === null) await kill(c);
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

describe('SIGKILL of a real server process', () => {
  let dataDir: string;
  let dbFile: string;
  let labPath: string;
  let recipeId: string;

  beforeAll(() => {
    dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-faults-'));
    dirs.push(dataDir);
    dbFile = path.join(dataDir, 'plumbline.sqlite');
  });

  it('mid-study: the restarted server resumes to the numbers of an uninterrupted study, bit for bit', async () => {
    const first = await spawnServer(dataDir);
    children.push(first);
    const analyst = await signIn(first.url);
    const labDb = createDb(dbFile);
    const labId: string = (await labDb('labs').where({ slug: DEMO_LAB.slug }).first('id')).id;
    await labDb.destroy();
    labPath = `/api/v1/labs/${labId}`;
    // Records of 16384 samples and one worker: each run takes long enough for the kill to land mid-study.
    const long = (name: string, snrDb: number) => ({ ...smallScenario(name, snrDb), acquisition: { sampleRateHz: 512, durationS: 32 } });
    const a = (await analyst.post(`${labPath}/scenarios`).send({ definition: long('Kill A', 30) }).expect(201)).body.id;
    const b = (await analyst.post(`${labPath}/scenarios`).send({ definition: long('Kill B', 15) }).expect(201)).body.id;
    recipeId = (await analyst.post(`${labPath}/recipes`).send({ definition: { ...smallRecipe('Kill recipe'), blockLength: 1024 } }).expect(201)).body.id;
    const body = { recipe: { id: recipeId }, scenarios: [{ id: a }, { id: b }], seeds: 8, baseSeed: 40 };
    const killed = (await analyst.post(`${labPath}/studies`).send({ name: 'Killed mid-study', ...body }).expect(202)).body.id;

    // Kill as soon as the API shows two stored runs.
    for (;;) {
      const { body: s } = await analyst.get(`${labPath}/studies/${killed}`).expect(200);
      if (s.progress.done >= 2) break;
      await new Promise((r) => setTimeout(r, 20));
    }
    await kill(first);
    expect(await integrity(dbFile)).toBe('ok');
    const disk = createDb(dbFile);
    const atKill = Number((await disk('runs').where({ study_id: killed }).count({ n: '*' }).first())?.n);
    await disk.destroy();
    expect(atKill).toBeGreaterThanOrEqual(2);
    expect(atKill).toBeLessThan(16);

    const second = await spawnServer(dataDir);
    children.push(second);
    const analyst2 = await signIn(second.url);
    const resumed = await waitForStudy(analyst2, `${labPath}/studies/${killed}`, 80_000);
    expect(resumed).toMatchObject({ status: 'finished', progress: { done: 16, failed: 0, total: 16 } });
    const straight = (await analyst2.post(`${labPath}/studies`).send({ name: 'Uninterrupted', ...body }).expect(202)).body.id;
    expect((await waitForStudy(analyst2, `${labPath}/studies/${straight}`, 80_000)).status).toBe('finished');

    const results = async (id: string) => ({ ...(await analyst2.get(`${labPath}/studies/${id}/results`).expect(200)).body, studyId: null });
    expect(await results(killed)).toEqual(await results(straight));
    await kill(second);
    expect(await integrity(dbFile)).toBe('ok');

    // Stored blobs, byte for byte (runs and aggregated curves), read from the file itself.
    const db = createDb(dbFile);
    try {
      const runs = async (id: string) =>
        (await db('runs').where({ study_id: id }).orderBy(['position', 'seed_index']).select('position', 'seed_index', 'seed', 'line_scores')).map(
          (r) => `${r.position}:${r.seed_index}:${r.seed}:${(r.line_scores as Buffer).toString('base64')}`,
        );
      const curves = async (id: string) =>
        (await db('result_curves').where({ study_id: id }).orderBy(['scenario_id', 'kind']).select('kind', 'data')).map((r) => `${r.kind}:${(r.data as Buffer).toString('base64')}`);
      const runsKilled = await runs(killed);
      expect(runsKilled).toHaveLength(16);
      expect(runsKilled).toEqual(await runs(straight));
      const curvesKilled = await curves(killed);
      expect(curvesKilled.length).toBeGreaterThan(30);
      expect(curvesKilled).toEqual(await curves(straight));
    } finally {
      await db.destroy();
    }
  }, 120_000);

  it('mid-upload: after restart each upload is whole or absent, and no temporary file is left', async () => {
    const server = await spawnServer(dataDir);
    children.push(server);
    const analyst = await signIn(server.url);
    // One whole upload first: it must survive the kill with its file and checksum.
    const csv = ['time_s,input,output', ...Array.from({ length: 4096 }, (_, i) => `${i / 512},${Math.sin(i * 0.37)},${2 * Math.sin(i * 0.37)}`)].join('\n') + '\n';
    const whole = await analyst.post(`${labPath}/uploads`).field('kind', 'time-data').field('recipeId', recipeId).attach('file', Buffer.from(csv), 'whole.csv').expect(201);
    const wholeId: string = whole.body.upload?.id ?? whole.body.id;

    // A second upload streamed slowly: killed while its body is still arriving.
    const session = await sessionCookie(server.url, analystEmail, TEST_PASSWORD);
    const boundary = 'plumbline-fault-boundary';
    const u = new URL(`${server.url}${labPath}/uploads`);
    const req = http.request({ host: u.hostname, port: u.port, path: u.pathname, method: 'POST', headers: { cookie: session, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(30 * 1024 * 1024) } });
    req.on('error', () => {}); // the connection dies with the server
    req.write(`--${boundary}\r\nContent-Disposition: form-data; name="kind"\r\n\r\ntime-data\r\n`);
    req.write(`--${boundary}\r\nContent-Disposition: form-data; name="recipeId"\r\n\r\n${recipeId}\r\n`);
    req.write(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="big.csv"\r\nContent-Type: text/csv\r\n\r\ntime_s,input,output\n`);
    const incoming = path.join(dataDir, 'uploads', 'incoming');
    const partial = () => (fs.existsSync(incoming) ? fs.readdirSync(incoming).filter((f) => fs.statSync(path.join(incoming, f)).size > 100_000) : []);
    const chunk = Array.from({ length: 4000 }, (_, i) => `${i / 512},0.25,0.5`).join('\n') + '\n';
    for (let i = 0; i < 400 && partial().length === 0; i++) {
      req.write(chunk);
      await new Promise((r) => setTimeout(r, 10));
    }
    expect(partial().length).toBe(1); // a half-received temporary file is on disk at the kill
    await kill(server);
    req.destroy();
    expect(await integrity(dbFile)).toBe('ok');

    // Restart: the start-up sweep removes the half-received file.
    const again = await spawnServer(dataDir);
    children.push(again);
    const analyst2 = await signIn(again.url);
    expect(fs.readdirSync(incoming)).toEqual([]);
    const list = (await analyst2.get(`${labPath}/uploads`).expect(200)).body;
    const items: { id: string; originalName: string }[] = list.items ?? list;
    expect(items.map((x) => x.originalName)).toEqual(['whole.csv']);
    expect(items[0]!.id).toBe(wholeId);
    await analyst2.get(`${labPath}/uploads/${wholeId}/result`).expect(200);
    await kill(again);

    // No row without a file, no file without a row; the whole file has its stored checksum.
    const db = createDb(dbFile);
    try {
      const rows = await db('uploads').select('stored_name', 'sha256', 'size_bytes');
      const files = fs.readdirSync(path.join(dataDir, 'uploads')).filter((f) => f !== 'incoming').sort();
      expect(rows.map((r) => r.stored_name).sort()).toEqual(files);
      const bytes = fs.readFileSync(path.join(dataDir, 'uploads', rows[0]!.stored_name));
      expect(bytes.length).toBe(rows[0]!.size_bytes);
      expect(createHash('sha256').update(bytes).digest('hex')).toBe(rows[0]!.sha256);
    } finally {
      await db.destroy();
    }
    expect(await integrity(dbFile)).toBe('ok');
  }, 60_000);
});

describe('the database refuses writes', () => {
  let t: TestServer;
  let analyst: request.Agent;
  let labPath: string;
  beforeAll(async () => {
    t = await startTestServer();
    analyst = await t.signIn('analyst');
    labPath = `/api/v1/labs/${t.labId}`;
  }, 30_000);
  afterAll(() => t.close());

  const count = async (table: string) => Number((await t.db(table).count({ n: '*' }).first())?.n);
  const integrityHere = async () => (await t.db.raw('PRAGMA integrity_check')).map((r: { integrity_check: string }) => r.integrity_check).join('; ');

  it('read-only: a clear 503 naming the cause, nothing stored, the file intact', async () => {
    const before = await count('scenarios');
    // The server's one connection (pool max 1) is switched to read-only mode (sqlite.org/pragma.html#pragma_query_only).
    await t.db.raw('PRAGMA query_only = ON');
    try {
      const res = await analyst.post(`${labPath}/scenarios`).send({ definition: smallScenario('Read-only attempt') }).expect(503);
      expect(res.body.error).toMatchObject({ code: 'storage_read_only' });
      expect(res.body.error.message).toMatch(/read-only/);
      await analyst.get(`${labPath}/scenarios`).expect(200); // reads still answer
    } finally {
      await t.db.raw('PRAGMA query_only = OFF');
    }
    expect(await count('scenarios')).toBe(before);
    expect(await integrityHere()).toBe('ok');
    await analyst.post(`${labPath}/scenarios`).send({ definition: smallScenario('After read-only') }).expect(201);
  });

  it('full: a clear 503 naming the cause, the failed write rolled back, the audit chain intact', async () => {
    const pages = Number((await t.db.raw('PRAGMA page_count'))[0].page_count);
    // Cap the file at its current size: the next write that needs a new page fails with SQLITE_FULL,
    // as on a full disk (sqlite.org/pragma.html#pragma_max_page_count).
    await t.db.raw(`PRAGMA max_page_count = ${pages}`);
    const created: string[] = [];
    let refused: request.Response | null = null;
    try {
      const description = 'x'.repeat(4000);
      for (let i = 0; i < 200 && !refused; i++) {
        const res = await analyst.post(`${labPath}/scenarios`).send({ definition: { ...smallScenario(`Filling ${i}`), description } });
        if (res.status === 201) created.push(res.body.id);
        else refused = res;
      }
    } finally {
      await t.db.raw('PRAGMA max_page_count = 1073741823');
    }
    expect(refused?.status).toBe(503);
    expect(refused?.body.error).toMatchObject({ code: 'storage_full' });
    expect(refused?.body.error.message).toMatch(/full/);
    // The refused scenario left no row and no version; every stored one is whole.
    const names = (await t.db('scenarios').select('name')).map((r) => r.name);
    expect(names.filter((n) => n.startsWith('Filling')).sort()).toEqual(created.map((_, i) => `Filling ${i}`).sort());
    const unversioned = await t.db('scenarios as s').leftJoin('scenario_versions as v', function () {
      this.on('v.scenario_id', 's.id').andOn('v.version', 's.latest_version');
    }).whereNull('v.scenario_id').count({ n: '*' }).first();
    expect(Number(unversioned?.n)).toBe(0);
    expect(await integrityHere()).toBe('ok');
    const auditor = await t.signIn('auditor');
    expect((await auditor.get(`${labPath}/audit/verify`).expect(200)).body).toMatchObject({ ok: true });
    await analyst.post(`${labPath}/scenarios`).send({ definition: smallScenario('After full') }).expect(201);
  });
});

describe('a run that fails in its worker thread', () => {
  let t: TestServer;
  afterAll(() => t?.close());

  it('fails those runs, not the server: the other scenario finishes and the pool carries on', async () => {
    t = await startTestServer({ STUDY_WORKERS: '1' });
    const analyst = await t.signIn('analyst');
    const lab = `/api/v1/labs/${t.labId}`;
    // A softening cubic spring this strong makes the response diverge: the pre-flight check cannot
    // foresee it, so the engine throws in the worker (shared/engine/synthesis: "makes the response
    // diverge at this level").
    const short = (await analyst.post(`${lab}/scenarios`).send({ definition: { ...smallScenario('Diverging spring'), errors: { cubicStiffness: { k3NPerM3: -1e14 } } } }).expect(201)).body.id;
    const ok = (await analyst.post(`${lab}/scenarios`).send({ definition: smallScenario('Long enough') }).expect(201)).body.id;
    const recipe = (await analyst.post(`${lab}/recipes`).send({ definition: smallRecipe('Small recipe') }).expect(201)).body.id;
    const start = await analyst.post(`${lab}/studies`).send({ name: 'One scenario fails', recipe: { id: recipe }, scenarios: [{ id: short }, { id: ok }], seeds: 2, baseSeed: 3 });
    expect(start.status).toBe(202);
    const ended = await waitForStudy(analyst, `${lab}/studies/${start.body.id}`);
    const runs = await t.db('runs').where({ study_id: start.body.id }).orderBy(['position', 'seed_index']).select('position', 'status', 'error');
    expect(runs.map((r) => [r.position, r.status])).toEqual([
      [0, 'failed'],
      [0, 'failed'],
      [1, 'finished'],
      [1, 'finished'],
    ]);
    expect(runs[0]!.error).toMatch(/diverge/);
    expect(ended).toMatchObject({ progress: { done: 4, failed: 2, total: 4 } });
    // The server and its pool carry on: another study on the same server finishes.
    const next = (await analyst.post(`${lab}/studies`).send({ name: 'After the failure', recipe: { id: recipe }, scenarios: [{ id: ok }], seeds: 2, baseSeed: 3 }).expect(202)).body.id;
    expect((await waitForStudy(analyst, `${lab}/studies/${next}`)).status).toBe('finished');
  }, 60_000);
});

describe('a worker thread that runs out of memory', () => {
  let t: TestServer;
  afterAll(() => t?.close());

  it('fails its run with the cause, not the server', async () => {
    // Each thread's heap capped at 96 MB (STUDY_WORKER_HEAP_MB → piscina resourceLimits).
    t = await startTestServer({ STUDY_WORKERS: '1', STUDY_WORKER_HEAP_MB: '96' });
    const analyst = await t.signIn('analyst');
    const lab = `/api/v1/labs/${t.labId}`;
    // 2^22 samples: measured to need more than 96 MB of worker heap (docs/reliability.md).
    const huge = (await analyst.post(`${lab}/scenarios`).send({ definition: { ...smallScenario('Too big for the worker'), acquisition: { sampleRateHz: 512, durationS: 8192 } } }).expect(201)).body.id;
    const ok = (await analyst.post(`${lab}/scenarios`).send({ definition: smallScenario('Fits') }).expect(201)).body.id;
    const recipe = (await analyst.post(`${lab}/recipes`).send({ definition: smallRecipe('Memory recipe') }).expect(201)).body.id;
    const study = (await analyst.post(`${lab}/studies`).send({ name: 'Out of memory', recipe: { id: recipe }, scenarios: [{ id: huge }, { id: ok }], seeds: 1, baseSeed: 5 }).expect(202)).body.id;
    const ended = await waitForStudy(analyst, `${lab}/studies/${study}`);
    const runs = await t.db('runs').where({ study_id: study }).orderBy('position').select('position', 'status', 'error');
    expect(runs.map((r) => [r.position, r.status])).toEqual([
      [0, 'failed'],
      [1, 'finished'],
    ]);
    expect(runs[0]!.error).toMatch(/memory/i);
    expect(ended).toMatchObject({ progress: { done: 2, failed: 1, total: 2 } });
    await analyst.get(`${lab}/studies`).expect(200); // the same server process still answers
    const next = (await analyst.post(`${lab}/studies`).send({ name: 'After the out-of-memory run', recipe: { id: recipe }, scenarios: [{ id: ok }], seeds: 2, baseSeed: 5 }).expect(202)).body.id;
    expect((await waitForStudy(analyst, `${lab}/studies/${next}`)).status).toBe('finished');
  }, 60_000);
});
