import type { Knex } from 'knex';

// Where a diagnosis stands, kept on its row so that a save checks the current step and moves on
// without replaying the whole path: the machine's state id (a tree step or an inserted
// procedure), the energy state, and the last answer's sequence number. A row without a state (made
// before this column, or by a seed) gets it from a replay the first time it is read.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('diagnoses', (t) => {
    t.text('current_state').nullable();
    t.text('energy').nullable();
    t.integer('last_seq').notNullable().defaultTo(0);
  });
  await knex.raw(`UPDATE diagnoses d SET last_seq = coalesce((SELECT max(seq) FROM answers a WHERE a.diagnosis_id = d.id), 0)`);
  await knex.raw(
    `ALTER TABLE diagnoses ADD CONSTRAINT diagnoses_energy_check CHECK (energy IS NULL OR energy IN ('energized', 'locked-out'))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE diagnoses DROP CONSTRAINT IF EXISTS diagnoses_energy_check');
  await knex.schema.alterTable('diagnoses', (t) => {
    t.dropColumn('current_state');
    t.dropColumn('energy');
    t.dropColumn('last_seq');
  });
}
