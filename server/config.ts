/**
 * The server's configuration: one typed schema read from the environment at start. A bad value
 * stops the process with a message naming the variable (see main.ts).
 */
import path from 'node:path';
import { z } from 'zod';

const bool = z
  .enum(['true', 'false', '1', '0', 'yes', 'no'])
  .transform((v) => v === 'true' || v === '1' || v === 'yes');
/** The demo password printed in the README: no account may keep it in production. */
export const PUBLISHED_DEMO_PASSWORD = 'plumb-line-demo-2026';

const port = z.coerce.number().int().min(0).max(65535);

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: port.default(8080),
  PUBLIC_URL: z.string().url().optional(),
  DATA_DIR: z.string().min(1).default('data'),
  DATABASE_FILE: z.string().min(1).optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  SESSION_IDLE_HOURS: z.coerce.number().positive().max(24 * 30).default(12),
  SESSION_ABSOLUTE_HOURS: z.coerce.number().positive().max(24 * 90).default(24 * 7),
  SMTP_HOST: z.string().min(1).optional(),
  SMTP_PORT: port.optional(),
  SMTP_SECURE: bool.default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().min(3).default('Plumbline <plumbline@harborridge.test>'),
  // Unset: a free port is taken, so two instances on one machine never collide (printed at start).
  FAKE_SMTP_PORT: port.default(0),
  // Unset: on in development and test, off in production (the demo password is published).
  DEMO_SEED: bool.optional(),
  DEMO_PASSWORD: z.string().min(12, 'must be at least 12 characters').default(PUBLISHED_DEMO_PASSWORD),
  STUDY_WORKERS: z.coerce.number().int().min(1).max(16).default(2),
  // Heap limit of each study worker thread, MB; unset = V8's default. Below about 96 MB a worker
  // that hits it can abort the whole process instead of failing its run (docs/reliability.md).
  STUDY_WORKER_HEAP_MB: z.coerce.number().int().min(96).max(65536).optional(),
  WEB_DIR: z.string().min(1).default('dist/web'),
  // Behind a reverse proxy: which proxies' X-Forwarded-For to believe (Express's "trust proxy":
  // a hop count, "loopback", or addresses). Unset: none, so a client cannot choose its own address.
  TRUST_PROXY: z.string().min(1).optional(),
  // The audit key (services/audit-key.ts): as text, or a file (default DATA_DIR/audit-key).
  AUDIT_KEY: z.string().min(32, 'must be at least 32 characters').optional(),
  AUDIT_KEY_FILE: z.string().min(1).optional(),
  AUDIT_CHECKPOINT_FILE: z.string().min(1).optional(),
  // Days after holding the admin role in a lab before an account may decide its reviews.
  APPROVAL_ADMIN_COOLING_DAYS: z.coerce.number().int().min(0).max(3650).default(30),
});

export interface Config {
  env: 'development' | 'production' | 'test';
  host: string;
  port: number;
  publicUrl: string;
  dataDir: string;
  databaseFile: string;
  logLevel: z.infer<typeof envSchema>['LOG_LEVEL'];
  session: { idleHours: number; absoluteHours: number };
  /** Real SMTP when host is set; otherwise the local fake server on fakePort. */
  mail: {
    from: string;
    smtp: { host: string; port: number; secure: boolean; user?: string; password?: string } | null;
    fakePort: number;
  };
  demo: { seed: boolean; password: string };
  /** Express "trust proxy" value; false unless TRUST_PROXY is set. */
  trustProxy: boolean | number | string;
  studyWorkers: number;
  /** Old-generation heap limit of each study worker thread, MB; null = V8's default. */
  studyWorkerHeapMb: number | null;
  webDir: string;
  /** The audit key (text, or null to use keyFile) and the checkpoint file, outside the database. */
  audit: { key: string | null; keyFile: string; checkpointFile: string };
  /** Days after holding the admin role in a lab before an account may decide its reviews. */
  approvalAdminCoolingDays: number;
}

export class ConfigError extends Error {}

/** Reads and checks the configuration; throws ConfigError naming every bad variable. */
export function loadConfig(env: Record<string, string | undefined> = process.env, cwd = process.cwd()): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => {
      const name = String(i.path[0]);
      return `${name}=${JSON.stringify(env[name] ?? '')}: ${i.message}`;
    });
    throw new ConfigError(`Invalid configuration:\n  ${lines.join('\n  ')}`);
  }
  const e = parsed.data;
  if (e.AUDIT_KEY !== undefined && e.AUDIT_KEY_FILE !== undefined) {
    throw new ConfigError('Invalid configuration:\n  AUDIT_KEY and AUDIT_KEY_FILE are both set: give the audit key one way only.');
  }
  const dataDir = path.resolve(cwd, e.DATA_DIR);
  const smtp = e.SMTP_HOST
    ? { host: e.SMTP_HOST, port: e.SMTP_PORT ?? 587, secure: e.SMTP_SECURE, user: e.SMTP_USER, password: e.SMTP_PASSWORD }
    : null;
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    publicUrl: (e.PUBLIC_URL ?? `http://localhost:${e.PORT}`).replace(/\/$/, ''),
    dataDir,
    databaseFile: e.DATABASE_FILE === ':memory:' ? ':memory:' : path.resolve(dataDir, e.DATABASE_FILE ?? 'plumbline.sqlite'),
    logLevel: e.LOG_LEVEL,
    session: { idleHours: e.SESSION_IDLE_HOURS, absoluteHours: e.SESSION_ABSOLUTE_HOURS },
    mail: { from: e.MAIL_FROM, smtp, fakePort: e.FAKE_SMTP_PORT },
    demo: { seed: e.DEMO_SEED ?? e.NODE_ENV !== 'production', password: e.DEMO_PASSWORD },
    trustProxy: trustProxyValue(e.TRUST_PROXY),
    studyWorkers: e.STUDY_WORKERS,
    studyWorkerHeapMb: e.STUDY_WORKER_HEAP_MB ?? null,
    webDir: path.resolve(cwd, e.WEB_DIR),
    audit: {
      key: e.AUDIT_KEY ?? null,
      keyFile: path.resolve(dataDir, e.AUDIT_KEY_FILE ?? 'audit-key'),
      checkpointFile: path.resolve(dataDir, e.AUDIT_CHECKPOINT_FILE ?? 'audit-checkpoints.log'),
    },
    approvalAdminCoolingDays: e.APPROVAL_ADMIN_COOLING_DAYS,
  };
}

/** TRUST_PROXY as Express reads it: "true"/"false", a hop count, or a list of addresses/names. */
function trustProxyValue(v: string | undefined): boolean | number | string {
  if (v === undefined || v === 'false') return false;
  if (v === 'true') return true;
  return /^\d+$/.test(v) ? Number(v) : v;
}
