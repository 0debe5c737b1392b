import type { Knex } from 'knex';

/**
 * An account that must choose a new password before anything else, and why
 * (server/modules/users/users.service.ts): null when it need not; 'weak' when
 * the password it signed in with is one a new password may no longer be
 * (ASVS 2.1.7); 'initial' when a site admin typed it for the account (2.3.1).
 * Setting any new password clears it.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.string('must_change_password', 16).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('must_change_password');
  });
}
