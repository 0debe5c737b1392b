import type { Knex } from 'knex';

/**
 * Each project's number of targets, kept by triggers on targets so that
 * every way a target comes or goes (by hand, by an upload, by a project's
 * cascade) counts. The target list gives its total on every page; counting
 * the project for each page cost 10 ms at 100 000 targets, the largest part
 * of the page. The existing rows are counted by the next migration.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('projects', (t) => {
    t.integer('target_count').notNullable().defaultTo(0);
  });
  if (knex.client.config.client === 'pg') {
    await knex.raw(`
      CREATE OR REPLACE FUNCTION targets_keep_count() RETURNS trigger AS $$
      BEGIN
        IF TG_OP IN ('DELETE', 'UPDATE') THEN
          UPDATE projects SET target_count = target_count - 1 WHERE id = OLD.project_id;
        END IF;
        IF TG_OP IN ('INSERT', 'UPDATE') THEN
          UPDATE projects SET target_count = target_count + 1 WHERE id = NEW.project_id;
        END IF;
        RETURN NULL;
      END;
      $$ LANGUAGE plpgsql`);
    await knex.raw('CREATE TRIGGER targets_count_insert_delete AFTER INSERT OR DELETE ON targets FOR EACH ROW EXECUTE FUNCTION targets_keep_count()');
    await knex.raw(
      'CREATE TRIGGER targets_count_move AFTER UPDATE OF project_id ON targets FOR EACH ROW WHEN (NEW.project_id IS DISTINCT FROM OLD.project_id) EXECUTE FUNCTION targets_keep_count()',
    );
    return;
  }
  await knex.raw(`CREATE TRIGGER targets_count_insert AFTER INSERT ON targets
    BEGIN UPDATE projects SET target_count = target_count + 1 WHERE id = NEW.project_id; END`);
  await knex.raw(`CREATE TRIGGER targets_count_delete AFTER DELETE ON targets
    BEGIN UPDATE projects SET target_count = target_count - 1 WHERE id = OLD.project_id; END`);
  await knex.raw(`CREATE TRIGGER targets_count_move AFTER UPDATE OF project_id ON targets WHEN NEW.project_id <> OLD.project_id
    BEGIN
      UPDATE projects SET target_count = target_count - 1 WHERE id = OLD.project_id;
      UPDATE projects SET target_count = target_count + 1 WHERE id = NEW.project_id;
    END`);
}

export async function down(knex: Knex): Promise<void> {
  const pg = knex.client.config.client === 'pg';
  for (const name of pg ? ['targets_count_insert_delete', 'targets_count_move'] : ['targets_count_insert', 'targets_count_delete', 'targets_count_move']) {
    await knex.raw(`DROP TRIGGER IF EXISTS ${name}${pg ? ' ON targets' : ''}`);
  }
  if (pg) await knex.raw('DROP FUNCTION IF EXISTS targets_keep_count()');
  await knex.schema.alterTable('projects', (t) => {
    t.dropColumn('target_count');
  });
}
