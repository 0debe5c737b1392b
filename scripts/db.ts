import { createDb, migrateLatest } from '../server/db/knex';
import { seedDemoIfEmpty } from '../server/db/demo';

/** `npm run db:migrate | db:rollback | db:seed` on DATABASE_URL (default data/starledger.sqlite). */
const command = process.argv[2];
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
    console.error('Usage: tsx scripts/db.ts migrate|rollback|seed');
    process.exitCode = 2;
  }
} finally {
  await db.destroy();
}
