import type { Knex } from 'knex';

/**
 * Upload storage that stays proportionate to the file: each row error is a
 * row of its own (paged, counted, never sent whole), the records as sent are
 * kept in compressed chunks so one page of the preview reads one or two
 * chunks rather than the whole file, and the normalised rows awaiting a
 * commit are one compressed blob, dropped when the upload is committed,
 * discarded or expires.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('upload_errors', (t) => {
    t.increments('id').primary();
    t.integer('upload_id').notNullable().references('id').inTable('uploads').onDelete('CASCADE');
    t.integer('row').notNullable();
    t.string('column', 255).notNullable();
    t.text('message').notNullable();
    t.index(['upload_id', 'row']);
  });
  await knex.schema.createTable('upload_row_chunks', (t) => {
    t.integer('upload_id').notNullable().references('id').inTable('uploads').onDelete('CASCADE');
    t.integer('chunk').notNullable();
    t.binary('records').notNullable();
    t.primary(['upload_id', 'chunk']);
  });
  await knex.schema.alterTable('uploads', (t) => {
    t.binary('preview_blob').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('uploads', (t) => {
    t.dropColumn('preview_blob');
  });
  await knex.schema.dropTable('upload_row_chunks');
  await knex.schema.dropTable('upload_errors');
}
