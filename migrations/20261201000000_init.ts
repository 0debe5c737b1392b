import type { Knex } from 'knex';

/** Accounts, projects and their members, targets, the review trail and sessions. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary();
    t.string('email', 254).notNullable().unique();
    t.string('name', 120).notNullable();
    t.string('password_hash', 255).notNullable();
    t.boolean('is_site_admin').notNullable().defaultTo(false);
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable();
  });

  await knex.schema.createTable('projects', (t) => {
    t.increments('id').primary();
    t.string('code', 16).notNullable().unique();
    t.string('name', 120).notNullable();
    t.text('description').notNullable().defaultTo('');
    t.string('site_name', 120).notNullable();
    t.double('site_latitude_deg').notNullable();
    t.double('site_longitude_deg').notNullable();
    t.double('site_elevation_m').notNullable();
    t.string('site_time_zone', 64).notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable();
  });

  await knex.schema.createTable('project_members', (t) => {
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.string('role', 16).notNullable();
    t.timestamp('added_at', { useTz: true }).notNullable();
    t.primary(['project_id', 'user_id']);
    t.index(['user_id']);
  });

  await knex.schema.createTable('targets', (t) => {
    t.increments('id').primary();
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.string('designation', 64).notNullable();
    // Designations match case- and space-insensitively; the key enforces it.
    t.string('designation_key', 64).notNullable();
    t.double('ra_deg').notNullable();
    t.double('dec_deg').notNullable();
    t.text('notes').notNullable().defaultTo('');
    t.text('tags').notNullable().defaultTo('[]');
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable();
    t.unique(['project_id', 'designation_key']);
  });

  // Append-only: rows are inserted, never updated or deleted (the project's
  // cascade aside, which removes the whole project).
  await knex.schema.createTable('trail_events', (t) => {
    t.increments('id').primary();
    t.integer('project_id').nullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('actor_user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('action', 64).notNullable();
    t.string('entity_type', 32).notNullable();
    t.integer('entity_id').nullable();
    t.text('before_json').nullable();
    t.text('after_json').nullable();
    t.text('note').notNullable().defaultTo('');
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.index(['project_id', 'created_at']);
  });

  // The table connect-session-knex would create, declared here so the schema
  // has one owner.
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid', 255).primary();
    t.json('sess').notNullable();
    t.timestamp('expired', { useTz: true }).notNullable().index();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('sessions');
  await knex.schema.dropTableIfExists('trail_events');
  await knex.schema.dropTableIfExists('targets');
  await knex.schema.dropTableIfExists('project_members');
  await knex.schema.dropTableIfExists('projects');
  await knex.schema.dropTableIfExists('users');
}
