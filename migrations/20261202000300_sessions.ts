import type { Knex } from 'knex';

// One row per signed-in session, checked on every request. Ending a session is setting its
// revoked_at (sign-out ends one row, sign out everywhere and an admin's change end all of a user's),
// so a copied cookie stops working at once. users.session_version stays as a column but is no
// longer read: the rows are the one mechanism.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sessions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('revoked_at', { useTz: true }).nullable();
    t.text('user_agent').nullable();
    t.check('char_length(user_agent) <= 300', [], 'sessions_user_agent_length');
    t.index(['user_id']);
    // The clean-up on sign-in deletes by expiry.
    t.index(['expires_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sessions');
}
