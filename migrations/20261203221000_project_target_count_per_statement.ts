import type { Knex } from 'knex';

/**
 * On PostgreSQL the projects' target counts are kept per statement rather
 * than per row: a row trigger updated the project's row once for every
 * target an upload created, and 10 000 updates of one row in one
 * transaction each walk the row's growing chain of versions, so inserting
 * an upload's 10 000 new targets took about 15 s. A statement trigger reads
 * the inserted or deleted rows as a transition table and updates each
 * project once. A target moved to another project (rare, one at a time)
 * keeps its row trigger. SQLite's row triggers run in the process and stay.
 */
export async function up(knex: Knex): Promise<void> {
  if (knex.client.config.client !== 'pg') return;
  await knex.raw('DROP TRIGGER IF EXISTS targets_count_insert_delete ON targets');
  await knex.raw(`
    CREATE OR REPLACE FUNCTION targets_count_statement() RETURNS trigger AS $$
    BEGIN
      IF TG_OP = 'INSERT' THEN
        UPDATE projects p SET target_count = p.target_count + c.n
          FROM (SELECT project_id, count(*) AS n FROM changed_targets GROUP BY project_id) c WHERE p.id = c.project_id;
      ELSE
        UPDATE projects p SET target_count = p.target_count - c.n
          FROM (SELECT project_id, count(*) AS n FROM changed_targets GROUP BY project_id) c WHERE p.id = c.project_id;
      END IF;
      RETURN NULL;
    END;
    $$ LANGUAGE plpgsql`);
  await knex.raw('CREATE TRIGGER targets_count_insert AFTER INSERT ON targets REFERENCING NEW TABLE AS changed_targets FOR EACH STATEMENT EXECUTE FUNCTION targets_count_statement()');
  await knex.raw('CREATE TRIGGER targets_count_delete AFTER DELETE ON targets REFERENCING OLD TABLE AS changed_targets FOR EACH STATEMENT EXECUTE FUNCTION targets_count_statement()');
}

export async function down(knex: Knex): Promise<void> {
  if (knex.client.config.client !== 'pg') return;
  await knex.raw('DROP TRIGGER IF EXISTS targets_count_insert ON targets');
  await knex.raw('DROP TRIGGER IF EXISTS targets_count_delete ON targets');
  await knex.raw('DROP FUNCTION IF EXISTS targets_count_statement()');
  await knex.raw('CREATE TRIGGER targets_count_insert_delete AFTER INSERT OR DELETE ON targets FOR EACH ROW EXECUTE FUNCTION targets_keep_count()');
}
