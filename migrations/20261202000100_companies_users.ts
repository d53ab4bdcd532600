import type { Knex } from 'knex';

// The tenancy root (companies), the people who sign in (users) and the failed sign-ins the rate
// limit counts. Every later table carries company_id.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('companies', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.text('name').notNullable();
    t.text('office_email').notNullable();
    t.text('display_units').notNullable().defaultTo('us');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw(`ALTER TABLE companies ADD CONSTRAINT companies_display_units_check CHECK (display_units IN ('us', 'metric'))`);

  await knex.schema.createTable('users', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.text('email').notNullable();
    t.text('name').notNullable();
    t.text('role').notNullable();
    t.text('password_hash').notNullable();
    t.boolean('active').notNullable().defaultTo(true);
    // Bumped to revoke every session of the user at once (sign-out everywhere, deactivation).
    t.integer('session_version').notNullable().defaultTo(1);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['company_id']);
  });
  // Sign-in is by e-mail alone, so an address is unique across all companies, whatever its case.
  await knex.raw('CREATE UNIQUE INDEX users_email_unique ON users (lower(email))');
  await knex.raw(
    `ALTER TABLE users ADD CONSTRAINT users_role_check CHECK (role IN ('apprentice', 'technician', 'lead', 'trainer', 'admin'))`,
  );

  await knex.schema.createTable('sign_in_failures', (t) => {
    t.bigIncrements('id');
    t.text('key').notNullable();
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['key', 'at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sign_in_failures');
  await knex.schema.dropTable('users');
  await knex.schema.dropTable('companies');
}
