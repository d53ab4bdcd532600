import type { Knex } from 'knex';

// One row per signed-in session, checked on every request: sign-out revokes its own row, so a
// copied cookie stops working at once. `user_version` is the user's session_version when the
// session began; bumping that (sign out everywhere, a role change, a deactivation) ends them all.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sessions', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.integer('user_version').notNullable();
    t.text('user_agent').nullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('expires_at', { useTz: true }).notNullable();
    t.timestamp('revoked_at', { useTz: true }).nullable();
    t.index(['user_id']);
    t.index(['expires_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sessions');
}
