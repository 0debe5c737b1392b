import type { Knex } from 'knex';

/**
 * Outgoing mail: every message is written here in the same transaction as
 * the action that caused it, and a worker delivers it. The idempotency key
 * (per purpose: project + ISO week, invitation id, reset request id, …)
 * makes a second enqueue a no-op; `claimed_by`/`claimed_at` let one of
 * several server processes on one database take a message before sending.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('mail_outbox', (t) => {
    t.increments('id').primary();
    t.string('purpose', 32).notNullable();
    t.string('idempotency_key', 200).notNullable().unique();
    t.string('to', 254).notNullable();
    t.string('subject', 300).notNullable();
    t.text('html').notNullable();
    t.text('text').notNullable();
    t.string('status', 16).notNullable().defaultTo('queued');
    t.integer('attempts').notNullable().defaultTo(0);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable();
    t.text('last_error').nullable();
    t.string('claimed_by', 100).nullable();
    t.timestamp('claimed_at', { useTz: true }).nullable();
    t.timestamp('sent_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.index(['status', 'next_attempt_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('mail_outbox');
}
