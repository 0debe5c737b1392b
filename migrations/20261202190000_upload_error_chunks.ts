import type { Knex } from 'knex';

/**
 * Row errors kept in compressed chunks, like the records as sent
 * (upload_row_chunks): one row per 500 lines of the file that have errors,
 * holding their errors gzipped with how many there are and on how many
 * rows. A file whose every line was wrong kept each error as a table row of
 * its own with its index, about seven times the file (a 4.5 MB file with
 * four errors a line stored 32 MB of errors); its messages repeat, and
 * compressed they take a fraction of the file. A page of errors or of the
 * preview reads the one or two chunks it spans. Chunk −1 holds the errors
 * of the header and of the file as a whole (rows below 2).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('upload_error_chunks', (t) => {
    t.integer('upload_id').notNullable().references('id').inTable('uploads').onDelete('CASCADE');
    t.integer('chunk').notNullable();
    t.integer('error_count').notNullable();
    t.integer('row_count').notNullable();
    t.binary('errors').notNullable();
    t.primary(['upload_id', 'chunk']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('upload_error_chunks');
}
