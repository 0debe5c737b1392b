import type { Knex } from 'knex';

/**
 * The asymmetric 68 % interval of a derived value (its Monte Carlo draws'
 * 15.87th and 84.13th percentiles, SI), stored where the engine gives one:
 * where the two arms differ, the sheet and the queue print +a/−b instead of ±σ.
 * Null where the interval is symmetric.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('derived_values', (t) => {
    t.double('interval_low').nullable();
    t.double('interval_high').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('derived_values', (t) => {
    t.dropColumn('interval_low');
    t.dropColumn('interval_high');
  });
}
