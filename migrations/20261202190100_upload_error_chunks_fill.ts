import { gunzipSync, gzipSync } from 'node:zlib';
import type { Knex } from 'knex';

/**
 * Moves the errors of uploads previewed before the previous migration from
 * upload_errors into compressed chunks, upload by upload, and empties
 * upload_errors (the next migration drops it). The chunking is written out
 * here rather than imported, as a migration never changes with the code:
 * 500 lines a chunk counted from row 2, chunk −1 below it, errors in file
 * order, each chunk gzipped JSON of { row, column, message }.
 */
const CHUNK_ROWS = 500;
const chunkOf = (row: number) => (row < 2 ? -1 : Math.floor((row - 2) / CHUNK_ROWS));

interface ErrorRow {
  row: number;
  column: string;
  message: string;
}

export async function up(knex: Knex): Promise<void> {
  const uploads: { upload_id: number }[] = await knex('upload_errors').distinct('upload_id').orderBy('upload_id');
  for (const { upload_id } of uploads) {
    const errors: ErrorRow[] = await knex('upload_errors').where({ upload_id }).orderBy([{ column: 'row' }, { column: 'id' }]).select('row', 'column', 'message');
    const byChunk = new Map<number, ErrorRow[]>();
    for (const e of errors) {
      const list = byChunk.get(chunkOf(e.row));
      if (list) list.push(e);
      else byChunk.set(chunkOf(e.row), [e]);
    }
    for (const [chunk, list] of byChunk) {
      await knex('upload_error_chunks').insert({
        upload_id,
        chunk,
        error_count: list.length,
        row_count: new Set(list.map((e) => e.row)).size,
        errors: gzipSync(JSON.stringify(list)),
      });
    }
    await knex('upload_errors').where({ upload_id }).delete();
  }
}

/** Puts the chunks' errors back as rows (the previous migration's down then drops the chunks). */
export async function down(knex: Knex): Promise<void> {
  const chunks: { upload_id: number; errors: Buffer }[] = await knex('upload_error_chunks').orderBy([{ column: 'upload_id' }, { column: 'chunk' }]).select('upload_id', 'errors');
  for (const c of chunks) {
    const list = JSON.parse(gunzipSync(c.errors).toString('utf8')) as ErrorRow[];
    for (const e of list) await knex('upload_errors').insert({ upload_id: c.upload_id, row: e.row, column: e.column, message: e.message });
  }
}
