import type { Knex } from 'knex';

/**
 * Failed sign-ins counted per account (the e-mail as typed, whether or not
 * an account has it) and per client address, in the database so that every
 * app process on it sees the same counts. See server/modules/auth/login-throttle.ts.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('login_throttle', (t) => {
    /** `account:<e-mail>` or `address:<ip>`. */
    t.string('key', 400).primary();
    t.integer('failures').notNullable();
    t.timestamp('last_failure_at', { useTz: true }).notNullable();
    t.timestamp('blocked_until', { useTz: true }).nullable();
    t.index(['last_failure_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('login_throttle');
}
