import type { Knex } from 'knex';

// Photos of a service call, optionally of one answer (a reading or an observation) or one finding
// (a diagnosis that reached one). The bytes are in the object store under generated keys; a row is
// deleted, with its objects, when the photo is removed before the call is closed.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('attachments', (t) => {
    t.uuid('id').primary().defaultTo(knex.raw('gen_random_uuid()'));
    t.uuid('company_id').notNullable().references('companies.id').onDelete('CASCADE');
    t.uuid('call_id').notNullable().references('service_calls.id').onDelete('CASCADE');
    t.uuid('answer_id').nullable().references('answers.id').onDelete('SET NULL');
    t.uuid('diagnosis_id').nullable().references('diagnoses.id').onDelete('SET NULL');
    t.uuid('owner_id').nullable().references('users.id').onDelete('SET NULL');
    // Object keys: the display size and the thumbnail (both WebP, made by lib/images.ts).
    t.text('key').notNullable();
    t.text('thumb_key').notNullable();
    t.text('content_type').notNullable();
    // Bytes of the stored display size; the upload's own size is kept for the record.
    t.integer('size').notNullable();
    t.integer('original_size').notNullable();
    t.integer('width').notNullable();
    t.integer('height').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['call_id']);
  });
  await knex.raw(
    `ALTER TABLE attachments ADD CONSTRAINT attachments_dims_check CHECK (width > 0 AND height > 0 AND size > 0 AND original_size > 0)`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('attachments');
}
