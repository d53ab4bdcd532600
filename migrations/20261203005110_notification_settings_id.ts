import type { Knex } from 'knex';

// An id on every notification setting, as every other table has: the tests that compare whole
// tables before and after a refused request order rows by it.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('notification_settings', (t) => {
    t.uuid('id').notNullable().unique().defaultTo(knex.raw('gen_random_uuid()'));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('notification_settings', (t) => {
    t.dropColumn('id');
  });
}
