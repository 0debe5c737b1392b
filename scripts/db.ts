import { createDb, migrateLatest, resolveDatabaseUrl } from '../server/db/knex';
import { seedDemoIfEmpty } from '../server/db/demo';
import { backupDatabase, DatabaseInUseError, defaultBackupPath, restoreDatabase } from '../server/db/backup';

/**
 * `npm run db:migrate | db:rollback | db:seed` on DATABASE_URL (default data/starledger.sqlite);
 * `npm run db:backup [-- --to FILE]` and `npm run db:restore -- FILE [--force]` for the SQLite file.
 */
const [command, ...args] = process.argv.slice(2);

function sqliteFile(): string {
  const url = resolveDatabaseUrl();
  if (/^postgres(ql)?:\/\//.test(url)) {
    console.error('db:backup and db:restore are for the SQLite file; back up PostgreSQL with pg_dump.');
    process.exit(2);
  }
  return url.replace(/^file:/, '');
}

if (command === 'backup') {
  const file = sqliteFile();
  const to = args.includes('--to') ? args[args.indexOf('--to') + 1] : defaultBackupPath(file, new Date());
  const started = performance.now();
  const { pages, bytes } = await backupDatabase(file, to);
  console.log(`Backed up ${file} to ${to}: ${pages} pages, ${(bytes / 1e6).toFixed(1)} MB, integrity ok, in ${((performance.now() - started) / 1000).toFixed(1)} s.`);
  process.exit(0);
}
if (command === 'restore') {
  const file = sqliteFile();
  const from = args.find((a) => !a.startsWith('--'));
  if (!from) {
    console.error('Usage: npm run db:restore -- BACKUP_FILE [--force]');
    process.exit(2);
  }
  try {
    const { pages } = await restoreDatabase(from, file, { force: args.includes('--force') });
    console.log(`Restored ${file} from ${from} (${pages} pages). Start the server (or restart it, if it was running).`);
    process.exit(0);
  } catch (err) {
    if (!(err instanceof DatabaseInUseError)) throw err;
    console.error(err.message);
    process.exit(3);
  }
}

const db = createDb();
try {
  if (command === 'migrate') {
    await migrateLatest(db);
    console.log('Migrated to the latest schema.');
  } else if (command === 'rollback') {
    const [batch, names] = await db.migrate.rollback();
    console.log(`Rolled back batch ${batch}: ${names.join(', ') || 'nothing to roll back'}.`);
  } else if (command === 'seed') {
    await migrateLatest(db);
    if (!(await seedDemoIfEmpty(db))) console.log('The database already has accounts; the demo is seeded only into an empty database.');
    else console.log('Seeded the demo scenario.');
  } else {
    console.error('Usage: tsx scripts/db.ts migrate|rollback|seed|backup [--to FILE]|restore FILE [--force]');
    process.exitCode = 2;
  }
} finally {
  await db.destroy();
}
