import type { Knex } from 'knex';

/** upload_errors, emptied into upload_error_chunks by the previous migration. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.dropTable('upload_errors');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.createTable('upload_errors', (t) => {
    t.increments('id').primary();
    t.integer('upload_id').notNullable().references('id').inTable('uploads').onDelete('CASCADE');
    t.integer('row').notNullable();
    t.string('column', 255).notNullable();
    t.text('message').notNullable();
    t.index(['upload_id', 'row']);
  });
}
