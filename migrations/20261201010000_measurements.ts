import type { Knex } from 'knex';

/** Personal API tokens, uploads with their raw bytes, measurements, spectra, derived values and remembered column mappings. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('api_tokens', (t) => {
    t.increments('id').primary();
    t.integer('user_id').notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.string('name', 80).notNullable();
    // SHA-256 of the token: tokens are 256 random bits, so a fast hash is enough.
    t.string('token_hash', 64).notNullable().unique();
    t.string('prefix', 16).notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.timestamp('last_used_at', { useTz: true }).nullable();
    t.timestamp('revoked_at', { useTz: true }).nullable();
    t.index(['user_id']);
  });

  await knex.schema.createTable('uploads', (t) => {
    t.increments('id').primary();
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.string('kind', 16).notNullable();
    t.string('filename', 255).notNullable();
    t.integer('size_bytes').notNullable();
    t.string('sha256', 64).notNullable();
    t.binary('content').notNullable();
    t.string('status', 16).notNullable();
    t.integer('row_count').notNullable().defaultTo(0);
    t.integer('error_count').notNullable().defaultTo(0);
    t.text('errors_json').notNullable().defaultTo('[]');
    t.text('mapping_json').notNullable().defaultTo('{}');
    // The validated rows, normalised to SI, kept from preview to commit.
    t.text('preview_json').nullable();
    t.integer('target_id').nullable().references('id').inTable('targets').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.timestamp('committed_at', { useTz: true }).nullable();
    t.index(['project_id', 'created_at']);
    t.index(['project_id', 'sha256']);
  });

  await knex.schema.createTable('measurements', (t) => {
    t.increments('id').primary();
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('target_id').notNullable().references('id').inTable('targets').onDelete('CASCADE');
    t.integer('upload_id').nullable().references('id').inTable('uploads').onDelete('SET NULL');
    t.integer('row_number').nullable();
    t.string('kind', 32).notNullable();
    t.double('value_si').notNullable();
    t.double('uncertainty_si').nullable();
    t.string('unit_si', 16).notNullable();
    t.double('value_as_sent').notNullable();
    t.double('uncertainty_as_sent').nullable();
    t.string('unit_as_sent', 16).nullable();
    t.string('band', 16).nullable();
    t.double('rest_wavelength_si').nullable();
    t.double('lande_g').nullable();
    t.timestamp('observed_at', { useTz: true }).nullable();
    t.string('instrument', 120).nullable();
    t.text('note').notNullable().defaultTo('');
    t.text('extra_json').notNullable().defaultTo('{}');
    t.integer('observer_user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.index(['target_id', 'kind']);
    t.index(['upload_id']);
  });

  await knex.schema.createTable('spectra', (t) => {
    t.increments('id').primary();
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('target_id').notNullable().references('id').inTable('targets').onDelete('CASCADE');
    t.integer('upload_id').nullable().references('id').inTable('uploads').onDelete('SET NULL');
    // [[wavelength m, flux W m⁻² m⁻¹], …]
    t.text('points_json').notNullable();
    t.text('fit_json').notNullable();
    t.timestamp('observed_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.index(['target_id']);
  });

  await knex.schema.createTable('derived_values', (t) => {
    t.increments('id').primary();
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    t.integer('target_id').notNullable().references('id').inTable('targets').onDelete('CASCADE');
    t.string('quantity', 48).notNullable();
    t.double('value').notNullable();
    t.double('uncertainty').notNullable();
    t.string('unit', 16).notNullable();
    t.string('label', 32).nullable();
    t.string('method', 64).notNullable();
    t.string('method_label', 200).notNullable();
    t.text('inputs_json').notNullable();
    t.text('constants_json').notNullable();
    t.text('warnings_json').notNullable();
    t.integer('revision').notNullable();
    t.string('status', 16).notNullable();
    t.integer('proposed_by_user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.integer('reviewer_user_id').nullable().references('id').inTable('users').onDelete('SET NULL');
    t.text('review_note').notNullable().defaultTo('');
    t.timestamp('reviewed_at', { useTz: true }).nullable();
    t.timestamp('created_at', { useTz: true }).notNullable();
    t.unique(['target_id', 'quantity', 'revision']);
    t.index(['project_id', 'status']);
  });

  await knex.schema.createTable('column_mappings', (t) => {
    t.integer('project_id').notNullable().references('id').inTable('projects').onDelete('CASCADE');
    // The normalised header row, so the next file of the same shape gets the same mapping.
    t.string('header_signature', 64).notNullable();
    t.text('mapping_json').notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable();
    t.primary(['project_id', 'header_signature']);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of ['column_mappings', 'derived_values', 'spectra', 'measurements', 'uploads', 'api_tokens']) {
    await knex.schema.dropTableIfExists(table);
  }
}
