import type { Knex } from 'knex';

// The outbox: every e-mail the app sends (a service report, a notification) is a row here first,
// written in the request that asks for it, and sent by the worker (lib/mail/worker.ts), which
// retries with backoff while the mail server is down. So no message is lost to an outage, and the
// call page shows where each one stands. An idempotency key per company makes one click one send.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('outbox', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('call_id').nullable().references('service_calls.id').onDelete('CASCADE');
    t.text('kind').notNullable();
    t.text('idempotency_key').notNullable();
    t.jsonb('recipients').notNullable();
    t.text('subject').notNullable();
    t.text('body').notNullable();
    t.binary('attachment').nullable();
    t.text('attachment_name').nullable();
    t.text('status').notNullable().defaultTo('queued');
    t.integer('attempts').notNullable().defaultTo(0);
    t.integer('max_attempts').notNullable().defaultTo(8);
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    // A claimed message is the worker's until then; past it, another pass may take it again.
    t.timestamp('locked_until', { useTz: true }).nullable();
    t.text('last_error').nullable();
    t.text('message_id').nullable();
    t.timestamp('sent_at', { useTz: true }).nullable();
    t.uuid('created_by').nullable().references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.raw('clock_timestamp()'));
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.raw('clock_timestamp()'));
    t.unique(['company_id', 'idempotency_key']);
    t.index(['company_id', 'call_id', 'created_at']);
  });
  await knex.raw(`ALTER TABLE outbox ADD CONSTRAINT outbox_status_check CHECK (status IN ('queued', 'sending', 'sent', 'failed'))`);
  await knex.raw(
    `ALTER TABLE outbox ADD CONSTRAINT outbox_kind_check CHECK (kind IN ('report', 'sign-off', 'escalation', 'tree-review', 'scenario'))`,
  );
  // The worker's query: what is due, oldest first.
  await knex.raw(`CREATE INDEX outbox_due_idx ON outbox (next_attempt_at) WHERE status IN ('queued', 'sending')`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('outbox');
}
