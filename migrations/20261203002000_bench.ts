import type { Knex } from 'knex';

// Bench sessions and what happened on them. A session is one simulated furnace (a unit profile, at
// most one injected fault, a seed for the meter noise) belonging to the user who started it. Its
// state is never stored: it is the replay of its events, in `seq` order, through lib/bench, so an
// event is written only with the next seq of its session (the primary key refuses a second one).
// A practice attempt scores from these events.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('bench_sessions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.jsonb('unit').notNullable();
    t.text('fault_id').nullable();
    t.integer('seed').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['company_id', 'user_id', 'created_at']);
  });

  await knex.schema.createTable('bench_events', (t) => {
    t.uuid('session_id').notNullable().references('bench_sessions.id').onDelete('CASCADE');
    t.integer('seq').notNullable();
    t.text('kind').notNullable();
    t.jsonb('payload').notNullable();
    t.jsonb('result').notNullable();
    /** The bench's simulated clock after the event, seconds since the session began. */
    t.double('sim_time').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.raw('clock_timestamp()'));
    t.primary(['session_id', 'seq']);
  });
  await knex.raw(`ALTER TABLE bench_events ADD CONSTRAINT bench_events_kind_check CHECK (kind IN ('action', 'measure', 'observe'))`);
  await knex.raw(`ALTER TABLE bench_events ADD CONSTRAINT bench_events_seq_check CHECK (seq >= 0)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('bench_events');
  await knex.schema.dropTable('bench_sessions');
}
