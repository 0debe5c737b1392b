import type { Knex } from 'knex';

/**
 * A second factor at sign-in (server/modules/second-factor): each account's
 * time-based one-time password secret, encrypted with a key kept apart from
 * the database (SECOND_FACTOR_KEY; server/config.ts), the one being enrolled
 * until a code confirms it, when it was turned on, and the time step of the
 * last code taken (a code is taken once: ASVS 2.8.4). Recovery codes are kept
 * as keyed hashes only, each used at most once.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.text('totp_secret').nullable();
    t.text('totp_pending_secret').nullable();
    t.timestamp('totp_enabled_at', { useTz: true }).nullable();
    t.bigInteger('totp_last_step').nullable();
  });
  await knex.schema.createTable('recovery_codes', (t) => {
    t.increments('id').primary();
    t.integer('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE').index();
    t.string('code_hash', 64).notNullable().unique();
    t.timestamp('used_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('recovery_codes');
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('totp_last_step');
    t.dropColumn('totp_enabled_at');
    t.dropColumn('totp_pending_secret');
    t.dropColumn('totp_secret');
  });
}
