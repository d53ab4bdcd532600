import type { Knex } from 'knex';

// A practice attempt walks a tree version in the wizard against its bench: the attempt keeps the
// version it walks (null for attempts started before, which report a finding by hand), and each
// answer of the walk is stored in order, with the bench event its reading or look was checked
// against (the server refuses a reading the bench never gave).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('practice_attempts', (t) => {
    t.uuid('tree_version_id').nullable().references('tree_versions.id').onDelete('SET NULL');
  });
  await knex.schema.createTable('practice_answers', (t) => {
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('attempt_id').notNullable().references('practice_attempts.id').onDelete('CASCADE');
    t.integer('seq').notNullable();
    t.uuid('client_id').notNullable();
    t.text('step_id').notNullable();
    /** The answer as the wizard reads it back (apiAnswerSchema), plus the bench event it was checked against. */
    t.jsonb('answer').notNullable();
    /** The bench event (bench_events.seq of the attempt's session) the reading or look came from; null when none was needed. */
    t.integer('bench_seq').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['attempt_id', 'seq']);
    t.unique(['attempt_id', 'client_id']);
    t.index(['company_id', 'attempt_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('practice_answers');
  await knex.schema.alterTable('practice_attempts', (t) => {
    t.dropColumn('tree_version_id');
  });
}
