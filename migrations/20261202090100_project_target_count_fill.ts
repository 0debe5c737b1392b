import type { Knex } from 'knex';

/** Counts the targets each project already has, for the column the previous migration added (its triggers count from then on). */
export async function up(knex: Knex): Promise<void> {
  await knex.raw('UPDATE projects SET target_count = (SELECT count(*) FROM targets WHERE targets.project_id = projects.id)');
}

export async function down(): Promise<void> {
  // The column goes with the previous migration's down.
}
