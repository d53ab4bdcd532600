import type { Knex } from 'knex';

// An attempt runs on one bench session: once the bench's tables exist, the attempt's session id is
// a foreign key to them (deleting a session deletes the attempt scored from it).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('practice_attempts', (t) => {
    t.foreign('bench_session_id').references('bench_sessions.id').onDelete('CASCADE');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('practice_attempts', (t) => {
    t.dropForeign(['bench_session_id']);
  });
}
