import type { Knex } from 'knex';

// Practice scenarios (a trainer's bench fault, or a set to draw one from, on a unit profile), their
// assignments to apprentices, and the attempts: one bench session each, the finding the apprentice
// reached and the score the server worked out from the session's events. The fault an attempt runs
// is drawn when it starts and kept on the attempt, so a scenario with a set still scores the fault
// that was really injected.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('practice_scenarios', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('trainer_id').nullable().references('users.id').onDelete('SET NULL');
    t.text('title').notNullable();
    t.specificType('fault_ids', 'text[]').notNullable();
    t.jsonb('unit').notNullable();
    t.text('notes').notNullable().defaultTo('');
    t.date('due_on').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['company_id', 'created_at']);
  });
  await knex.raw(`ALTER TABLE practice_scenarios ADD CONSTRAINT practice_scenarios_faults_check CHECK (cardinality(fault_ids) >= 1)`);

  await knex.schema.createTable('practice_assignments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('scenario_id').notNullable().references('practice_scenarios.id').onDelete('CASCADE');
    t.uuid('apprentice_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('assigned_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('assigned_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['scenario_id', 'apprentice_id']);
    t.index(['company_id', 'apprentice_id']);
  });

  await knex.schema.createTable('practice_attempts', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('assignment_id').notNullable().references('practice_assignments.id').onDelete('CASCADE');
    t.uuid('scenario_id').notNullable().references('practice_scenarios.id').onDelete('CASCADE');
    t.uuid('apprentice_id').notNullable().references('users.id').onDelete('CASCADE');
    // The bench session the attempt runs on (bench_sessions.id; the foreign key is added once that table exists).
    t.uuid('bench_session_id').notNullable().unique();
    t.text('fault_id').notNullable();
    t.text('finding_step_id').nullable();
    t.jsonb('score').nullable();
    t.timestamp('started_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('finished_at', { useTz: true }).nullable();
    t.index(['company_id', 'scenario_id']);
    t.index(['company_id', 'apprentice_id', 'started_at']);
  });
  await knex.raw(
    `ALTER TABLE practice_attempts ADD CONSTRAINT practice_attempts_finished_check CHECK ((finished_at IS NULL) = (score IS NULL) AND (finished_at IS NULL) = (finding_step_id IS NULL))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('practice_attempts');
  await knex.schema.dropTable('practice_assignments');
  await knex.schema.dropTable('practice_scenarios');
}
