// Knex CLI configuration (npm run migrate). The server migrates by itself at start.
import { loadConfig } from './server/config';
import { migrationSource } from './server/db/knex';

const config = loadConfig();

export default {
  client: 'better-sqlite3',
  connection: { filename: config.databaseFile },
  useNullAsDefault: true,
  migrations: { migrationSource },
};
