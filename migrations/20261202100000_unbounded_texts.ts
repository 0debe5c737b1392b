import type { Knex } from 'knex';

/**
 * Two columns were declared shorter than what Starledger writes into them:
 * a derived value's label ("main sequence (V) or subgiant (IV), within 1σ
 * (0.12 dex) of the class boundary" runs past 32 characters) and an
 * upload's file name (as the browser sends it, which nothing bounds to
 * 255). SQLite keeps any length in a varchar whatever it was declared, so
 * there the columns stay as they are; PostgreSQL enforces the length and
 * refused such a commit, so there they become text.
 */
export async function up(knex: Knex): Promise<void> {
  if (knex.client.config.client !== 'pg') return;
  await knex.raw('ALTER TABLE derived_values ALTER COLUMN label TYPE text');
  await knex.raw('ALTER TABLE uploads ALTER COLUMN filename TYPE text');
}

export async function down(knex: Knex): Promise<void> {
  if (knex.client.config.client !== 'pg') return;
  await knex.raw('ALTER TABLE derived_values ALTER COLUMN label TYPE varchar(32)');
  await knex.raw('ALTER TABLE uploads ALTER COLUMN filename TYPE varchar(255)');
}
