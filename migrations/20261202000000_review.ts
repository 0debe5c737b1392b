import type { Knex } from 'knex';

/**
 * The review loop: a version on every derived value (optimistic locking for
 * approve and reject), the quantities each revision was computed from, the
 * target's assumed luminosity class, the project's R_V, and the target each
 * trail entry concerns (the trail is filtered by target).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('derived_values', (t) => {
    t.integer('version').notNullable().defaultTo(1);
    t.text('depends_on_json').notNullable().defaultTo('[]');
    t.index(['target_id', 'quantity']);
  });
  await knex.schema.alterTable('targets', (t) => {
    t.string('assumed_class', 24).notNullable().defaultTo('main_sequence');
  });
  await knex.schema.alterTable('projects', (t) => {
    t.double('r_v').notNullable().defaultTo(3.1);
  });
  await knex.schema.alterTable('trail_events', (t) => {
    // No foreign key: a deleted target keeps its history.
    t.integer('target_id').nullable();
    t.index(['project_id', 'target_id']);
    t.index(['project_id', 'action']);
    t.index(['project_id', 'actor_user_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('trail_events', (t) => {
    t.dropIndex(['project_id', 'target_id']);
    t.dropIndex(['project_id', 'action']);
    t.dropIndex(['project_id', 'actor_user_id']);
    t.dropColumn('target_id');
  });
  await knex.schema.alterTable('projects', (t) => {
    t.dropColumn('r_v');
  });
  await knex.schema.alterTable('targets', (t) => {
    t.dropColumn('assumed_class');
  });
  await knex.schema.alterTable('derived_values', (t) => {
    t.dropIndex(['target_id', 'quantity']);
    t.dropColumn('depends_on_json');
    t.dropColumn('version');
  });
}
