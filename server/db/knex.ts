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
  return knexFactory({
    client: 'better-sqlite3',
    connection: { filename: file },
    useNullAsDefault: true,
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
