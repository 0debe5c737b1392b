import type { Knex } from 'knex';

/** An upload's preview summary apart from its rows, so showing an upload never parses a 100 000-row preview. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('uploads', (t) => {
    t.text('summary_json').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('uploads', (t) => {
    t.dropColumn('summary_json');
  });
}
