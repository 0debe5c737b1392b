import type { Knex } from 'knex';

/**
 * What a person's list of their sessions shows (server/modules/auth/sessions.repository.ts):
 * whose session it is, when it began (the absolute limit counts from then), when it was
 * last used (the idle limit counts from then), and the browser and address it began from.
 * A session row from before has none of them and is ended at its next request.
 *
 * API tokens get an expiry, chosen when one is made; the next migration gives the
 * tokens that exist one.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('sessions', (t) => {
    t.integer('user_id').nullable().index();
    t.timestamp('signed_in_at', { useTz: true }).nullable();
    t.timestamp('last_seen_at', { useTz: true }).nullable();
    t.text('user_agent').nullable();
    t.string('address', 64).nullable();
  });
  await knex.schema.alterTable('api_tokens', (t) => {
    t.timestamp('expires_at', { useTz: true }).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('api_tokens', (t) => {
    t.dropColumn('expires_at');
  });
  await knex.schema.alterTable('sessions', (t) => {
    t.dropIndex(['user_id']);
    t.dropColumn('user_id');
    t.dropColumn('signed_in_at');
    t.dropColumn('last_seen_at');
    t.dropColumn('user_agent');
    t.dropColumn('address');
  });
}
