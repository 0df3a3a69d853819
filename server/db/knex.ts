/**
 * The database: SQLite through Knex and better-sqlite3. One connection (pool max 1) so that a
 * transaction sees every write; always pass `trx` down inside a transaction, or the query waits
 * for the pool forever.
 */
import fs from 'node:fs';
import path from 'node:path';
import knexFactory, { type Knex } from 'knex';

export type Db = Knex;

export function createDb(file: string): Db {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(file), { recursive: true });
  const db = knexFactory({
    client: 'better-sqlite3',
    connection: { filename: file },
    useNullAsDefault: true,
    // A failed query's message keeps its placeholders (?) instead of the bound values, so an
    // error log never carries a password hash, a token or a person's data.
    compileSqlOnError: false,
    pool: {
      min: 1,
      max: 1,
      afterCreate: (conn: { pragma: (s: string) => unknown }, done: (err: Error | null, c: unknown) => void) => {
        try {
          if (file !== ':memory:') conn.pragma('journal_mode = WAL');
          conn.pragma('busy_timeout = 5000');
          conn.pragma('foreign_keys = ON');
          done(null, conn);
        } catch (err) {
          done(err as Error, conn);
        }
      },
    },
  });
  nameStorageFailures(db);
  return db;
}

const STORAGE_CODE = /^SQLITE_(FULL|READONLY|IOERR|CANTOPEN)/;

/**
 * On SQLITE_FULL (and some I/O errors) SQLite rolls the whole transaction back by itself
 * (sqlite.org/lang_transaction.html, "Response To Errors Within A Transaction"); Knex then runs
 * its own ROLLBACK, which fails with "no transaction is active", and rejects with that error in
 * place of the real one. This gives the ROLLBACK's error the code and message of the failure that
 * caused it, so the answer can name the cause (app.ts, storageError).
 */
function nameStorageFailures(db: Knex): void {
  let last: (Error & { code?: string }) | null = null;
  db.on('query-error', (err: Error & { code?: string; cause?: unknown }, query: { sql?: string }) => {
    if (typeof err?.code === 'string' && STORAGE_CODE.test(err.code)) {
      last = err;
    } else if (last && /^ROLLBACK/i.test(query?.sql ?? '') && /no transaction is active/.test(err?.message ?? '')) {
      err.code = last.code;
      err.message = `${last.message} (SQLite rolled the transaction back)`;
      err.cause = last;
      last = null;
    }
  });
}

const migrationsDir = path.resolve(__dirname, '../../migrations');

/**
 * Migrations are TypeScript files in migrations/. Their names drop the extension so that a
 * database migrated from source also opens from compiled code.
 */
export const migrationSource: Knex.MigrationSource<string> = {
  async getMigrations() {
    return fs
      .readdirSync(migrationsDir)
      .filter((f) => /^\d+_.+\.(ts|js)$/.test(f) && !f.endsWith('.d.ts'))
      .map((f) => f.replace(/\.(ts|js)$/, ''))
      .sort();
  },
  getMigrationName(name) {
    return name;
  },
  async getMigration(name) {
    return require(path.join(migrationsDir, name)) as Knex.Migration;
  },
};

export async function migrate(db: Db): Promise<void> {
  await db.migrate.latest({ migrationSource });
}

/** Answers whether the database takes a query, for the health check. */
export async function databaseReachable(db: Db): Promise<boolean> {
  try {
    await db.raw('select 1');
    return true;
  } catch {
    return false;
  }
}
