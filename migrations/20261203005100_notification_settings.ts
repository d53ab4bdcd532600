import type { Knex } from 'knex';

// Which e-mail notifications each user has turned off. No row means on: a new kind of
// notification reaches everyone until they say otherwise.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('notification_settings', (t) => {
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.boolean('enabled').notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['user_id', 'kind']);
  });
  await knex.raw(
    `ALTER TABLE notification_settings ADD CONSTRAINT notification_settings_kind_check CHECK (kind IN ('sign-off', 'escalation', 'tree-review', 'scenario'))`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('notification_settings');
}
