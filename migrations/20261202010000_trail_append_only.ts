import type { Knex } from 'knex';

/**
 * The review trail is append-only in the database itself, not only by the
 * application's habit: an UPDATE or DELETE on trail_events is refused by a
 * trigger on SQLite and on PostgreSQL alike.
 */
export async function up(knex: Knex): Promise<void> {
  if (knex.client.config.client === 'pg') {
    await knex.raw(`
      CREATE OR REPLACE FUNCTION trail_events_refuse_change() RETURNS trigger AS $$
      BEGIN
        RAISE EXCEPTION 'trail_events is append-only';
      END;
      $$ LANGUAGE plpgsql`);
    await knex.raw('CREATE TRIGGER trail_events_no_update BEFORE UPDATE ON trail_events FOR EACH ROW EXECUTE FUNCTION trail_events_refuse_change()');
    await knex.raw('CREATE TRIGGER trail_events_no_delete BEFORE DELETE ON trail_events FOR EACH ROW EXECUTE FUNCTION trail_events_refuse_change()');
    return;
  }
  await knex.raw(`CREATE TRIGGER trail_events_no_update BEFORE UPDATE ON trail_events
    BEGIN SELECT RAISE(ABORT, 'trail_events is append-only'); END`);
  await knex.raw(`CREATE TRIGGER trail_events_no_delete BEFORE DELETE ON trail_events
    BEGIN SELECT RAISE(ABORT, 'trail_events is append-only'); END`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS trail_events_no_update' + (knex.client.config.client === 'pg' ? ' ON trail_events' : ''));
  await knex.raw('DROP TRIGGER IF EXISTS trail_events_no_delete' + (knex.client.config.client === 'pg' ? ' ON trail_events' : ''));
  if (knex.client.config.client === 'pg') await knex.raw('DROP FUNCTION IF EXISTS trail_events_refuse_change()');
}
