import { oneProcessAtATime, type Db } from './knex';
import { seed as seedScenario } from '../../seeds/01-demo-scenario';
import { seed as seedSeason } from '../../seeds/02-demo-season';
import { seed as seedReview } from '../../seeds/03-demo-review';

/**
 * Seeds the demo scenario only into a database with no accounts, so a real
 * installation is never touched. Looking and seeding hold the start-up lock,
 * so of several processes starting at once on one empty database exactly
 * one seeds and the others find its accounts.
 */
export async function seedDemoIfEmpty(db: Db): Promise<boolean> {
  return oneProcessAtATime(db, async () => {
    const row = await db('users').count<{ n: number | string }>('* as n').first();
    if (Number(row?.n ?? 0) > 0) return false;
    await seedScenario(db);
    await seedSeason(db);
    await seedReview(db);
    return true;
  });
}
