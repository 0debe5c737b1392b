import type { Knex } from 'knex';

/**
 * The weekly summary's schedule per project (weekday 1 = Monday … 7 =
 * Sunday, local time "HH:MM" in the site's time zone) and each member's mail
 * preferences per project: the weekly summary (PIs receive it regardless)
 * and a note when a value they proposed is approved or rejected.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('projects', (t) => {
    t.boolean('summary_enabled').notNullable().defaultTo(true);
    t.integer('summary_weekday').notNullable().defaultTo(1);
    t.string('summary_time', 5).notNullable().defaultTo('08:00');
  });
  await knex.schema.createTable('mail_preferences', (t) => {
    t.integer('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.boolean('weekly_summary').notNullable().defaultTo(false);
    t.boolean('review_notice').notNullable().defaultTo(false);
    t.timestamp('updated_at', { useTz: true }).notNullable();
    t.primary(['user_id', 'project_id']);
    t.index(['project_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('mail_preferences');
  await knex.schema.alterTable('projects', (t) => {
    t.dropColumn('summary_time');
    t.dropColumn('summary_weekday');
    t.dropColumn('summary_enabled');
  });
}
