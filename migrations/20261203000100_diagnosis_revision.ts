import type { Knex } from 'knex';

// A diagnosis's revision: raised by every change of its state (an answer saved, an answer undone, the
// state first stored). A save reads the diagnosis without a lock, runs the machine, and writes in one
// statement that holds only if the diagnosis is still at the revision it read (db/diagnoses.ts
// `commitSave`): two saves at once, or a save beside an undo, cannot both land.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('diagnoses', (t) => {
    t.integer('revision').notNullable().defaultTo(0);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('diagnoses', (t) => {
    t.dropColumn('revision');
  });
}
