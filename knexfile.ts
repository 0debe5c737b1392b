import { migrationSource } from './migrations';
import { resolveDatabaseUrl } from './server/db/knex';

/** For the knex CLI (`npx tsx node_modules/knex/bin/cli.js …`); the npm scripts use scripts/db.ts. */
const url = resolveDatabaseUrl();
export default url.startsWith('postgres')
  ? { client: 'pg', connection: url, migrations: { migrationSource } }
  : { client: 'better-sqlite3', connection: { filename: url.replace(/^file:/, '') }, useNullAsDefault: true, migrations: { migrationSource } };
