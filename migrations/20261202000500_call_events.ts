import type { Knex } from 'knex';

// What happened to a service call and who did it, beside the call's own row: a referral with its
// reason, a close, a reopen with its reason, a reassignment (from whom, to whom) and a sign-off
// with its comment. The call's row keeps only where it stands now; this is the record of how it
// got there, shown on the call page and kept when the call changes again.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('call_events', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('call_id').notNullable().references('service_calls.id').onDelete('CASCADE');
    t.uuid('diagnosis_id').nullable().references('diagnoses.id').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.uuid('actor_id').nullable().references('users.id').onDelete('SET NULL');
    t.text('note').nullable();
    t.uuid('from_user_id').nullable().references('users.id').onDelete('SET NULL');
    t.uuid('to_user_id').nullable().references('users.id').onDelete('SET NULL');
    // The wall clock, not the transaction's start, so events of one unit of work keep their order.
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.raw('clock_timestamp()'));
    t.index(['company_id', 'call_id', 'at']);
  });
  await knex.raw(
    `ALTER TABLE call_events ADD CONSTRAINT call_events_kind_check CHECK (kind IN ('closed', 'referred', 'reopened', 'reassigned', 'signed_off'))`,
  );
  // A referral and a reopen always say why.
  await knex.raw(
    `ALTER TABLE call_events ADD CONSTRAINT call_events_reason_check CHECK (kind NOT IN ('referred', 'reopened') OR length(note) > 0)`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('call_events');
}
