import type { Knex } from 'knex';

/**
 * Each recovery code gets its own random 32-bit salt, hashed with it (ASVS
 * 4.0.3 2.6.2: a lookup secret of under 112 bits of entropy is salted with a
 * unique random 32-bit salt and hashed). A code from before has none and is
 * checked as it was made.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('recovery_codes', (t) => {
    t.string('salt', 16).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('recovery_codes', (t) => {
    t.dropColumn('salt');
  });
}
