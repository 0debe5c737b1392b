import type { Knex } from 'knex';

/**
 * Invitations to a project by e-mail, and requests to reset a password.
 * Both are reached through a link carrying a random token; only its SHA-256
 * is stored, so a copy of the database opens no account. Each is single-use
 * (`accepted_at` / `used_at`) and expires.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('invitations', (t) => {
    t.increments('id').primary();
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.string('email', 254).notNullable();
    t.string('role', 16).notNullable();
    t.string('token_hash', 64).notNullable().unique();
    t.integer('invited_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('accepted_at', { useTz: true }).nullable();
    t.integer('accepted_by').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.timestamp('revoked_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.index(['project_id', 'email']);
  });
  await knex.schema.createTable('password_resets', (t) => {
    t.increments('id').primary();
    t.integer('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.string('token_hash', 64).notNullable().unique();
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('used_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.index(['user_id', 'created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('password_resets');
  await knex.schema.dropTableIfExists('invitations');
}
