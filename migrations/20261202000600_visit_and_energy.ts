import type { Knex } from 'knex';

// The whole visit and two energy sources (revision 2 of the built-in tree):
// - diagnoses keep the gas state beside the electric one (`energy` stays "energized"/"locked-out"
//   for electricity), may end "verified" (the repair checked) or "escalated" with a note;
// - answers say when a reading was over the meter's range ("OL", no value) and when the
//   diagnosis answered a unit-record branch by itself;
// - units say how they vent (`draft`), so the tree can branch on it;
// - a tree version says which built-in revision it is a copy of, if any.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('diagnoses', (t) => {
    t.text('gas').notNullable().defaultTo('on');
    t.text('escalation_note').nullable();
    t.uuid('escalated_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('escalated_at', { useTz: true }).nullable();
  });
  await knex.raw(`ALTER TABLE diagnoses ADD CONSTRAINT diagnoses_gas_check CHECK (gas IN ('on', 'off'))`);
  await knex.raw('ALTER TABLE diagnoses DROP CONSTRAINT diagnoses_status_check');
  await knex.raw(
    `ALTER TABLE diagnoses ADD CONSTRAINT diagnoses_status_check CHECK (status IN ('in_progress', 'found', 'verified', 'escalated'))`,
  );
  await knex.raw(
    `ALTER TABLE diagnoses ADD CONSTRAINT diagnoses_escalation_check CHECK (status <> 'escalated' OR escalation_note IS NOT NULL)`,
  );

  await knex.schema.alterTable('answers', (t) => {
    t.boolean('over_range').notNullable().defaultTo(false);
    t.boolean('auto').notNullable().defaultTo(false);
  });
  await knex.raw(`ALTER TABLE answers ADD CONSTRAINT answers_over_range_check CHECK (NOT over_range OR value IS NULL)`);

  await knex.schema.alterTable('units', (t) => {
    t.text('draft').notNullable().defaultTo('induced');
  });
  await knex.raw(`ALTER TABLE units ADD CONSTRAINT units_draft_check CHECK (draft IN ('induced', 'natural'))`);

  await knex.schema.alterTable('tree_versions', (t) => {
    t.integer('builtin_revision').nullable();
  });
  // Every version seeded before this migration was revision 1 of the built-in tree, unless edited;
  // the upgrade on start (lib/trees/builtin.ts) compares the graphs before it trusts this.
  await knex.raw(`UPDATE tree_versions v SET builtin_revision = 1 FROM fault_trees t
    WHERE t.id = v.tree_id AND t.slug = 'no-heat-dsi' AND v.author_id IS NULL`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('tree_versions', (t) => t.dropColumn('builtin_revision'));
  await knex.raw('ALTER TABLE units DROP CONSTRAINT IF EXISTS units_draft_check');
  await knex.schema.alterTable('units', (t) => t.dropColumn('draft'));
  await knex.raw('ALTER TABLE answers DROP CONSTRAINT IF EXISTS answers_over_range_check');
  await knex.schema.alterTable('answers', (t) => {
    t.dropColumn('over_range');
    t.dropColumn('auto');
  });
  await knex.raw('ALTER TABLE diagnoses DROP CONSTRAINT IF EXISTS diagnoses_escalation_check');
  await knex.raw('ALTER TABLE diagnoses DROP CONSTRAINT diagnoses_status_check');
  await knex.raw(`UPDATE diagnoses SET status = 'found' WHERE status = 'verified'`);
  await knex.raw(`ALTER TABLE diagnoses ADD CONSTRAINT diagnoses_status_check CHECK (status IN ('in_progress', 'found', 'escalated'))`);
  await knex.raw('ALTER TABLE diagnoses DROP CONSTRAINT IF EXISTS diagnoses_gas_check');
  await knex.schema.alterTable('diagnoses', (t) => {
    t.dropColumn('gas');
    t.dropColumn('escalation_note');
    t.dropColumn('escalated_by');
    t.dropColumn('escalated_at');
  });
}
